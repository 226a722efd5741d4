/**
 * Robust straight-line fits y = a + b x: Theil–Sen (median of pairwise slopes) and Huber
 * IRLS (iteratively reweighted least squares). Written here rather than taken from a
 * library because the clock fit needs the final weights, standard errors and cheap
 * leave-one-out refits, which the npm fits (ml-regression-theil-sen, simple-statistics)
 * do not expose; the tests compare both against those libraries.
 */

export interface LineFit {
  intercept: number;
  slope: number;
  /** Standard errors of intercept and slope (NaN when under-determined). */
  interceptSe: number;
  slopeSe: number;
  /** Final IRLS weights (1 = full weight), one per input point. */
  weights: Float64Array;
  residuals: Float64Array;
  /** Robust scale of the residuals (1.4826 * MAD). */
  scale: number;
  /**
   * Weight λ of the slope pseudo-observation (0 without a prior): the fit minimised
   * Σ w r² + λ (slope - prior mean)², and the standard errors come from those penalised
   * normal equations, Cov = σ² (XᵀWX + λ·e₂e₂ᵀ)⁻¹.
   */
  priorWeight: number;
}

/** A Gaussian prior on the slope: mean and standard deviation (same units as the slope). */
export interface SlopePrior {
  mean: number;
  sd: number;
}

/** `median([3, 1, 2]) -> 2` (NaN for an empty list). */
export function median(values: ArrayLike<number>): number {
  const a = Float64Array.from(values).sort();
  const n = a.length;
  if (n === 0) return NaN;
  return n % 2 ? a[(n - 1) / 2] : (a[n / 2 - 1] + a[n / 2]) / 2;
}

/** Median absolute deviation from the median: `mad([1, 2, 3, 4, 100]) -> 1`. */
export function mad(values: ArrayLike<number>): number {
  const m = median(values);
  return median(Array.from(values, (v) => Math.abs(v - m)));
}

/**
 * Theil–Sen: slope = median of pairwise slopes, intercept = median of y - slope x.
 * `theilSen([0, 1, 2], [1, 3, 5]) -> { slope: 2, intercept: 1 }`
 */
export function theilSen(xs: ArrayLike<number>, ys: ArrayLike<number>): { slope: number; intercept: number } {
  const n = xs.length;
  // O(n²) pairs; above 200 points a deterministic stride subset of first points (still
  // tens of thousands of slopes) keeps the estimate's breakdown point and stays fast.
  const step = n > 200 ? Math.ceil(n / 200) : 1;
  const slopes: number[] = [];
  for (let i = 0; i < n; i += step)
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j] - xs[i];
      if (dx !== 0) slopes.push((ys[j] - ys[i]) / dx);
    }
  const slope = slopes.length ? median(slopes) : 0;
  const intercept = median(Array.from(ys, (y, i) => y - slope * xs[i]));
  return { slope, intercept };
}

export interface HuberOptions {
  /** Tuning constant in units of the robust scale (1.345 gives 95% efficiency). */
  k?: number;
  /** Smallest scale used for the weights, so near-perfect data is not over-trimmed. */
  minScale?: number;
  iterations?: number;
  /** Points with weight 0 take no part (e.g. rejected outliers). */
  mask?: ArrayLike<number>;
  /**
   * Optional Gaussian prior on the slope (MAP fit). In units of the noise it is one extra
   * observation "slope = mean" of weight λ = scale² / sd², scale being the robust residual
   * scale the Huber weights use. Absent: the plain (unpenalised) Huber fit.
   */
  slopePrior?: SlopePrior;
  /**
   * Prior weights, relative inverse variances (1 = a unit-weight point): a point of weight
   * w counts as w unit-weight points. Scale, Huber weights and the prior's λ then work on
   * standardised residuals √w·r, and standard errors use the unit-weight variance
   * Σ w r² / (n − 2). Absent: every point has weight 1 (the plain fit, unchanged).
   */
  weights?: ArrayLike<number>;
}

/**
 * Weighted least squares line with weights w; x is centred for conditioning. With
 * `ridge` > 0 the slope is pulled toward `slope0` by one pseudo-observation of that weight:
 * in centred x the normal equations stay diagonal, so slope = (Sxy + λ b0) / (Sxx + λ).
 */
