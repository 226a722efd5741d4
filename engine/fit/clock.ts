/**
 * Clock fits: map a source clock onto tracking time, `t_trk = offset + rate * t`, per
 * period, robustly (Huber IRLS from a Theil–Sen start), with MAD outlier flags, standard
 * errors, residuals and a leave-one-out check; a jump in the clock splits the period
 * into segments.
 */
import type { AnchorKind, ClockFit, ClockSegment, FitPoint, PeriodId, Seconds } from '../../shared-types/domain.ts';
import { huberFit, mad, median, type SlopePrior } from './robust.ts';

/** A Gaussian prior on a clock's drift, parts per million. */
export interface DriftPrior {
  centrePpm: number;
  sdPpm: number;
}

/**
 * Default drift prior: centred on 0 with 300 ppm scale — real clocks of these sources
 * drift tens of ppm, at most about ±300 ppm (common practice). Weak: with many anchors
 * over a half the data outweigh it; on a few minutes of jittery tags it keeps the rate
 * from swinging by thousands of ppm.
 */
export const DEFAULT_DRIFT_PRIOR: DriftPrior = { centrePpm: 0, sdPpm: 300 };

/** One pairing to fit: source time t corresponds to tracking time tRef. */
export interface ClockPair {
  anchorId: string;
  refAnchorId?: string;
  kind: AnchorKind;
  t: Seconds;
  tRef: Seconds;
  /** Relative weight (e.g. anchor confidence); default 1. */
  weight?: number;
}

export interface ClockFitOptions {
  /** Outlier rule: |r - median| > madLimit * 1.4826 * MAD. Default 3.5. */
  madLimit?: number;
  /** Floor on the robust scale, seconds: hand-tagged times are never better than this. */
  minScale?: Seconds;
  /** Smallest clock jump that splits a period, seconds. Default 0.5 s. */
  minBreak?: Seconds;
  /** Fewest points on each side of a break. Default 4. */
  minSegmentPoints?: number;
  /**
   * Hold the rate at this value and fit the offset only: for a first fit on a handful of
   * restarts, where the rate would be far less certain than real clocks drift (±300 ppm).
   */
  fixedRate?: number;
  /**
   * Gaussian prior on the drift, making the fit a penalised (MAP) Huber IRLS with standard
   * errors from the penalised normal equations. Default DEFAULT_DRIFT_PRIOR; `null` gives
   * the unpenalised fit.
   */
  driftPrior?: DriftPrior | null;
}

/** The drift prior as a prior on the rate (slope), or undefined for none. */
function ratePrior(opts: ClockFitOptions): SlopePrior | undefined {
  const p = opts.driftPrior === undefined ? DEFAULT_DRIFT_PRIOR : opts.driftPrior;
  return p ? { mean: 1 + p.centrePpm * 1e-6, sd: p.sdPpm * 1e-6 } : undefined;
}

const ROBUST = 1.4826;

/**
 * Fit one segment. `fitClock(pairs, 1) -> ClockSegment` with offset, rate, drift ppm,
 * standard errors, residuals and outlier flags.
 */
