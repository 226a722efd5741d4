/**
 * One analysis frame's evidence for a whistle: the strongest bin in the search band, its
 * height above the band's median (a level that ignores the peak itself), and whether the
 * harmonic at twice its frequency stands out too. In noise alone the harmonic test passes
 * by chance in a few per cent of frames, so it is judged over a whole blast (BlastTracker),
 * not frame by frame.
 */
import { medianOf } from './select.ts';
import type { ResolvedOptions } from './whistle-types.ts';

export interface TonalFrame {
  /** The fundamental test alone: a narrow peak well above the band median. */
  tonal: boolean;
  peakHz: number;
  prominenceDb: number;
  /** Harmonic stands out (true/false), or undefined when 2f is too near Nyquist to see. */
  harmonic: boolean | undefined;
}

export class TonalFrameAnalyser {
  private readonly binHz: number;
  private readonly lowBin: number;
  private readonly highBin: number;
  private readonly nyquistBin: number;
  private readonly scratch: Float64Array;

  constructor(
    private readonly opts: ResolvedOptions,
    fftSize: number,
  ) {
    this.binHz = opts.sampleRate / fftSize;
    this.nyquistBin = fftSize / 2;
    this.lowBin = Math.ceil(opts.bandLowHz / this.binHz);
    // Keep clear of Nyquist, where the decoder's low-pass filter has already cut.
    this.highBin = Math.min(Math.floor(opts.bandHighHz / this.binHz), Math.floor(this.nyquistBin * 0.95));
    if (this.highBin - this.lowBin < 8) {
      throw new RangeError(`whistle detector: band ${opts.bandLowHz}–${opts.bandHighHz} Hz leaves too few bins at ${opts.sampleRate} Hz`);
    }
    this.scratch = new Float64Array(this.nyquistBin + 1);
  }

  analyse(power: Float32Array | Float64Array): TonalFrame {
    const { lowBin, highBin, opts } = this;
    // Peak and median in linear power: the median commutes with the log, so only the
    // ratio needs one.
    let peak = lowBin;
    for (let k = lowBin + 1; k <= highBin; k++) if (power[k] > power[peak]) peak = k;
    const median = medianOf(power, lowBin, highBin + 1, this.scratch);
    const prominenceDb = 10 * Math.log10((power[peak] + 1e-20) / (median + 1e-20));
    const result: TonalFrame = { tonal: false, peakHz: peak * this.binHz, prominenceDb, harmonic: undefined };
    // A peak on the band's edge is the slope of something outside the band, not a tone in it.
    if (prominenceDb < opts.minProminenceDb || peak === lowBin || peak === highBin) return result;
    result.tonal = true;
    result.peakHz = this.interpolatedHz(power, peak);
    const harmonicDb = this.harmonicDb(power, result.peakHz);
    if (harmonicDb !== undefined) result.harmonic = harmonicDb >= opts.minHarmonicDb;
    return result;
  }

  /** Parabolic interpolation of the peak on the dB scale: sub-bin frequency. */
  private interpolatedHz(power: Float32Array | Float64Array, k: number): number {
    const a = 10 * Math.log10(power[k - 1] + 1e-20);
    const b = 10 * Math.log10(power[k] + 1e-20);
    const c = 10 * Math.log10(power[k + 1] + 1e-20);
    const denom = a - 2 * b + c;
    const shift = denom === 0 ? 0 : Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denom));
    return (k + shift) * this.binHz;
  }

  /**
   * Height of the strongest bin within ±2 bins of 2 × f above the median of the octave
   * around it, dB; undefined when 2 × f is too near Nyquist to be seen.
   */
  private harmonicDb(power: Float32Array | Float64Array, fundamentalHz: number): number | undefined {
    const centre = Math.round((2 * fundamentalHz) / this.binHz);
    const top = Math.floor(this.nyquistBin * 0.95);
    if (centre + 2 > top) return undefined;
    const from = Math.max(1, Math.round(centre * 0.75));
    const to = Math.min(top, Math.round(centre * 1.25));
    let best = 0;
    for (let k = centre - 2; k <= centre + 2; k++) best = Math.max(best, power[k]);
    return 10 * Math.log10((best + 1e-20) / (medianOf(power, from, to + 1, this.scratch) + 1e-20));
  }
}
