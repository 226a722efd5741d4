/**
 * Turns a stream of per-frame tonal decisions into blasts: a run of tonal frames whose
 * pitch moves smoothly, allowed short dropouts, kept when long enough.
 */
import type { TonalFrame } from './tonal-frame.ts';
import type { ResolvedOptions, WhistleBlast } from './whistle-types.ts';

interface OpenRun {
  firstFrame: number;
  lastTonalFrame: number;
  lastHz: number;
  hz: number[];
  prominence: number[];
  /** Frames where the harmonic could be checked, and where it stood out. */
  harmonicChecked: number;
  harmonicPresent: number;
  /** Ran past the longest blast: a steady tone (equipment, a horn), to be dropped. */
  tooLong: boolean;
}

export class BlastTracker {
  private run: OpenRun | null = null;
  private readonly maxDropoutFrames: number;
  private readonly minBlastFrames: number;
  private readonly maxBlastFrames: number;

  constructor(
    private readonly opts: ResolvedOptions,
    /** Seconds between frames. */
    private readonly hopS: number,
    /** Seconds from a frame's first sample to its centre. */
    private readonly centreS: number,
  ) {
    this.maxDropoutFrames = Math.max(1, Math.round(opts.maxDropoutS / hopS));
    // Onset and offset are frame centres, so a blast of d seconds spans about d / hop frames.
    this.minBlastFrames = Math.max(2, Math.round(opts.minBlastS / hopS));
    this.maxBlastFrames = Math.round(opts.maxBlastS / hopS);
  }

  /** Feeds frame number `index`; returns a blast when this frame closed one. */
  push(index: number, frame: TonalFrame): WhistleBlast | null {
    const run = this.run;
    const continues = frame.tonal && run !== null && Math.abs(frame.peakHz - run.lastHz) <= this.opts.maxPitchStepHz;
    if (continues && run) {
      run.lastTonalFrame = index;
      if (run.tooLong || index - run.firstFrame > this.maxBlastFrames) {
        run.tooLong = true; // stop collecting: it will be dropped when it ends
        return null;
      }
      run.lastHz = frame.peakHz;
      run.hz.push(frame.peakHz);
      run.prominence.push(frame.prominenceDb);
      this.countHarmonic(run, frame);
      return null;
    }
    let closed: WhistleBlast | null = null;
    if (run && (frame.tonal || index - run.lastTonalFrame > this.maxDropoutFrames)) {
      closed = this.close();
    }
    if (frame.tonal && this.run === null) {
      this.run = {
        firstFrame: index,
        lastTonalFrame: index,
        lastHz: frame.peakHz,
        hz: [frame.peakHz],
        prominence: [frame.prominenceDb],
        harmonicChecked: 0,
        harmonicPresent: 0,
        tooLong: false,
      };
      this.countHarmonic(this.run, frame);
    }
    return closed;
  }

  /** Onset (seconds) of the blast being followed, or null when none is open. */
  get openOnsetS(): number | null {
    return this.run ? this.run.firstFrame * this.hopS + this.centreS : null;
  }

  /** End of input: close whatever is open. */
  flush(): WhistleBlast | null {
    return this.run ? this.close() : null;
  }

  private countHarmonic(run: OpenRun, frame: TonalFrame): void {
    if (frame.harmonic === undefined) return;
    run.harmonicChecked++;
    if (frame.harmonic) run.harmonicPresent++;
  }

  private close(): WhistleBlast | null {
    const run = this.run!;
    this.run = null;
    const frames = run.lastTonalFrame - run.firstFrame + 1;
    if (frames < this.minBlastFrames || run.tooLong) return null;
    // A whistle's harmonic shows in most frames; noise passes the test in a few per cent.
    const share = run.harmonicChecked ? run.harmonicPresent / run.harmonicChecked : 1;
    if (this.opts.requireHarmonic && run.harmonicChecked > 0 && share < this.opts.minHarmonicShare) return null;
    const strengthDb = median(run.prominence);
    // No frame could see the harmonic: only a clearly stronger tone counts (coding
    // artefacts of lossy audio make weak steady tones up there).
    if (this.opts.requireHarmonic && run.harmonicChecked === 0 && strengthDb < this.opts.minProminenceUncheckedDb) return null;
    return {
      onset: run.firstFrame * this.hopS + this.centreS,
      offset: run.lastTonalFrame * this.hopS + this.centreS,
      strengthDb,
      fundamentalHz: median(run.hz),
      harmonicChecked: run.harmonicChecked > 0,
      harmonicShare: run.harmonicChecked ? share : undefined,
    };
  }
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >>> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
