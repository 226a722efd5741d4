/**
 * Coarse alignment with no hint from the analyst: per period, match the restart
 * sequence of the event log to the one seen in tracking by Needleman–Wunsch-style
 * dynamic programming over (kind, time gap), for a short list of candidate offsets;
 * the best-scoring offset wins, and its lead over the runner-up says how sure we are.
 */
import type { Anchor, AnchorKind, PeriodId, Seconds } from '../../shared-types/domain.ts';
import { median } from '../fit/robust.ts';

export interface AlignOptions {
  /** Time scale of agreement after the offset, s (rate error and tagging jitter). */
  sigma?: Seconds;
  /** Farthest two anchors may be apart and still be paired, s. */
  reach?: Seconds;
  /** Cost of leaving an anchor of either list unpaired. */
  gap?: number;
  /** How many candidate offsets get the full alignment. */
  candidates?: number;
}

export interface AnchorPair {
  source: Anchor;
  tracking: Anchor;
}

export interface CoarseMatch {
  period: PeriodId;
  /** Tracking time minus event time, s, from the paired anchors (median). */
  offset: Seconds;
  score: number;
  /** Best alignment score at an offset well away from the winner (NaN if none). */
  runnerUpOffset: Seconds;
  runnerUpScore: number;
  /** 0..1: (best - runner-up) / best. */
  margin: number;
  pairs: AnchorPair[];
  note: string;
}

const ALIGN_KINDS = new Set<AnchorKind>(['kick_off', 'goal_kick', 'corner', 'throw_in', 'free_kick', 'penalty']);

/** Kinds the two sources confuse now and then still pair, at a lower score. */
function kindScore(a: AnchorKind, b: AnchorKind): number {
  if (a === b) return a === 'kick_off' || a === 'penalty' ? 3 : a === 'corner' ? 2 : 1.5;
  const pair = [a, b].sort().join('/');
  if (pair === 'free_kick/goal_kick' || pair === 'corner/throw_in' || pair === 'free_kick/throw_in') return 0.4;
  return -Infinity;
}

/**
 * Needleman–Wunsch over two time-sorted anchor lists at a fixed offset: a pair scores by
 * kind agreement times a gaussian of its time gap, an unpaired anchor costs `gap`.
 * `alignAt(trk, evt, 312.4) -> { score, pairs }`
 */
export function alignAt(trk: Anchor[], evt: Anchor[], offset: Seconds, o: Required<AlignOptions>) {
  const n = trk.length, m = evt.length;
  const W = m + 1;
  const S = new Float64Array((n + 1) * W);
  const move = new Uint8Array((n + 1) * W); // 1 pair, 2 skip tracking, 3 skip event
  for (let i = 1; i <= n; i++) { S[i * W] = -o.gap * i; move[i * W] = 2; }
  for (let j = 1; j <= m; j++) { S[j] = -o.gap * j; move[j] = 3; }
  for (let i = 1; i <= n; i++) {
    const a = trk[i - 1];
    for (let j = 1; j <= m; j++) {
      const b = evt[j - 1];
      let best = S[(i - 1) * W + j] - o.gap;
      let mv = 2;
      const skipE = S[i * W + j - 1] - o.gap;
      if (skipE > best) { best = skipE; mv = 3; }
      const dt = a.t - (b.t + offset);
      if (Math.abs(dt) <= o.reach) {
        const k = kindScore(a.kind, b.kind);
        if (k > -Infinity) {
          const pair = S[(i - 1) * W + j - 1] + k * Math.exp(-0.5 * (dt / o.sigma) ** 2);
          if (pair > best) { best = pair; mv = 1; }
        }
      }
      S[i * W + j] = best;
      move[i * W + j] = mv;
    }
  }
  const pairs: AnchorPair[] = [];
  for (let i = n, j = m; i > 0 || j > 0; ) {
    const mv = move[i * W + j];
    if (mv === 1) { pairs.push({ tracking: trk[i - 1], source: evt[j - 1] }); i--; j--; }
    else if (mv === 2) i--;
    else j--;
  }
  pairs.reverse();
  return { score: S[n * W + m] + o.gap * (n + m), pairs };
}

/** Offsets worth a full alignment: dense clusters of same-kind time differences. */
function candidateOffsets(trk: Anchor[], evt: Anchor[], o: Required<AlignOptions>): Seconds[] {
  const diffs: number[] = [];
  for (const a of trk) for (const b of evt) if (a.kind === b.kind) diffs.push(a.t - b.t);
  diffs.sort((p, q) => p - q);
  const width = 2 * o.sigma;
  const windows: { centre: number; count: number }[] = [];
  for (let i = 0, j = 0; i < diffs.length; i++) {
    while (diffs[j] < diffs[i] - width) j++;
    windows.push({ centre: median(diffs.slice(j, i + 1)), count: i - j + 1 });
  }
  windows.sort((p, q) => q.count - p.count);
  const picked: Seconds[] = [];
  for (const w of windows) {
    if (picked.every((c) => Math.abs(c - w.centre) > width)) picked.push(w.centre);
    if (picked.length >= o.candidates) break;
  }
  return picked;
}

/**
 * `alignRestarts(trackingAnchors, eventAnchors) -> CoarseMatch[]` (one per period both
 * sources have), each with the offset, the paired anchors and how sure it is.
 */
export function alignRestarts(trackingAnchors: Anchor[], eventAnchors: Anchor[], opts: AlignOptions = {}): CoarseMatch[] {
  const o: Required<AlignOptions> = { sigma: 1.5, reach: 10, gap: 0.05, candidates: 12, ...opts };
  const periods = [...new Set(eventAnchors.map((a) => a.period))].sort((a, b) => a - b);
  const out: CoarseMatch[] = [];
  for (const period of periods) {
    const trk = trackingAnchors.filter((a) => a.period === period && ALIGN_KINDS.has(a.kind)).sort((a, b) => a.t - b.t);
    const evt = eventAnchors.filter((a) => a.period === period && ALIGN_KINDS.has(a.kind)).sort((a, b) => a.t - b.t);
    if (!trk.length || !evt.length) continue;
    const scored = candidateOffsets(trk, evt, o).map((off) => {
      // Align, re-centre the offset on the pairs found, align again.
      let r = alignAt(trk, evt, off, o);
      let offset = off;
      for (let k = 0; k < 2 && r.pairs.length; k++) {
        offset = median(r.pairs.map((p) => p.tracking.t - p.source.t));
        r = alignAt(trk, evt, offset, o);
      }
      return { offset, ...r };
    });
    scored.sort((a, b) => b.score - a.score);
    const best = scored[0];
    if (!best || best.pairs.length === 0) continue;
    const runnerUp = scored.find((s) => Math.abs(s.offset - best.offset) > 3 * o.sigma);
    const margin = runnerUp ? Math.max(0, (best.score - runnerUp.score) / best.score) : 1;
    out.push({
      period, offset: best.offset, score: best.score,
      runnerUpOffset: runnerUp?.offset ?? NaN, runnerUpScore: runnerUp?.score ?? NaN, margin, pairs: best.pairs,
      note: `${best.pairs.length} of ${evt.length} logged restarts paired with ${trk.length} seen in tracking at ${best.offset.toFixed(2)} s` +
        (runnerUp ? `; next best ${runnerUp.offset.toFixed(2)} s scores ${(100 * (1 - margin)).toFixed(0)}% of it` : ''),
    });
  }
  return out;
}
