/**
 * Robust pitch registration when more than four landmarks are given: RANSAC (Fischler &
 * Bolles 1981) over minimal four-point samples with a seeded generator, an adaptive number
 * of trials for the wanted confidence, then the normalised DLT refitted on the inliers
 * until the inlier set stops changing, polished by Levenberg–Marquardt on the inliers'
 * reprojection error (refine.ts).
 */
import { checkRegistrationInput, composeHomography, dlt, reprojectionErrors, solveHomography, type Vec2 } from './homography.ts';
import { seededRandom } from './prng.ts';
import { refineHomography } from './refine.ts';
import { solveLinear } from './linalg.ts';

export interface RansacOptions {
  /** Reprojection distance in image pixels under which a landmark counts as an inlier. */
  threshold?: number;
  /** Seed of the sample generator; the same seed gives the same fit. */
  seed?: number;
  /** Probability of having drawn at least one outlier-free sample before stopping. */
  confidence?: number;
  maxIterations?: number;
}

export interface HomographyFit {
  /** Pitch metres -> image pixels, row-major, h[8] = 1. */
  h: number[];
  /** Whether each landmark agreed with the fit (all true for exactly four). */
  inliers: boolean[];
  /** Reprojection error of each landmark in pixels under h. */
  errors: number[];
  /** Root mean square of the inliers' errors, pixels. */
  rms: number;
  /** RANSAC trials drawn (0 for exactly four landmarks). */
  iterations: number;
}

const DEFAULTS: Required<RansacOptions> = { threshold: 3, seed: 1, confidence: 0.995, maxIterations: 2000 };

/** Sine-like collinearity measure used to skip near-degenerate minimal samples. */
function cross(a: Vec2, b: Vec2, c: Vec2): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

/**
 * A minimal sample is usable when no three of its points are nearly on a line and every
 * triangle keeps its orientation from pitch to image (a homography of points all in front
 * of the camera keeps it; a sample that flips some is certainly contaminated).
 */
function sampleUsable(pitch: readonly Vec2[], image: readonly Vec2[], idx: number[]): boolean {
  let sign = 0;
  for (const [a, b, c] of [[0, 1, 2], [0, 1, 3], [0, 2, 3], [1, 2, 3]]) {
    const P = [pitch[idx[a]], pitch[idx[b]], pitch[idx[c]]] as const;
    const I = [image[idx[a]], image[idx[b]], image[idx[c]]] as const;
    const cp = cross(...P);
    const ci = cross(...I);
    const sp = Math.max(Math.hypot(P[1][0] - P[0][0], P[1][1] - P[0][1]), Math.hypot(P[2][0] - P[0][0], P[2][1] - P[0][1]), Math.hypot(P[2][0] - P[1][0], P[2][1] - P[1][1])) ** 2;
    const si = Math.max(Math.hypot(I[1][0] - I[0][0], I[1][1] - I[0][1]), Math.hypot(I[2][0] - I[0][0], I[2][1] - I[0][1]), Math.hypot(I[2][0] - I[1][0], I[2][1] - I[1][1])) ** 2;
    if (Math.abs(cp) < 1e-6 * sp || Math.abs(ci) < 1e-6 * si) return false;
    const s = Math.sign(cp * ci);
    if (sign === 0) sign = s;
    else if (s !== sign) return false;
  }
  return true;
}

/**
 * Exact homography through four pairs with h[8] = 1, as an 8 × 8 linear system in
 * coordinates centred and scaled per sample (a quarter of the SVD's cost, which is what
 * RANSAC spends its time on; the refit on the inliers uses the full DLT).
 */
function fourPoint(pitch: readonly Vec2[], image: readonly Vec2[], idx: number[]): number[] | null {
  let px = 0, py = 0, ix = 0, iy = 0;
  for (const k of idx) {
    px += pitch[k][0] / 4;
    py += pitch[k][1] / 4;
    ix += image[k][0] / 4;
    iy += image[k][1] / 4;
  }
  let ps = 0, is = 0;
  for (const k of idx) {
    ps += Math.hypot(pitch[k][0] - px, pitch[k][1] - py) / 4;
    is += Math.hypot(image[k][0] - ix, image[k][1] - iy) / 4;
  }
  const sp = Math.SQRT2 / ps;
  const si = Math.SQRT2 / is;
  const A = new Float64Array(64);
  const b = new Float64Array(8);
  idx.forEach((k, r) => {
    const X = (pitch[k][0] - px) * sp;
    const Y = (pitch[k][1] - py) * sp;
    const u = (image[k][0] - ix) * si;
    const v = (image[k][1] - iy) * si;
    A.set([X, Y, 1, 0, 0, 0, -u * X, -u * Y], 16 * r);
    A.set([0, 0, 0, X, Y, 1, -v * X, -v * Y], 16 * r + 8);
    b[2 * r] = u;
    b[2 * r + 1] = v;
  });
  const x = solveLinear(A, b, 8);
  if (!x) return null;
  const n = [...x, 1];
  // H = Ti⁻¹ · N · Tp with Tp(p) = sp·(p − c_p), Ti(q) = si·(q − c_i).
  const Tp = [sp, 0, -sp * px, 0, sp, -sp * py, 0, 0, 1];
  const TiInv = [1 / si, 0, ix, 0, 1 / si, iy, 0, 0, 1];
  const h = composeHomography(TiInv, composeHomography(n, Tp));
  return h.every(Number.isFinite) ? h : null;
}

