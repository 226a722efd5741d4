/** What the cut detector reports, in footage seconds (the times the caller gave each frame). */

/** One scene change: `t` is the first frame of the new shot. */
export interface CutCandidate {
  /** Footage seconds of the first frame after the cut. */
  t: number;
  /** Index of that frame in the order fed (presentation order). */
  frame: number;
  /** The frame-difference score at the cut, 0..1 (see frame-difference.ts). */
  strength: number;
  /** Score over the second-highest score in the surrounding window (≥ peakRatio). */
  ratio: number;
}

export interface CutDetectorOptions {
  /** Size of each luma frame the caller feeds (e.g. 64 × 36). */
  width: number;
  height: number;
  /**
   * Half-width m of the sliding window, frames (default 6): a cut must be the largest
   * difference among its 2m − 1 neighbours. Shots shorter than m frames are not split.
   */
  halfWindow?: number;
  /** The cut's score over the second largest in the window (default 3; Yeo & Liu use 2–3). */
  peakRatio?: number;
  /** Lowest score that can be a cut at all (default 0.08), so still scenes never cut on noise. */
  minScore?: number;
  /** Luma histogram bins (default 32). */
  bins?: number;
}

export type ResolvedCutOptions = Required<CutDetectorOptions>;

export function resolveCutOptions(o: CutDetectorOptions): ResolvedCutOptions {
  const r: ResolvedCutOptions = {
    width: o.width,
    height: o.height,
    halfWindow: o.halfWindow ?? 6,
    peakRatio: o.peakRatio ?? 3,
    minScore: o.minScore ?? 0.08,
    bins: o.bins ?? 32,
  };
  if (!(Number.isInteger(r.width) && Number.isInteger(r.height) && r.width > 0 && r.height > 0)) {
    throw new RangeError(`cut detector: frame size ${o.width}×${o.height} is not a positive whole size`);
  }
  if (!(Number.isInteger(r.halfWindow) && r.halfWindow >= 2)) throw new RangeError(`cut detector: halfWindow ${r.halfWindow} must be a whole number ≥ 2`);
  if (!(r.peakRatio >= 1)) throw new RangeError(`cut detector: peakRatio ${r.peakRatio} must be ≥ 1`);
  if (!(Number.isInteger(r.bins) && r.bins >= 2 && r.bins <= 256)) throw new RangeError(`cut detector: bins ${r.bins} must be 2..256`);
  return r;
}
