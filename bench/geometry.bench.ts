/**
 * Geometry benchmark (prints, never fails): per-call CPU time of the engine's geometry beside
 * a well-known library doing the same work in the same run —
 * 1. homography from 12 noisy landmarks: our normalised DLT, DLT + LM polish, and
 *    @techstark/opencv-js findHomography (method 0, which also polishes by LM);
 * 2. RANSAC over 30 landmarks with 30 % outliers: ours vs OpenCV findHomography(RANSAC, 3 px);
 * 3. Voronoi space of 22 players clipped to the pitch: pitchSpace (d3-delaunay inside, plus
 *    polygons and team areas) vs bare d3-delaunay, and a plain half-plane clipping for scale;
 * 4. Jenks team lines of 10 outfield players into 3 groups: ours vs simple-statistics ckmeans;
 * 5. every per-frame line/shape/space computation for both teams together (what the Watch
 *    overlay needs each displayed frame).
 * OpenCV times include building its Mat inputs, as a caller would have to.
 */
import { Delaunay } from 'd3-delaunay';
import { ckmeans } from 'simple-statistics';
import { solveHomography, type Vec2 } from '../engine/geometry/homography.ts';
import { refineHomography } from '../engine/geometry/refine.ts';
import { fitHomography } from '../engine/geometry/ransac.ts';
import { pitchSpace } from '../engine/geometry/space.ts';
import { jenksGroups } from '../engine/geometry/jenks.ts';
import { backLine, offsideLine, playerDistance, teamLines, type PlayerSpot } from '../engine/geometry/lines.ts';
import { teamShape, polygonArea } from '../engine/geometry/shape.ts';
import { seededRandom } from '../engine/geometry/prng.ts';
import { cvFindHomography, loadOpenCv } from '../tests/unit/geometry/opencv.ts';
import { scene } from '../tests/unit/geometry/points.ts';

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1];

/** Interleaved rounds; median CPU µs per call for each named contender. */
function race(title: string, calls: number, contenders: Record<string, (i: number) => unknown>): void {
  const names = Object.keys(contenders);
  const times: Record<string, number[]> = Object.fromEntries(names.map((n) => [n, []]));
  for (const n of names) for (let i = 0; i < Math.min(50, calls); i++) contenders[n](i); // warm-up
  for (let round = 0; round < 9; round++) {
    for (const n of names) {
      const t0 = cpuMs();
      for (let i = 0; i < calls; i++) contenders[n](i);
      times[n].push(((cpuMs() - t0) * 1000) / calls);
    }
  }
  const base = median(times[names[0]]);
  console.log(`\n${title} (CPU µs per call, median of 9 rounds × ${calls}):`);
  for (const n of names) {
    const m = median(times[n]);
    console.log(`  ${n.padEnd(44)} ${m.toFixed(1).padStart(9)} µs   ${n === names[0] ? '' : `ratio to ${names[0]}: ${(m / base).toFixed(2)}`}`);
  }
}

const { cv } = await loadOpenCv();

// 1. Homography from 12 landmarks.
const sets = Array.from({ length: 64 }, (_, k) => scene(k + 1, 12, 0.5));
race('Homography from 12 landmarks, 0.5 px noise', 2000, {
  'ours: normalised DLT (Jacobi SVD)': (i) => solveHomography(sets[i & 63].pitch, sets[i & 63].image),
  'ours: DLT + Levenberg–Marquardt': (i) => {
    const s = sets[i & 63];
    return refineHomography(solveHomography(s.pitch, s.image), s.pitch, s.image);
  },
  'OpenCV findHomography (method 0)': (i) => cvFindHomography(cv, sets[i & 63].pitch, sets[i & 63].image),
});

