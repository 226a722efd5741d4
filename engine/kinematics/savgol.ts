/**
 * Savitzky–Golay convolution weights, computed by least squares for any window and
 * polynomial order (Savitzky & Golay 1964 give tables for a few; we derive them so edges
 * and 10 Hz / 25 Hz windows need no table).
 *
 * The polynomial is fitted on sample offsets `from..to` around the evaluation point
 * (offset 0); a symmetric window is `from = -m, to = m`, an edge window is lopsided.
 */

const cache = new Map<string, Float64Array>();

/**
 * Weights that give the `deriv`-th derivative (per sample step) at offset 0 of a
 * polynomial of `order` fitted to samples at offsets from..to.
 * `savgolWeights(-2, 2, 2, 0) -> [-3, 12, 17, 12, -3] / 35`
 */
export function savgolWeights(from: number, to: number, order: number, deriv = 0): Float64Array {
  const key = `${from},${to},${order},${deriv}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const n = to - from + 1;
  if (!(from <= 0 && to >= 0)) throw new Error(`savgolWeights: sample span ${from}..${to} must contain offset 0`);
  if (order >= n) throw new Error(`savgolWeights: order ${order} needs more than ${n} samples`);
  if (deriv > order) throw new Error(`savgolWeights: derivative ${deriv} is above the order ${order}`);
  const p = order + 1;
  // Normal equations (AᵀA) c = Aᵀ y with A[i][j] = offset_i^j. The derivative at 0 is
  // deriv! * c[deriv], so the weights are deriv! * row `deriv` of (AᵀA)⁻¹ Aᵀ.
  const ata = Array.from({ length: p }, (_, r) =>
    Array.from({ length: p }, (_, c) => {
      let s = 0;
      for (let k = from; k <= to; k++) s += k ** (r + c);
      return s;
    }),
  );
  // Solve (AᵀA) z = e_deriv; then weight_i = deriv! * Σ_j z_j offset_i^j (AᵀA is symmetric).
  const z = solve(ata, Array.from({ length: p }, (_, i) => (i === deriv ? 1 : 0)));
  let fact = 1;
  for (let i = 2; i <= deriv; i++) fact *= i;
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const off = from + i;
    let s = 0;
    for (let j = 0; j < p; j++) s += z[j] * off ** j;
    w[i] = fact * s;
  }
  cache.set(key, w);
  return w;
}

/** Gaussian elimination with partial pivoting; the systems here are at most ~6x6. */
function solve(a: number[][], b: number[]): number[] {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[piv][col])) piv = r;
    [m[col], m[piv]] = [m[piv], m[col]];
    const d = m[col][col];
    if (Math.abs(d) < 1e-300) throw new Error('savgolWeights: singular system');
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = m[r][col] / d;
      if (f !== 0) for (let c = col; c <= n; c++) m[r][c] -= f * m[col][c];
    }
  }
  return m.map((row, i) => row[n] / row[i]);
}

export interface SavgolOptions {
  /** Half window in samples: the window is 2 * half + 1 samples. */
  half: number;
  order: number;
  deriv?: number;
  /** Sample step in seconds, so derivatives come out per second. Default 1. */
  dt?: number;
  /** Runs shorter than this many samples give NaN (too little to fit). Default order + 2. */
  minRun?: number;
}

/**
 * Smooth or differentiate a series with gaps. NaN marks a missing sample; each run of
 * present samples is filtered on its own, with lopsided windows at its ends, so no
 * value or derivative is ever taken across a gap.
 * `savgolSeries([0, 1, 2, 3, 4], { half: 2, order: 2, deriv: 1 }) -> [1, 1, 1, 1, 1]`
 */
export function savgolSeries(
  values: ArrayLike<number>,
  opts: SavgolOptions,
  stride = 1,
  start = 0,
  count = Math.floor((values.length - start + stride - 1) / stride),
): Float64Array {
  const { half, order } = opts;
  const deriv = opts.deriv ?? 0;
  const scale = 1 / (opts.dt ?? 1) ** deriv;
  const minRun = Math.max(opts.minRun ?? order + 2, order + 1);
  const out = new Float64Array(count).fill(NaN);
  const at = (i: number) => values[start + i * stride];
  let i = 0;
  while (i < count) {
    if (Number.isNaN(at(i))) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < count && !Number.isNaN(at(j + 1))) j++;
    const len = j - i + 1;
    if (len >= minRun) {
      // Window length is capped by the run; near the ends the window slides inwards.
      const h = Math.min(half, Math.floor((len - 1) / 2));
      const width = 2 * h + 1 > order ? 2 * h + 1 : Math.min(len, order + 1);
      // Interior samples share one weight vector; only the ends need lopsided ones.
      const wMid = savgolWeights(-h, width - 1 - h, order, deriv);
      for (let k = i; k <= j; k++) {
        let from = -h;
        let to = width - 1 - h;
        if (k + from < i) {
          from = i - k;
          to = from + width - 1;
        } else if (k + to > j) {
          to = j - k;
          from = to - width + 1;
        }
        const w = from === -h ? wMid : savgolWeights(from, to, order, deriv);
        let s = 0;
        for (let q = 0; q < w.length; q++) s += w[q] * at(k + from + q);
        out[k] = s * scale;
      }
    }
    i = j + 1;
  }
  return out;
}