export function fitClock(pairs: ClockPair[], period: PeriodId, opts: ClockFitOptions = {}): ClockSegment {
  const minScale = opts.minScale ?? 0.02;
  const madLimit = opts.madLimit ?? 3.5;
  const sorted = [...pairs].sort((a, b) => a.t - b.t);
  const n = sorted.length;
  const ts = sorted.map((p) => p.t);
  const refs = sorted.map((p) => p.tRef);
  if (n === 0) throw new Error(`fitClock: period ${period} has no anchor pairs to fit`);
  if (n === 1) {
    // One pairing fixes the offset only; the rate is taken as nominal.
    const p = sorted[0];
    return segment(period, ts[0], ts[0], p.tRef - p.t, 1, NaN, NaN, [point(p, 0, true)], 0, NaN);
  }
  if (opts.fixedRate !== undefined) return fitOffsetOnly(sorted, period, opts.fixedRate, minScale, madLimit);
  // First pass: robust fit on everything, then flag MAD outliers and refit without them.
  // Both passes carry the drift prior, so an ill-determined rate cannot mis-flag points.
  const slopePrior = ratePrior(opts);
  // Pair weights (when any pair has one) are relative inverse variances: outliers are
  // judged on standardised residuals √w·r, so a precise point is not out-voted by many
  // vague ones (see HuberOptions.weights).
  const weighted = sorted.some((p) => p.weight !== undefined && p.weight !== 1);
  const weights = weighted ? sorted.map((p) => p.weight ?? 1) : undefined;
  const first = huberFit(ts, refs, { minScale, slopePrior, weights });
  const res = weights ? Array.from(first.residuals, (r, i) => r * Math.sqrt(weights[i])) : first.residuals;
  const m = median(res);
  const s = Math.max(minScale, ROBUST * mad(res));
  const mask = sorted.map((p, i) => (Math.abs(res[i] - m) > madLimit * s ? 0 : (p.weight ?? 1)));
  const fit = huberFit(ts, refs, { minScale, mask, slopePrior, weights });
  const points = sorted.map((p, i) => {
    const fp = point(p, fit.residuals[i], mask[i] > 0);
    if (!fp.used) fp.rejectedBecause = `MAD outlier: residual ${fit.residuals[i].toFixed(2)} s is beyond ${madLimit} robust SD (${s.toFixed(3)} s)`;
    return fp;
  });
  let ss = 0, used = 0;
  for (let i = 0; i < n; i++)
    if (mask[i] > 0) {
      ss += fit.residuals[i] ** 2;
      used++;
    }
  // huberFit's weights already carry the pair weights when the fit is weighted.
  const w = Float64Array.from(fit.weights, (v, i) => (weights ? v : v * (mask[i] > 0 ? sorted[i].weight ?? 1 : 0)));
  return segment(period, ts[0], ts[n - 1], fit.intercept, fit.slope, fit.interceptSe, fit.slopeSe, points,
    Math.sqrt(ss / Math.max(1, used)), leaveOneOutMax(ts, refs, w, fit.priorWeight, slopePrior?.mean ?? 1));
}

/** Offset at a fixed rate: median of tRef - rate t, MAD outliers out, mean of the rest. */
function fitOffsetOnly(sorted: ClockPair[], period: PeriodId, rate: number, minScale: number, madLimit: number): ClockSegment {
  const offs = sorted.map((p) => p.tRef - rate * p.t);
  const m = median(offs);
  const s = Math.max(minScale, ROBUST * mad(offs));
  const used = offs.map((o) => Math.abs(o - m) <= madLimit * s);
  const kept = offs.filter((_, i) => used[i]);
  const offset = kept.reduce((a, b) => a + b, 0) / kept.length;
  const sd = Math.sqrt(kept.reduce((a, o) => a + (o - offset) ** 2, 0) / Math.max(1, kept.length - 1));
  const points = sorted.map((p, i) => {
    const fp = point(p, offs[i] - offset, used[i]);
    if (!used[i]) fp.rejectedBecause = `MAD outlier: residual ${(offs[i] - offset).toFixed(2)} s is beyond ${madLimit} robust SD (${s.toFixed(3)} s)`;
    return fp;
  });
  const rms = Math.sqrt(kept.reduce((a, o) => a + (o - offset) ** 2, 0) / kept.length);
  // Leaving one point out moves a mean by at most max |o_i - mean| / (n - 1).
  const loo = kept.length > 1 ? Math.max(...kept.map((o) => Math.abs(o - offset))) / (kept.length - 1) : NaN;
  return segment(period, sorted[0].t, sorted[sorted.length - 1].t, offset, rate, sd / Math.sqrt(kept.length), NaN, points, rms, loo);
}

function point(p: ClockPair, residual: number, used: boolean): FitPoint {
  return { anchorId: p.anchorId, refAnchorId: p.refAnchorId, kind: p.kind, t: p.t, tRef: p.tRef, residual, used };
}

