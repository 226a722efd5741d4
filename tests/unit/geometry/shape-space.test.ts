import { describe, expect, it } from 'vitest';
import { Delaunay } from 'd3-delaunay';
import { convexHull, polygonArea, teamShape } from '../../../engine/geometry/shape.ts';
import { pitchSpace } from '../../../engine/geometry/space.ts';
import type { PlayerSpot } from '../../../engine/geometry/lines.ts';
import type { Vec2 } from '../../../engine/geometry/homography.ts';
import { seededRandom } from '../../../engine/geometry/prng.ts';

const PITCH = { length: 105, width: 68 };

function randomPlayers(seed: number, n = 22): PlayerSpot[] {
  const rnd = seededRandom(seed);
  return Array.from({ length: n }, (_, i) => ({ id: `p${i}`, team: i < n / 2 ? ('home' as const) : ('away' as const), x: (rnd() - 0.5) * 104, y: (rnd() - 0.5) * 67, goalkeeper: i === 0 || i === n / 2 }));
}

/** Reference cell by half-plane clipping (Sutherland–Hodgman): the rectangle cut by each perpendicular bisector. */
function halfPlaneCell(points: readonly Vec2[], i: number): Vec2[] {
  let poly: Vec2[] = [[-52.5, -34], [52.5, -34], [52.5, 34], [-52.5, 34]];
  const p = points[i];
  for (let j = 0; j < points.length; j++) {
    if (j === i) continue;
    const q = points[j];
    // Keep z with (z − m)·(q − p) ≤ 0, m the midpoint.
    const nx = q[0] - p[0];
    const ny = q[1] - p[1];
    const c = (nx * (p[0] + q[0])) / 2 + (ny * (p[1] + q[1])) / 2;
    const f = (z: Vec2) => nx * z[0] + ny * z[1] - c;
    const out: Vec2[] = [];
    for (let k = 0; k < poly.length; k++) {
      const a = poly[k];
      const b = poly[(k + 1) % poly.length];
      const fa = f(a);
      const fb = f(b);
      if (fa <= 0) out.push(a);
      if ((fa < 0 && fb > 0) || (fa > 0 && fb < 0)) {
        const t = fa / (fa - fb);
        out.push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]);
      }
    }
    poly = out;
  }
  return poly;
}

const inside = (poly: readonly Vec2[], p: Vec2) => {
  // Counter-clockwise convex polygon: p is left of (or on) every edge.
  for (let k = 0; k < poly.length; k++) {
    const a = poly[k];
    const b = poly[(k + 1) % poly.length];
    if ((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]) < -1e-9) return false;
  }
  return true;
};

describe('Voronoi space, checked against d3-delaunay (npm) directly and a half-plane clipping', () => {
  it('cells cover the pitch exactly, contain their player, and match both references', () => {
    let worst = 0;
    for (let seed = 1; seed <= 30; seed++) {
      const players = randomPlayers(seed);
      const space = pitchSpace(players, PITCH);
      const total = space.area.home + space.area.away;
      expect(total).toBeCloseTo(105 * 68, 6);
      const pts = players.map((p): Vec2 => [p.x, p.y]);
      const d3 = Delaunay.from(pts.map((q) => [q[0], q[1]] as [number, number])).voronoi([-52.5, -34, 52.5, 34]);
      space.cells.forEach((c, i) => {
        expect(inside(c.polygon, pts[i])).toBe(true);
        expect(polygonArea(c.polygon)).toBeGreaterThan(0);
        expect(c.area).toBeCloseTo(Math.abs(polygonArea(d3.cellPolygon(i).map((q) => [q[0], q[1]] as Vec2))), 9);
        const ref = Math.abs(polygonArea(halfPlaneCell(pts, i)));
        worst = Math.max(worst, Math.abs(ref - c.area));
      });
    }
    console.log(`Voronoi cells vs half-plane clipping, 30 random frames × 22 players: worst area difference ${worst.toExponential(2)} m²`);
    expect(worst).toBeLessThan(1e-6);
  });
  it('a player off the pitch gets no cell; the rest still cover it', () => {
    const players = randomPlayers(3);
    players[5] = { ...players[5], x: 60 };
    const space = pitchSpace(players, PITCH);
    expect(space.area.home + space.area.away).toBeCloseTo(105 * 68, 6);
  });
});

describe('shape', () => {
  it('convex hull (monotone chain) keeps exactly the points no other triangle covers', () => {
    const rnd = seededRandom(9);
    for (let t = 0; t < 50; t++) {
      const pts = Array.from({ length: 3 + Math.floor(rnd() * 20) }, (): Vec2 => [rnd() * 100, rnd() * 60]);
      const hull = convexHull(pts);
      expect(polygonArea(hull)).toBeGreaterThan(0);
      for (const p of pts) expect(inside(hull, p)).toBe(true);
      // Every hull vertex is one of the points, and is extreme in some direction.
      for (const v of hull) expect(pts.some((p) => p[0] === v[0] && p[1] === v[1])).toBe(true);
    }
    expect(convexHull([[0, 0], [2, 0], [1, 1], [2, 2], [0, 2], [1, 0]])).toEqual([[0, 0], [2, 0], [2, 2], [0, 2]]);
  });
  it('team length and width leave the goalkeeper out', () => {
    const spots: PlayerSpot[] = [
      { id: 'g', team: 'home', x: -50, y: 0, goalkeeper: true },
      { id: 'a', team: 'home', x: -30, y: -20 },
      { id: 'b', team: 'home', x: -30, y: 20 },
      { id: 'c', team: 'home', x: -5, y: 0 },
      { id: 'z', team: 'away', x: 40, y: 0 },
    ];
    const s = teamShape(spots, 'home')!;
    expect(s.length).toBe(25);
    expect(s.width).toBe(40);
    expect(s.area).toBeCloseTo(0.5 * 40 * 25, 9);
    expect(s.playerCount).toBe(3);
  });
});