function fitResult(h: number[], pitch: readonly Vec2[], image: readonly Vec2[], threshold: number, iterations: number): HomographyFit {
  const errors = reprojectionErrors(h, pitch, image);
  const inliers = errors.map((e) => e <= threshold);
  const inl = errors.filter((_, i) => inliers[i]);
  const rms = inl.length ? Math.sqrt(inl.reduce((s, e) => s + e * e, 0) / inl.length) : NaN;
  return { h, inliers, errors, rms, iterations };
}

/**
 * Registration from n ≥ 4 landmark pairs: exact DLT for four, RANSAC + refit above.
 * `fitHomography(pitchPts, imagePts, { threshold: 3, seed: 7 }).errors -> [0.4, 0.2, 31.5, …]`
 */
export function fitHomography(pitch: readonly Vec2[], image: readonly Vec2[], options: RansacOptions = {}): HomographyFit {
  const o = { ...DEFAULTS, ...options };
  checkRegistrationInput(pitch, image);
  const n = pitch.length;
  if (n === 4) {
    const h = solveHomography(pitch, image);
    return { ...fitResult(h, pitch, image, o.threshold, 0), inliers: [true, true, true, true] };
  }
  const rnd = seededRandom(o.seed);
  let best: { count: number; cost: number; h: number[] } | null = null;
  let needed = o.maxIterations;
  let it = 0;
  const t2 = o.threshold * o.threshold;
  for (; it < Math.min(needed, o.maxIterations); it++) {
    const idx: number[] = [];
    while (idx.length < 4) {
      const k = Math.floor(rnd() * n);
      if (!idx.includes(k)) idx.push(k);
    }
    if (!sampleUsable(pitch, image, idx)) continue;
    const h = fourPoint(pitch, image, idx);
    if (!h) continue;
    // MSAC cost (Torr & Zisserman 2000): inliers pay their squared error, outliers the threshold.
    let count = 0;
    let cost = 0;
    for (let k = 0; k < n; k++) {
      const [X, Y] = pitch[k];
      const w = h[6] * X + h[7] * Y + h[8];
      const du = (h[0] * X + h[1] * Y + h[2]) / w - image[k][0];
      const dv = (h[3] * X + h[4] * Y + h[5]) / w - image[k][1];
      const e2 = du * du + dv * dv;
      if (e2 <= t2) {
        count++;
        cost += e2;
      } else cost += t2;
    }
    if (!best || count > best.count || (count === best.count && cost < best.cost)) {
      best = { count, cost, h };
      const w = count / n;
      needed = w >= 1 ? 0 : Math.ceil(Math.log(1 - o.confidence) / Math.log(1 - w ** 4));
    }
  }
  if (!best || best.count < 4) {
    // No four landmarks agree: fall back to all of them so the analyst sees large errors.
    return { ...fitResult(dlt(pitch, image), pitch, image, o.threshold, it), inliers: new Array(n).fill(false) };
  }
  let fit = fitResult(best.h, pitch, image, o.threshold, it);
  for (let round = 0; round < 5; round++) {
    const use = fit.inliers.flatMap((ok, i) => (ok ? [i] : []));
    if (use.length < 4) break;
    const h = dlt(use.map((k) => pitch[k]), use.map((k) => image[k]));
    const next = fitResult(h, pitch, image, o.threshold, it);
    const same = next.inliers.every((v, i) => v === fit.inliers[i]);
    if (next.inliers.filter(Boolean).length < use.length) break;
    fit = next;
    if (same) break;
  }
  const use = fit.inliers.flatMap((ok, i) => (ok ? [i] : []));
  const polished = fitResult(refineHomography(fit.h, use.map((k) => pitch[k]), use.map((k) => image[k])), pitch, image, o.threshold, it);
  return polished.inliers.filter(Boolean).length >= use.length ? polished : fit;
}