function segment(period: PeriodId, fromT: number, toT: number, offset: number, rate: number, offsetSe: number,
  rateSe: number, points: FitPoint[], rmsResidual: number, leaveOneOutMax: number): ClockSegment {
  return { period, fromT, toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe, rateSe, rmsResidual, leaveOneOutMax, points };
}

/**
 * Largest change of the offset when one point is dropped, holding the final weights (and
 * the prior's pseudo-observation of weight `ridge` on the rate, if any): the weighted sums
 * lose one term each, so all n refits cost O(n).
 */
function leaveOneOutMax(xs: number[], ys: number[], w: ArrayLike<number>, ridge = 0, rate0 = 1): number {
  let S = 0, Sx = 0, Sy = 0, Sxx = 0, Sxy = 0;
  const x0 = xs.reduce((a, b) => a + b, 0) / xs.length; // centring for conditioning
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i] - x0;
    S += w[i]; Sx += w[i] * x; Sy += w[i] * ys[i]; Sxx += w[i] * x * x; Sxy += w[i] * x * ys[i];
  }
  // Normal equations [[S, Sx], [Sx, Sxx + λ]] [a, b] = [Sy, Sxy + λ b0] (x centred at x0).
  const offsetOf = (s: number, sx: number, sy: number, sxx0: number, sxy0: number) => {
    const sxx = sxx0 + ridge, sxy = sxy0 + ridge * rate0;
    const det = s * sxx - sx * sx;
    if (det <= 1e-12 * s * sxx) return NaN;
    const b = (s * sxy - sx * sy) / det;
    const a = (sy - b * sx) / s; // intercept at x = x0
    return a - b * x0;
  };
  const full = offsetOf(S, Sx, Sy, Sxx, Sxy);
  let worst = 0;
  for (let i = 0; i < xs.length; i++) {
    if (!(w[i] > 0)) continue;
    const x = xs[i] - x0;
    const o = offsetOf(S - w[i], Sx - w[i] * x, Sy - w[i] * ys[i], Sxx - w[i] * x * x, Sxy - w[i] * x * ys[i]);
    if (Number.isFinite(o)) worst = Math.max(worst, Math.abs(o - full));
  }
  return worst;
}

/**
 * Where a clock jumps: the split of the time-ordered residuals with the largest,
 * significant step in their (clipped) mean. Returns split indices into the sorted pairs.
 * `findBreaks(pairs) -> [37]` (a jump between the 37th and 38th pairing)
 */
