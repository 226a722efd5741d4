/**
 * A team's shape at one moment: the convex hull of its outfield players (Andrew's monotone
 * chain, 1979), its length (extent along x, the depth of the block) and width (extent
 * across), goalkeeper left out.
 */
import type { TeamSide } from '../../shared-types/domain.ts';
import type { Vec2 } from './homography.ts';
import type { PlayerSpot } from './lines.ts';

const cross = (o: Vec2, a: Vec2, b: Vec2) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);

/**
 * Convex hull, counter-clockwise, no repeated or collinear points on it.
 * `convexHull([[0, 0], [2, 0], [1, 1], [2, 2], [0, 2]]) -> [[0, 0], [2, 0], [2, 2], [0, 2]]`
 */
export function convexHull(points: readonly Vec2[]): Vec2[] {
  const p = points.filter((q) => Number.isFinite(q[0]) && Number.isFinite(q[1])).slice().sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p.filter((q, i) => i === 0 || q[0] !== p[i - 1][0] || q[1] !== p[i - 1][1]);
  const lower: Vec2[] = [];
  for (const q of p) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], q) <= 0) lower.pop();
    lower.push(q);
  }
  const upper: Vec2[] = [];
  for (let i = p.length - 1; i >= 0; i--) {
    const q = p[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], q) <= 0) upper.pop();
    upper.push(q);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/**
 * Area of a simple polygon (shoelace), positive for counter-clockwise.
 * `polygonArea([[0, 0], [2, 0], [2, 2], [0, 2]]) -> 4`
 */
export function polygonArea(poly: readonly Vec2[]): number {
  let s = 0;
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % poly.length];
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

export interface TeamShape {
  hull: Vec2[];
  /** Square metres inside the hull. */
  area: number;
  /** Extent along x (depth), metres. */
  length: number;
  /** Extent across (y), metres. */
  width: number;
  playerCount: number;
}

/**
 * Shape of a team's outfield players; null with no players.
 * `teamShape(spots, 'home') -> { length: 38.5, width: 41.2, area: 980, hull: [...], playerCount: 10 }`
 */
export function teamShape(spots: readonly PlayerSpot[], team: TeamSide): TeamShape | null {
  const pts = spots.filter((p) => p.team === team && !p.goalkeeper && Number.isFinite(p.x) && Number.isFinite(p.y)).map((p): Vec2 => [p.x, p.y]);
  if (pts.length === 0) return null;
  const hull = convexHull(pts);
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  return { hull, area: Math.abs(polygonArea(hull)), length: Math.max(...xs) - Math.min(...xs), width: Math.max(...ys) - Math.min(...ys), playerCount: pts.length };
}
