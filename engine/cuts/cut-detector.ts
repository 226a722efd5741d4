/**
 * Streaming cut (hard scene change) detector over small luma frames.
 *
 * Method: the sliding-window peak rule of Yeo & Liu ("Rapid scene analysis on compressed
 * video", IEEE Trans. Circuits and Systems for Video Technology 5(6), 1995): the
 * difference d(i) between frames i−1 and i marks a cut when it is the largest in the
 * window of 2m − 1 differences centred on it and at least n times the second largest.
 * A fast pan or zoom raises many neighbouring differences together, so no single one
 * stands n times above the rest and nothing is reported; a camera flash gives two equal
 * peaks (in and out) and is refused the same way. A fixed floor (minScore) keeps noise
 * in a still shot from ever counting. The threshold therefore adapts to each stretch's
 * own level of motion instead of being one global number.
 *
 * Example:
 *   const d = new CutDetector({ width: 64, height: 36 });
 *   for (const f of frames) cuts.push(...d.push(f.luma, f.t));
 *   cuts.push(...d.finish());
 */
import { frameScore, histogramDistance, lumaHistogram, meanAbsDifference } from './frame-difference.ts';
import { resolveCutOptions, type CutCandidate, type CutDetectorOptions, type ResolvedCutOptions } from './cut-types.ts';

interface Scored {
  frame: number;
  t: number;
  score: number;
}

export class CutDetector {
  readonly options: ResolvedCutOptions;
  private readonly size: number;
  private prev: Uint8Array | null = null;
  private prevHist: Float64Array;
  private hist: Float64Array;
  /** Differences not yet decided, oldest first (at most 2m − 1 kept). */
  private pending: Scored[] = [];
  /** The last m − 1 decided differences: the left half of the next window. */
  private history: number[] = [];
  private frames = 0;

  constructor(options: CutDetectorOptions) {
    this.options = resolveCutOptions(options);
    this.size = this.options.width * this.options.height;
    this.prevHist = new Float64Array(this.options.bins);
    this.hist = new Float64Array(this.options.bins);
  }

  /** Frames fed so far. */
  get framesSeen(): number {
    return this.frames;
  }

  /**
   * Feeds the next frame in presentation order (`luma` is width × height bytes, row-major;
   * it is copied, so the caller may reuse the buffer). Returns cuts now decided.
   */
  push(luma: Uint8Array, t: number): CutCandidate[] {
    if (luma.length < this.size) {
      throw new RangeError(`cut detector: frame ${this.frames} has ${luma.length} bytes, expected ${this.size} (${this.options.width}×${this.options.height} luma)`);
    }
    const frame = luma.length === this.size ? luma : luma.subarray(0, this.size);
    lumaHistogram(frame, this.options.bins, this.hist);
    const out: CutCandidate[] = [];
    if (this.prev) {
      const score = frameScore(histogramDistance(this.prevHist, this.hist), meanAbsDifference(this.prev, frame));
      this.pending.push({ frame: this.frames, t, score });
      if (this.pending.length >= this.options.halfWindow) out.push(...this.decideOldest());
    } else {
      this.prev = new Uint8Array(this.size);
    }
    this.prev.set(frame);
    [this.prevHist, this.hist] = [this.hist, this.prevHist];
    this.frames++;
    return out;
  }

  /** Decides the differences still waiting for their right half of the window. */
  finish(): CutCandidate[] {
    const out: CutCandidate[] = [];
    while (this.pending.length) out.push(...this.decideOldest());
    return out;
  }

  /** The oldest pending difference has its full window (or the stream ended): decide it. */
  private decideOldest(): CutCandidate[] {
    const { halfWindow: m, peakRatio, minScore } = this.options;
    const d = this.pending.shift()!;
    const neighbours = [...this.history, ...this.pending.slice(0, m - 1).map((p) => p.score)];
    this.history.push(d.score);
    if (this.history.length > m - 1) this.history.shift();
    if (d.score < minScore) return [];
    let second = 0;
    for (const s of neighbours) {
      if (s > d.score) return [];
      if (s > second) second = s;
    }
    // A floor on the second largest, so a cut out of a perfectly still shot has a finite ratio.
    const ratio = d.score / Math.max(second, 1e-3);
    if (ratio < peakRatio) return [];
    return [{ t: d.t, frame: d.frame, strength: d.score, ratio }];
  }
}