export function findBreaks(pairs: ClockPair[], opts: ClockFitOptions = {}): number[] {
  const minBreak = opts.minBreak ?? 0.5;
  const minSide = opts.minSegmentPoints ?? 4;
  const sorted = [...pairs].sort((a, b) => a.t - b.t);
  const out: number[] = [];
  const recurse = (lo: number, hi: number, depth: number) => {
    if (hi - lo < 2 * minSide || depth > 4) return;
    const ts = sorted.slice(lo, hi).map((p) => p.t);
    const refs = sorted.slice(lo, hi).map((p) => p.tRef);
    // Rate from the median slope of near-neighbour pairs only: few of them straddle a
    // jump, so a step does not tilt the rate the way a global fit would.
    const slopes: number[] = [];
    const reach = Math.min(20, ts.length - 1);
    for (let i = 0; i < ts.length; i++)
      for (let j = i + 1; j <= Math.min(ts.length - 1, i + reach); j++)
        if (ts[j] > ts[i]) slopes.push((refs[j] - refs[i]) / (ts[j] - ts[i]));
    const rate = median(slopes);
    // Offsets of each point under that rate; a jump is a step in these.
    const off = ts.map((t, i) => refs[i] - rate * t);
    const n = off.length;
    // Scan every split with prefix sums of clipped offsets (a t-like statistic, O(n)),
    // then judge the best split with medians (robust to the odd mistimed anchor).
    const mAll = median(off);
    const sAll = Math.max(opts.minScale ?? 0.02, ROBUST * mad(off));
    const clip = off.map((v) => Math.min(mAll + 3 * sAll, Math.max(mAll - 3 * sAll, v)));
    const S = new Float64Array(n + 1), Q = new Float64Array(n + 1);
    for (let i = 0; i < n; i++) { S[i + 1] = S[i] + clip[i]; Q[i + 1] = Q[i] + clip[i] * clip[i]; }
    let best = -1, bestT = 0;
    for (let k = minSide; k <= n - minSide; k++) {
      const ml = S[k] / k, mr = (S[n] - S[k]) / (n - k);
      const ss = Q[k] - k * ml * ml + (Q[n] - Q[k]) - (n - k) * mr * mr;
      const sd = Math.sqrt(Math.max(ss, 1e-12) / Math.max(1, n - 2));
      const tStat = Math.abs(mr - ml) / (sd * Math.sqrt(1 / k + 1 / (n - k)));
      if (tStat > bestT) { bestT = tStat; best = k; }
    }
    let bestStat = 0, bestStep = 0;
    if (best > 0) {
      const left = median(off.slice(0, best));
      const right = median(off.slice(best));
      const spread = Math.max(opts.minScale ?? 0.02, ROBUST * mad([...off.slice(0, best).map((v) => v - left), ...off.slice(best).map((v) => v - right)]));
      bestStep = right - left;
      bestStat = Math.abs(bestStep) / spread;
    }
    if (best > 0 && Math.abs(bestStep) >= minBreak && bestStat > 6) {
      out.push(lo + best);
      recurse(lo, lo + best, depth + 1);
      recurse(lo + best, hi, depth + 1);
    }
  };
  recurse(0, sorted.length, 0);
  return out.sort((a, b) => a - b);
}

/**
 * Fit a whole source clock: per period, split at detected breaks, one segment each.
 * `fitClocks(pairsByPeriod, 'events') -> ClockFit`
 */
export function fitClocks(pairsByPeriod: Map<PeriodId, ClockPair[]>, source: ClockFit['source'], opts: ClockFitOptions = {}): ClockFit {
  const segments: ClockSegment[] = [];
  for (const [period, pairs] of [...pairsByPeriod].sort((a, b) => a[0] - b[0])) {
    if (pairs.length === 0) continue;
    const sorted = [...pairs].sort((a, b) => a.t - b.t);
    const cuts = [0, ...(opts.fixedRate === undefined ? findBreaks(sorted, opts) : []), sorted.length];
    const segs: ClockSegment[] = [];
    for (let i = 0; i + 1 < cuts.length; i++) segs.push(fitClock(sorted.slice(cuts[i], cuts[i + 1]), period, opts));
    // Segment edges meet halfway between the last point of one and the first of the next.
    for (let i = 0; i + 1 < segs.length; i++) {
      const mid = (segs[i].toT + segs[i + 1].fromT) / 2;
      segs[i].toT = mid;
      segs[i + 1].fromT = mid;
    }
    segments.push(...segs);
  }
  return { source, segments, method: 'huber' };
}

/** The segment of `fit` that covers source time t in a period (nearest one outside). */
export function segmentAt(fit: ClockFit, period: PeriodId, t: Seconds): ClockSegment | undefined {
  let best: ClockSegment | undefined;
  let bestDist = Infinity;
  for (const s of fit.segments) {
    if (s.period !== period) continue;
    const d = t < s.fromT ? s.fromT - t : t > s.toT ? t - s.toT : 0;
    if (d < bestDist) {
      bestDist = d;
      best = s;
    }
  }
  return best;
}

/** `mapTime(fit, 1, 120) -> 312.4` (tracking seconds), NaN when the period has no fit. */
export function mapTime(fit: ClockFit, period: PeriodId, t: Seconds): Seconds {
  const s = segmentAt(fit, period, t);
  return s ? s.offset + s.rate * t : NaN;
}
