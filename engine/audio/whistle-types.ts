/** What the whistle detector reports, in seconds of the audio it was fed (footage time). */

/** One sustained tone. */
export interface WhistleBlast {
  /** Seconds from the first sample fed. */
  onset: number;
  offset: number;
  /** Median height of the peak above the band's median level, dB. */
  strengthDb: number;
  /** Median fundamental over the blast, Hz. */
  fundamentalHz: number;
  /** True when the harmonic (2 × fundamental) was below Nyquist and checked. */
  harmonicChecked: boolean;
  /** Share of checked frames where the harmonic stood out (absent when not checked). */
  harmonicShare?: number;
}

export type WhistlePattern = 'single' | 'double' | 'multiple';

/** Blasts closer than the grouping gap, reported together: one whistle candidate. */
export interface WhistleCandidate {
  onset: number;
  offset: number;
  duration: number;
  pattern: WhistlePattern;
  blasts: WhistleBlast[];
  /** Strongest blast's strength, dB above the band median. */
  strengthDb: number;
  /** Fundamental of the strongest blast, Hz. */
  fundamentalHz: number;
}

export interface WhistleDetectorOptions {
  sampleRate: number;
  /** Search band for the fundamental, Hz (default 2000–4500; referee whistles, common practice). */
  bandLowHz?: number;
  bandHighHz?: number;
  /** Peak height above the band median for a frame to count as tonal, dB (default 15). */
  minProminenceDb?: number;
  /** Harmonic peak height above the median of the octave around it, dB (default 8). */
  minHarmonicDb?: number;
  /** Share of a blast's frames in which the harmonic must stand out (default 0.5). */
  minHarmonicShare?: number;
  /** Require the harmonic where it lies below Nyquist (default true). */
  requireHarmonic?: boolean;
  /**
   * Where the harmonic lies above Nyquist (fundamentals above ~3.8 kHz at 16 kHz) there is
   * less evidence, so a blast must stand higher: median strength in dB (default 21).
   */
  minProminenceUncheckedDb?: number;
  /** Shortest blast, seconds (default 0.15). */
  minBlastS?: number;
  /** Longest blast, seconds (default 4): a steadier tone is equipment or a horn, not a referee. */
  maxBlastS?: number;
  /** Largest pitch step between consecutive tonal frames of one blast, Hz (default 250). */
  maxPitchStepHz?: number;
  /** Longest dropout inside one blast, seconds (default 0.06). */
  maxDropoutS?: number;
  /** Blasts whose gap is below this are one candidate (double, multiple), seconds (default 0.6). */
  groupGapS?: number;
}

export type ResolvedOptions = Required<WhistleDetectorOptions>;

export function resolveOptions(o: WhistleDetectorOptions): ResolvedOptions {
  if (!(o.sampleRate >= 8000)) {
    throw new RangeError(`whistle detector: sample rate ${o.sampleRate} Hz is below 8000 Hz; decode the audio at 16000 Hz`);
  }
  const r: ResolvedOptions = {
    sampleRate: o.sampleRate,
    bandLowHz: o.bandLowHz ?? 2000,
    bandHighHz: o.bandHighHz ?? 4500,
    minProminenceDb: o.minProminenceDb ?? 15,
    minHarmonicDb: o.minHarmonicDb ?? 8,
    minHarmonicShare: o.minHarmonicShare ?? 0.5,
    requireHarmonic: o.requireHarmonic ?? true,
    minProminenceUncheckedDb: o.minProminenceUncheckedDb ?? 21,
    minBlastS: o.minBlastS ?? 0.15,
    maxBlastS: o.maxBlastS ?? 4,
    maxPitchStepHz: o.maxPitchStepHz ?? 250,
    maxDropoutS: o.maxDropoutS ?? 0.06,
    groupGapS: o.groupGapS ?? 0.6,
  };
  if (!(r.bandLowHz > 0 && r.bandLowHz < r.bandHighHz)) throw new RangeError(`whistle detector: band ${r.bandLowHz}–${r.bandHighHz} Hz is empty`);
  return r;
}
