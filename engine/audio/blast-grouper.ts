/**
 * Groups blasts into whistle candidates: blasts whose gap is below the grouping gap belong
 * together (a double blast), so a candidate is released only once that gap has passed
 * with nothing new.
 */
import type { WhistleBlast, WhistleCandidate } from './whistle-types.ts';

export class BlastGrouper {
  private pending: WhistleBlast[] = [];

  constructor(private readonly groupGapS: number) {}

  add(blast: WhistleBlast): WhistleCandidate | null {
    const last = this.pending[this.pending.length - 1];
    let released: WhistleCandidate | null = null;
    if (last && blast.onset - last.offset >= this.groupGapS) released = this.release();
    this.pending.push(blast);
    return released;
  }

  /**
   * Called as time passes: releases the group once no blast can join it any more. A blast
   * still being followed (onset `openOnsetS`) may yet join, so time is held at its onset.
   */
  advance(nowS: number, openOnsetS: number | null): WhistleCandidate | null {
    const last = this.pending[this.pending.length - 1];
    const t = openOnsetS === null ? nowS : Math.min(nowS, openOnsetS);
    return last && t - last.offset >= this.groupGapS ? this.release() : null;
  }

  flush(): WhistleCandidate | null {
    return this.pending.length ? this.release() : null;
  }

  private release(): WhistleCandidate {
    const blasts = this.pending;
    this.pending = [];
    const strongest = blasts.reduce((a, b) => (b.strengthDb > a.strengthDb ? b : a));
    const onset = blasts[0].onset;
    const offset = blasts[blasts.length - 1].offset;
    return {
      onset,
      offset,
      duration: offset - onset,
      pattern: blasts.length === 1 ? 'single' : blasts.length === 2 ? 'double' : 'multiple',
      blasts,
      strengthDb: strongest.strengthDb,
      fundamentalHz: strongest.fundamentalHz,
    };
  }
}
