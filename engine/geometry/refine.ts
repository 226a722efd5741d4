/**
 * Polishes a DLT homography by Levenberg–Marquardt on the reprojection error in the image
 * (the "gold standard" cost of Hartley & Zisserman, §4.2.5): the DLT minimises an algebraic
 * error that weighs points unevenly; this minimises the pixel distances the analyst sees.
 * Works in Hartley-normalised coordinates, where a similarity scales pixel errors evenly.
 */
import { applyHomography, composeHomography, type Homography, type Vec2 } from './homography.ts';
import { solveLinear } from './linalg.ts';

function similarity(points: readonly Vec2[]): { T: number[]; inv: number[] } {
  let cx = 0;
  let cy = 0;
  for (const p of points) {
    cx += p[0] / points.length;
    cy += p[1] / points.length;
  }
  let mean = 0;
  for (const p of points) mean += Math.hypot(p[0] - cx, p[1] - cy) / points.length;
  const s = mean > 0 ? Math.SQRT2 / mean : 1;
  return { T: [s, 0, -s * cx, 0, s, -s * cy, 0, 0, 1], inv: [1 / s, 0, cx, 0, 1 / s, cy, 0, 0, 1] };
}

function cost(h: readonly number[], P: readonly Vec2[], Q: readonly Vec2[]): number {
  let c = 0;
  for (let k = 0; k < P.length; k++) {
    const [u, v] = applyHomography(h, P[k]);
    c += (u - Q[k][0]) ** 2 + (v - Q[k][1]) ** 2;
  }
  return Number.isFinite(c) ? c : Infinity;
}

/**
 * h refined to minimise Σ |h(pitch[k]) − image[k]|²; returns h unchanged when it cannot improve.
 * `refineHomography(solveHomography(pitch, image), pitch, image) -> [...]` (rms error ≤ the DLT's)
 */
export function refineHomography(h: Homography, pitch: readonly Vec2[], image: readonly Vec2[], maxIterations = 20): number[] {
  if (pitch.length < 5) return h.slice();
  const tp = similarity(pitch);
  const ti = similarity(image);
  const P = pitch.map((p) => applyHomography(tp.T, p));
  const Q = image.map((q) => applyHomography(ti.T, q));
  let x = composeHomography(ti.T, composeHomography(h, tp.inv));
  if (Math.abs(x[8]) < 1e-9) return h.slice();
  let c = cost(x, P, Q);
  let lambda = 1e-3;
  for (let it = 0; it < maxIterations; it++) {
    const JtJ = new Float64Array(64);
    const Jtr = new Float64Array(8);
    const row = new Float64Array(8);
    for (let k = 0; k < P.length; k++) {
      const [X, Y] = P[k];
      const w = x[6] * X + x[7] * Y + x[8];
      const u = (x[0] * X + x[1] * Y + x[2]) / w;
      const v = (x[3] * X + x[4] * Y + x[5]) / w;
      for (const [axis, val, target] of [[0, u, Q[k][0]], [1, v, Q[k][1]]] as const) {
        row.fill(0);
        row[axis * 3] = X / w;
        row[axis * 3 + 1] = Y / w;
        row[axis * 3 + 2] = 1 / w;
        row[6] = (-val * X) / w;
        row[7] = (-val * Y) / w;
        const r = val - target;
        for (let i = 0; i < 8; i++) {
          Jtr[i] += row[i] * r;
          for (let j = 0; j < 8; j++) JtJ[i * 8 + j] += row[i] * row[j];
        }
      }
    }
    let improved = false;
    for (let tries = 0; tries < 10 && !improved; tries++) {
      const A = Float64Array.from(JtJ);
      for (let i = 0; i < 8; i++) A[i * 9] *= 1 + lambda;
      const d = solveLinear(A, Array.from(Jtr, (g) => -g), 8);
      if (!d) {
        lambda *= 10;
        continue;
      }
      const next = [...x.slice(0, 8).map((xi, i) => xi + d[i]), x[8]];
      const cn = cost(next, P, Q);
      if (cn < c) {
        const gain = c - cn;
        x = next;
        c = cn;
        lambda = Math.max(lambda / 10, 1e-12);
        improved = true;
        if (gain < 1e-14 * (1 + c)) it = maxIterations;
      } else lambda *= 10;
    }
    if (!improved) break;
  }
  return composeHomography(ti.inv, composeHomography(x, tp.T));
}