// 2. RANSAC.
const noisy = Array.from({ length: 32 }, (_, k) => {
  const s = scene(200 + k, 30, 0.7);
  const rnd = seededRandom(k);
  return { pitch: s.pitch, image: s.image.map((q): Vec2 => (rnd() < 0.3 ? [q[0] + 20 + rnd() * 150, q[1] - 20 - rnd() * 80] : q)) };
});
race('RANSAC, 30 landmarks with 30 % outliers, 3 px', 200, {
  'ours: fitHomography (RANSAC + refit + LM)': (i) => fitHomography(noisy[i & 31].pitch, noisy[i & 31].image, { threshold: 3, seed: i }),
  'OpenCV findHomography (RANSAC)': (i) => cvFindHomography(cv, noisy[i & 31].pitch, noisy[i & 31].image, 3),
});

// 3–5. Per frame, 22 players.
function frame(seed: number): { spots: PlayerSpot[]; ball: { x: number; y: number } } {
  const rnd = seededRandom(seed);
  const spots = Array.from({ length: 22 }, (_, i): PlayerSpot => ({ id: `p${i}`, team: i < 11 ? 'home' : 'away', x: (rnd() - 0.5) * 100, y: (rnd() - 0.5) * 64, goalkeeper: i === 0 || i === 11 }));
  return { spots, ball: { x: (rnd() - 0.5) * 100, y: (rnd() - 0.5) * 64 } };
}
const frames = Array.from({ length: 256 }, (_, k) => frame(k + 1));
const PITCH = { length: 105, width: 68 };

function halfPlaneAreas(spots: readonly PlayerSpot[]): number {
  let total = 0;
  for (let i = 0; i < spots.length; i++) {
    let poly: Vec2[] = [[-52.5, -34], [52.5, -34], [52.5, 34], [-52.5, 34]];
    const p = spots[i];
    for (let j = 0; j < spots.length && poly.length; j++) {
      if (j === i) continue;
      const q = spots[j];
      const nx = q.x - p.x;
      const ny = q.y - p.y;
      const c = (nx * (p.x + q.x) + ny * (p.y + q.y)) / 2;
      const out: Vec2[] = [];
      for (let k = 0; k < poly.length; k++) {
        const a = poly[k];
        const b = poly[(k + 1) % poly.length];
        const fa = nx * a[0] + ny * a[1] - c;
        const fb = nx * b[0] + ny * b[1] - c;
        if (fa <= 0) out.push(a);
        if ((fa < 0 && fb > 0) || (fa > 0 && fb < 0)) {
          const t = fa / (fa - fb);
          out.push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]);
        }
      }
      poly = out;
    }
    total += Math.abs(polygonArea(poly));
  }
  return total;
}

race('Voronoi space, 22 players clipped to 105 × 68 m', 2000, {
  'ours: pitchSpace (cells, areas per team)': (i) => pitchSpace(frames[i & 255].spots, PITCH),
  'd3-delaunay voronoi + cellPolygon, bare': (i) => {
    const s = frames[i & 255].spots;
    const v = Delaunay.from(s, (p) => p.x, (p) => p.y).voronoi([-52.5, -34, 52.5, 34]);
    let n = 0;
    for (let k = 0; k < s.length; k++) n += v.cellPolygon(k)?.length ?? 0;
    return n;
  },
  'half-plane clipping, O(n²) (not used)': (i) => halfPlaneAreas(frames[i & 255].spots),
});

const depths = frames.map((f) => f.spots.filter((p) => p.team === 'home' && !p.goalkeeper).map((p) => p.x));
race('Jenks natural breaks, 10 outfield depths into 3 lines', 20000, {
  'ours: jenksGroups': (i) => jenksGroups(depths[i & 255], 3),
  'simple-statistics ckmeans': (i) => ckmeans(depths[i & 255], 3),
});

race('Every line, shape and space of one frame, both teams', 2000, {
  'ours: offside, back, team lines, distance, shape, space': (i) => {
    const f = frames[i & 255];
    const out: unknown[] = [];
    for (const team of ['home', 'away'] as const) {
      out.push(offsideLine(f.spots, f.ball, team, 'positive_x'), backLine(f.spots, team, 'positive_x'), teamLines(f.spots, team, 'positive_x', 3), teamShape(f.spots, team));
    }
    out.push(playerDistance(f.spots, 'p2', 'p3'), pitchSpace(f.spots, PITCH));
    return out;
  },
});
