/**
 * Pitch registration: the plane-to-plane homography from pitch metres (centre origin, x
 * along, y across, as tracking) to image pixels (u right, v down), by the normalised
 * direct linear transform (Hartley & Zisserman, Multiple View Geometry, alg. 4.2): move
 * each point set's centroid to the origin, scale its mean distance to √2, solve A·h = 0 by
 * the SVD of A, undo the normalisation.
 */
import { rightSvd } from './linalg.ts';

/** A 2-D point: pitch metres [x, y] or image pixels [u, v]. */
export type Vec2 = readonly [number, number];
/** 3 × 3 row-major, scaled so that h[8] = 1 where that is possible. */
export type Homography = readonly number[];

export type GeometryProblem = 'too_few' | 'not_finite' | 'repeated' | 'collinear' | 'not_unique' | 'singular';

/** Why a registration cannot be solved, with the 0-based indexes of the points involved. */
export class GeometryError extends Error {
  constructor(
    readonly problem: GeometryProblem,
    message: string,
    readonly points: number[] = [],
  ) {
    super(message);
    this.name = 'GeometryError';
  }
}

/**
 * Where h sends p; [NaN, NaN] when p maps to the line at infinity.
 * `applyHomography([1, 0, 10, 0, 1, 20, 0, 0, 1], [1, 2]) -> [11, 22]`
 */
export function applyHomography(h: Homography, p: Vec2): [number, number] {
  const w = h[6] * p[0] + h[7] * p[1] + h[8];
  if (Math.abs(w) < 1e-12) return [NaN, NaN];
  return [(h[0] * p[0] + h[1] * p[1] + h[2]) / w, (h[3] * p[0] + h[4] * p[1] + h[5]) / w];
}

/**
 * The homogeneous w of h·p: positive for pitch points in front of the camera (for a
 * registration solved here with h[8] = 1 and the pitch centre in view).
 * `homogeneousW([1, 0, 0, 0, 1, 0, 0, 0.5, 1], [0, 2]) -> 2`
 */
export function homogeneousW(h: Homography, p: Vec2): number {
  return h[6] * p[0] + h[7] * p[1] + h[8];
}

/**
 * The inverse map (image pixels -> pitch metres), by the adjugate.
 * `invertHomography([2, 0, 0, 0, 2, 0, 0, 0, 1]) -> [0.5, 0, 0, 0, 0.5, 0, 0, 0, 1]`
 */
export function invertHomography(h: Homography): number[] {
  const [a, b, c, d, e, f, g, i, j] = h;
  const A = e * j - f * i;
  const B = -(d * j - f * g);
  const C = d * i - e * g;
  const det = a * A + b * B + c * C;
  if (!Number.isFinite(det) || Math.abs(det) < 1e-300) throw new GeometryError('singular', 'The homography is singular (it flattens the plane onto a line) and has no inverse.');
  const inv = [A, -(b * j - c * i), b * f - c * e, B, a * j - c * g, -(a * f - c * d), C, -(a * i - b * g), a * e - b * d].map((x) => x / det);
  return scaleHomography(inv);
}

/**
 * Product a·b (apply b first, then a).
 * `composeHomography(invertHomography(h), h) -> identity`
 */
export function composeHomography(a: Homography, b: Homography): number[] {
  const out = new Array<number>(9);
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[r * 3 + c] = a[r * 3] * b[c] + a[r * 3 + 1] * b[3 + c] + a[r * 3 + 2] * b[6 + c];
  return scaleHomography(out);
}

/**
 * Image distance in pixels between h(pitch[i]) and image[i], for every pair.
 * `reprojectionErrors(h, [[0, 0]], [[320, 165]]) -> [0.3]`
 */
export function reprojectionErrors(h: Homography, pitch: readonly Vec2[], image: readonly Vec2[]): number[] {
  return pitch.map((p, k) => {
    const [u, v] = applyHomography(h, p);
    return Math.hypot(u - image[k][0], v - image[k][1]);
  });
}

/** Scale to h[8] = 1 when h[8] is not near zero, else to unit Frobenius norm. */
function scaleHomography(h: number[]): number[] {
  const norm = Math.hypot(...h);
  const s = Math.abs(h[8]) > 1e-9 * norm ? 1 / h[8] : 1 / norm;
  return h.map((x) => x * s);
}

interface Normaliser {
  /** Similarity T as [s, tx, ty]: T·p = s·p + t. */
  s: number;
  tx: number;
  ty: number;
}

function hartley(points: readonly Vec2[]): Normaliser {
  let cx = 0;
  let cy = 0;
  for (const p of points) {
    cx += p[0];
    cy += p[1];
  }
  cx /= points.length;
  cy /= points.length;
  let mean = 0;
  for (const p of points) mean += Math.hypot(p[0] - cx, p[1] - cy);
  mean /= points.length;
  const s = mean > 0 ? Math.SQRT2 / mean : 1;
  return { s, tx: -s * cx, ty: -s * cy };
}

