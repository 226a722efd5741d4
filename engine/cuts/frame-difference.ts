/**
 * The score between two consecutive small luma frames, 0..1: the smaller of
 *  - the luma histogram difference (half the L1 distance of the normalised histograms),
 *    which barely moves under camera motion (pans, zooms), and
 *  - the mean absolute pixel difference (scaled so 32 grey levels on average count as 1),
 *    which barely moves in a fade of a flat picture, where the histogram's narrow peak
 *    slides from bin to bin and the histogram difference alone would be near 1 each frame.
 * A cut changes both what the picture is made of and where: it needs both to be high.
 * Both are the classic frame-difference measures (Zhang, Kankanhalli & Smoliar,
 * "Automatic partitioning of full-motion video", Multimedia Systems 1(1), 1993); taking
 * the smaller is ours, chosen on the reference clip (fixtures/reference/make-cuts.sh).
 */

/** Normalised luma histogram of one frame (sums to 1). */
export function lumaHistogram(luma: Uint8Array, bins: number, out: Float64Array = new Float64Array(bins)): Float64Array {
  out.fill(0);
  const shift = 256 / bins;
  for (let i = 0; i < luma.length; i++) out[Math.floor(luma[i] / shift)]++;
  const n = luma.length || 1;
  for (let b = 0; b < bins; b++) out[b] /= n;
  return out;
}

/** Half the L1 distance of two normalised histograms: 0 equal, 1 disjoint. */
export function histogramDistance(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += Math.abs(a[i] - b[i]);
  return s / 2;
}

/** Mean absolute difference of two equal-size luma frames, in grey levels (0..255). */
export function meanAbsDifference(a: Uint8Array, b: Uint8Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += Math.abs(a[i] - b[i]);
  return s / (a.length || 1);
}

/** Grey levels of mean absolute difference that count as a full score. */
export const FULL_PIXEL_DIFFERENCE = 32;

export function frameScore(histDistance: number, meanAbsDiff: number): number {
  return Math.min(histDistance, Math.min(1, meanAbsDiff / FULL_PIXEL_DIFFERENCE));
}
