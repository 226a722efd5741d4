/**
 * Moments the ball was struck or deflected, found in its trajectory: a jump between the
 * velocity just before and just after a frame (one-sided Savitzky–Golay slopes, so the
 * two sides never mix), located to a fraction of a frame by fitting a continuous
 * two-leg line (a kink) to the positions around it.
 */
import type { Seconds } from '../../shared-types/domain.ts';
import { savgolWeights } from '../kinematics/savgol.ts';

export interface BallTouch {
  /** Period time, s (frame index / rate), sub-frame. */
  t: Seconds;
  frameIndex: number;
  /** Ball place at the touch, m. */
  x: number;
  y: number;
  /** Size of the velocity jump, m/s. */
  dv: number;
  /** Ball speed just after, m/s. */
  speedAfter: number;
}

export interface TouchOptions {
  /** One-sided window, s. Default 0.24 s (6 frames at 25 Hz; at least 3 frames). */
  sideS?: Seconds;
  /** Smallest velocity jump kept, m/s. */
  minDv?: number;
}

/** `ballTouches(bx, by, 25) -> BallTouch[]` in time order. bx/by: positions with NaN gaps. */
export function ballTouches(bx: Float64Array, by: Float64Array, rate: number, opts: TouchOptions = {}): BallTouch[] {
  const K = Math.max(3, Math.round((opts.sideS ?? 0.24) * rate));
  const minDv = opts.minDv ?? 3;
  const n = bx.length;
  // Slope over the K frames ending at f (before) and starting at f (after), per frame step.
  const wBefore = savgolWeights(-K, 0, 1, 1);
  const wAfter = savgolWeights(0, K, 1, 1);
  const dv = new Float64Array(n).fill(NaN);
  for (let f = K; f < n - K; f++) {
    let bvx = 0, bvy = 0, avx = 0, avy = 0;
    let ok = true;
    for (let q = 0; q <= K; q++) {
      const i = f - K + q, j = f + q;
      const xi = bx[i], xj = bx[j];
      if (Number.isNaN(xi) || Number.isNaN(xj)) { ok = false; break; }
      bvx += wBefore[q] * xi; bvy += wBefore[q] * by[i];
      avx += wAfter[q] * xj; avy += wAfter[q] * by[j];
    }
    if (ok) dv[f] = Math.hypot(avx - bvx, avy - bvy) * rate;
  }
  const out: BallTouch[] = [];
  const reach = Math.max(2, Math.round(K / 2));
  for (let f = K; f < n - K; f++) {
    const v = dv[f];
    if (!(v >= minDv)) continue;
    let peak = true;
    for (let g = Math.max(0, f - reach); g <= Math.min(n - 1, f + reach) && peak; g++)
      if (g !== f && (dv[g] > v || (dv[g] === v && g < f))) peak = false;
    if (!peak) continue;
    const k = kink(bx, by, f, K, rate);
    if (k) out.push({ ...k, frameIndex: f, dv: v });
  }
  return out;
}

/**
 * Best kink time near frame c: positions on [c-K, c+K] fitted by p(t) = p0 + v1 (t-τ)⁻ +
 * v2 (t-τ)⁺, least squares in (p0, v1, v2); τ searched over c ± 1.5 frames, first on a
 * half-frame grid, then to 0.1 frame around the best.
 */
export function kink(bx: Float64Array, by: Float64Array, c: number, K: number, rate: number) {
  let best: { tau: number; x: number; y: number; vx: number; vy: number; sse: number } | undefined;
  const tryTau = (tau: number) => {
    // Normal equations for the basis [1, min(u,0), max(u,0)], u = k - τ (frame units).
    let n = 0, s1 = 0, s2 = 0, s11 = 0, s22 = 0, bx0 = 0, bx1 = 0, bx2 = 0, by0 = 0, by1 = 0, by2 = 0;
    for (let k = c - K; k <= c + K; k++) {
      const u = k - tau;
      const a = u < 0 ? u : 0, b = u > 0 ? u : 0;
      const x = bx[k], y = by[k];
      n++; s1 += a; s2 += b; s11 += a * a; s22 += b * b;
      bx0 += x; bx1 += a * x; bx2 += b * x;
      by0 += y; by1 += a * y; by2 += b * y;
    }
    // A = [[n, s1, s2], [s1, s11, 0], [s2, 0, s22]] (a·b = 0 always).
    const cx = solve3(n, s1, s2, s11, s22, bx0, bx1, bx2);
    const cy = solve3(n, s1, s2, s11, s22, by0, by1, by2);
    if (!cx || !cy) return;
    let sse = 0;
    for (let k = c - K; k <= c + K; k++) {
      const u = k - tau;
      const a = u < 0 ? u : 0, b = u > 0 ? u : 0;
      const ex = cx[0] + cx[1] * a + cx[2] * b - bx[k];
      const ey = cy[0] + cy[1] * a + cy[2] * b - by[k];
      sse += ex * ex + ey * ey;
    }
    if (!best || sse < best.sse) best = { tau, x: cx[0], y: cy[0], vx: cx[2], vy: cy[2], sse };
  };
  for (let s = -3; s <= 3; s++) tryTau(c + s / 2);
  const mid = best ? (best as { tau: number }).tau : c;
  for (let s = -4; s <= 4; s++) if (s !== 0) tryTau(mid + s / 10);
  if (!best) return undefined;
  const b = best as { tau: number; x: number; y: number; vx: number; vy: number };
  return { t: b.tau / rate, x: b.x, y: b.y, speedAfter: Math.hypot(b.vx, b.vy) * rate };
}

/** Solve [[n, s1, s2], [s1, s11, 0], [s2, 0, s22]] · c = (b0, b1, b2) by Cramer's rule. */
function solve3(n: number, s1: number, s2: number, s11: number, s22: number, b0: number, b1: number, b2: number): [number, number, number] | undefined {
  const det = n * s11 * s22 - s1 * s1 * s22 - s2 * s2 * s11;
  if (Math.abs(det) < 1e-9) return undefined;
  const c0 = (b0 * s11 * s22 - s1 * b1 * s22 - s2 * s11 * b2) / det;
  const c1 = (b1 - s1 * c0) / s11;
  const c2 = (b2 - s2 * c0) / s22;
  return [c0, c1, c2];
}