/** sin of the widest angle test: |cross| over the longest side squared (scale-free). */
function collinearity(a: Vec2, b: Vec2, c: Vec2): number {
  const cross = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
  const l = Math.max((b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2, (c[0] - a[0]) ** 2 + (c[1] - a[1]) ** 2, (c[0] - b[0]) ** 2 + (c[1] - b[1]) ** 2);
  return l === 0 ? 0 : Math.abs(cross) / l;
}

/** Below this, three points are taken as lying on one line. */
export const COLLINEAR_TOLERANCE = 1e-9;

const fmt = (p: Vec2) => `(${+p[0].toFixed(2)}, ${+p[1].toFixed(2)})`;
const label = (i: number) => `#${i + 1}`;

/** Refuses point sets that cannot give one homography, naming the points (1-based in text). */
export function checkRegistrationInput(pitch: readonly Vec2[], image: readonly Vec2[]): void {
  if (pitch.length !== image.length) throw new GeometryError('too_few', `Got ${pitch.length} pitch points but ${image.length} image points: every landmark needs both.`);
  const n = pitch.length;
  if (n < 4) throw new GeometryError('too_few', `A pitch registration needs at least 4 landmarks, got ${n}: click ${4 - n} more landmark${4 - n === 1 ? '' : 's'} on the frame.`);
  for (let i = 0; i < n; i++) {
    for (const [set, name] of [[pitch[i], 'pitch'], [image[i], 'image']] as const) {
      if (!Number.isFinite(set[0]) || !Number.isFinite(set[1])) throw new GeometryError('not_finite', `Landmark ${label(i)} has a ${name} position that is not a number (${set[0]}, ${set[1]}): place it again.`, [i]);
    }
  }
  for (const [set, name, unit] of [[pitch, 'pitch', 'm'], [image, 'image', 'px']] as const) {
    const spread = Math.max(...set.map((p) => Math.hypot(p[0] - set[0][0], p[1] - set[0][1])));
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        if (Math.hypot(set[i][0] - set[j][0], set[i][1] - set[j][1]) <= 1e-9 * Math.max(spread, 1)) {
          throw new GeometryError('repeated', `Landmarks ${label(i)} and ${label(j)} are at the same ${name} position ${fmt(set[i])} ${unit}: remove one of them or move it to a different landmark.`, [i, j]);
        }
      }
    }
  }
  if (n === 4) {
    for (const [set, name] of [[pitch, 'pitch'], [image, 'image']] as const) {
      for (const [a, b, c] of [[0, 1, 2], [0, 1, 3], [0, 2, 3], [1, 2, 3]]) {
        if (collinearity(set[a], set[b], set[c]) < COLLINEAR_TOLERANCE) {
          throw new GeometryError('collinear', `Landmarks ${label(a)}, ${label(b)} and ${label(c)} lie on one line in the ${name}: with four landmarks no three may be on a line. Add a landmark off that line.`, [a, b, c]);
        }
      }
    }
  } else {
    for (const [set, name] of [[pitch, 'pitch'], [image, 'image']] as const) {
      // Degenerate when all but at most one point share a line. With at most one point off
      // that line, two of the first three are on it, so one of their pairs spans it.
      for (const [i, j] of [[0, 1], [0, 2], [1, 2]]) {
        const off = set.filter((p, k) => k !== i && k !== j && collinearity(set[i], set[j], p) >= COLLINEAR_TOLERANCE).length;
        if (off < 2) throw new GeometryError('collinear', `${off === 0 ? 'All' : 'All but one of the'} ${n} landmarks lie on one line in the ${name}: a homography needs at least four landmarks with no three on a line. Add landmarks off that line.`, []);
      }
    }
  }
}

/**
 * Normalised DLT from n ≥ 4 pairs, least squares in the algebraic error over all of them.
 * Throws GeometryError for too few, repeated or collinear points.
 * `solveHomography([[0,0],[1,0],[1,1],[0,1]], [[10,10],[20,10],[20,20],[10,20]]) -> [10, 0, 10, 0, 10, 10, 0, 0, 1]`
 */
export function solveHomography(pitch: readonly Vec2[], image: readonly Vec2[]): number[] {
  checkRegistrationInput(pitch, image);
  return dlt(pitch, image, true);
}

/**
 * The DLT itself, without the input checks (RANSAC checks its samples its own way).
 * With `strict`, a solution space of more than one dimension is refused.
 */
export function dlt(pitch: readonly Vec2[], image: readonly Vec2[], strict = false): number[] {
  const n = pitch.length;
  const tp = hartley(pitch);
  const ti = hartley(image);
  const a = new Float64Array(2 * n * 9);
  for (let k = 0; k < n; k++) {
    const X = tp.s * pitch[k][0] + tp.tx;
    const Y = tp.s * pitch[k][1] + tp.ty;
    const u = ti.s * image[k][0] + ti.tx;
    const v = ti.s * image[k][1] + ti.ty;
    a.set([-X, -Y, -1, 0, 0, 0, u * X, u * Y, u], 18 * k);
    a.set([0, 0, 0, -X, -Y, -1, v * X, v * Y, v], 18 * k + 9);
  }
  const rows = 2 * n;
  // With 4 points A is 8 × 9; pad with a zero row so the ninth singular value exists as 0.
  const svd = rows >= 9 ? rightSvd(a, rows, 9) : rightSvd(Float64Array.from([...a, ...new Float64Array((9 - rows) * 9)]), 9, 9);
  if (strict && svd.values[7] <= 1e-9 * svd.values[0]) {
    throw new GeometryError('not_unique', 'These landmarks do not pin down one homography (they are too close to a line or to each other): spread the landmarks over the visible pitch.');
  }
  const hn = Array.from({ length: 9 }, (_, i) => svd.v[i * 9 + 8]);
  // H = Ti⁻¹ · Hn · Tp
  const Tp = [tp.s, 0, tp.tx, 0, tp.s, tp.ty, 0, 0, 1];
  const TiInv = [1 / ti.s, 0, -ti.tx / ti.s, 0, 1 / ti.s, -ti.ty / ti.s, 0, 0, 1];
  return composeHomography(TiInv, composeHomography(hn, Tp));
}