export function weightedLine(xs: ArrayLike<number>, ys: ArrayLike<number>, w: ArrayLike<number>, ridge = 0, slope0 = 0) {
  let sw = 0, sx = 0, sy = 0;
  for (let i = 0; i < xs.length; i++) {
    sw += w[i];
    sx += w[i] * xs[i];
    sy += w[i] * ys[i];
  }
  const mx = sx / sw;
  const my = sy / sw;
  let sxx = 0, sxy = 0;
  for (let i = 0; i < xs.length; i++) {
    const dx = xs[i] - mx;
    sxx += w[i] * dx * dx;
    sxy += w[i] * dx * (ys[i] - my);
  }
  const slope = sxx + ridge > 0 ? (sxy + ridge * slope0) / (sxx + ridge) : 0;
  return { slope, intercept: my - slope * mx, mx, sw, sxx };
}

/**
 * Huber M-estimate by IRLS, started from Theil–Sen.
 * `huberFit(t, tRef) -> { intercept, slope, interceptSe, slopeSe, weights, residuals, scale }`
 */
export function huberFit(xs: ArrayLike<number>, ys: ArrayLike<number>, opts: HuberOptions = {}): LineFit {
  const n = xs.length;
  const k = opts.k ?? 1.345;
  const minScale = opts.minScale ?? 1e-3;
  const mask = opts.mask ?? new Float64Array(n).fill(1);
  const idx = Array.from({ length: n }, (_, i) => i).filter((i) => mask[i] > 0);
  const start = theilSen(idx.map((i) => xs[i]), idx.map((i) => ys[i]));
  let a = start.intercept;
  let b = start.slope;
  const w = new Float64Array(n);
  const r = new Float64Array(n);
  let scale = minScale;
  const prior = opts.slopePrior;
  let lambda = 0;
  const pw = opts.weights;
  const root = pw ? Float64Array.from(pw, (v) => Math.sqrt(Math.max(0, v))) : undefined;
  for (let it = 0; it < (opts.iterations ?? 30); it++) {
    for (let i = 0; i < n; i++) r[i] = ys[i] - a - b * xs[i];
    // The scale is re-estimated on the first iterations only, then held (it settles fast;
    // each estimate costs two sorts).
    if (it < 3) scale = Math.max(minScale, 1.4826 * mad(idx.map((i) => (root ? root[i] * r[i] : r[i]))));
    // Prior weight in the units of the weighted squares: (noise scale / prior sd)².
    if (prior) lambda = (scale / prior.sd) ** 2;
    for (let i = 0; i < n; i++) {
      const z = root ? root[i] * Math.abs(r[i]) : Math.abs(r[i]);
      const huber = Math.min(1, (k * scale) / Math.max(z, 1e-300));
      w[i] = mask[i] > 0 ? (pw ? pw[i] * huber : huber) : 0;
    }
    const fit = weightedLine(xs, ys, w, lambda, prior?.mean ?? 0);
    const moved = Math.abs(fit.intercept - a) + Math.abs(fit.slope - b) * (Math.abs(fit.mx) + 1);
    a = fit.intercept;
    b = fit.slope;
    if (moved < 1e-9) break;
  }
  for (let i = 0; i < n; i++) r[i] = ys[i] - a - b * xs[i];
  const { mx, sw, sxx } = weightedLine(xs, ys, w);
  // Residual variance of the weighted fit; used points only.
  let ss = 0;
  for (const i of idx) ss += w[i] * r[i] * r[i];
  const used = idx.length;
  // Weighted: unit-weight variance; plain: Huber weights normalised to their mean.
  const sigma2 = used > 2 ? (pw ? ss / (used - 2) : ss / ((sw * (used - 2)) / used)) : NaN;
  // Penalised normal equations (centred x): diag(Σw, Sxx + λ); λ = 0 is the plain fit.
  const slopeSe = Math.sqrt(sigma2 / (sxx + lambda));
  const interceptSe = Math.sqrt(sigma2 * (1 / sw + (mx * mx) / (sxx + lambda)));
  return { intercept: a, slope: b, interceptSe, slopeSe, weights: w, residuals: r, scale, priorWeight: lambda };
}
