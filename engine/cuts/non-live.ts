/**
 * Proposed non-live stretches of footage from cut and whistle candidates, for the analyst
 * to confirm or reject (they are never used by a fit until confirmed).
 *
 * Cues, each a habit of match broadcasts (common practice), not a certainty:
 *  - half-time: a period ends on a double (or longer) whistle; the recording then cuts
 *    away (or is cut), and the next period starts with a kick-off whistle. Proposed from
 *    the end-of-period whistle's onset to the next whistle after the cut.
 *  - replay: a replay is spliced into live play between two cuts, and lasts a few seconds
 *    (default 2–20 s). Proposed for every such pair of cuts not used for half-time.
 *
 * Example: proposeNonLive(cuts, whistles, { durationS: 465.6 })
 *   → [{ fromT: 239.5, toT: 250.6, kind: 'half_time', reason: '…' }, { fromT: 268.6, toT: 274.6, kind: 'replay', … }]
 */
import type { CutCandidate } from './cut-types.ts';

/** The parts of a whistle candidate the cues need (engine/audio's WhistleCandidate fits). */
export interface WhistleCue {
  onset: number;
  offset: number;
  pattern: 'single' | 'double' | 'multiple';
}

export interface NonLiveProposal {
  /** Footage seconds, [fromT, toT). */
  fromT: number;
  toT: number;
  kind: 'replay' | 'half_time';
  /** Why it was proposed, in words the analyst reads. */
  reason: string;
}

export interface NonLiveOptions {
  /** Shortest and longest stretch between two cuts taken for a replay, seconds (default 2, 20). */
  minReplayS?: number;
  maxReplayS?: number;
  /** How long before the cut the end-of-period whistle may sound, seconds (default 120). */
  periodEndBeforeCutS?: number;
  /** How long after the cut the next kick-off whistle may come, seconds (default 1200). */
  kickOffAfterCutS?: number;
}

export function proposeNonLive(cuts: readonly CutCandidate[], whistles: readonly WhistleCue[], options: NonLiveOptions = {}): NonLiveProposal[] {
  const minReplayS = options.minReplayS ?? 2;
  const maxReplayS = options.maxReplayS ?? 20;
  const endBefore = options.periodEndBeforeCutS ?? 120;
  const kickAfter = options.kickOffAfterCutS ?? 1200;
  const sortedCuts = [...cuts].sort((a, b) => a.t - b.t);
  const sortedWhistles = [...whistles].sort((a, b) => a.onset - b.onset);
  const out: NonLiveProposal[] = [];
  const usedCuts = new Set<number>();

  // Half-time: end-of-period whistle, then a cut, then the kick-off whistle.
  for (let i = 0; i < sortedCuts.length; i++) {
    const cut = sortedCuts[i];
    const before = sortedWhistles.filter((w) => w.offset <= cut.t && w.onset >= cut.t - endBefore);
    const end = before[before.length - 1];
    if (!end || end.pattern === 'single') continue;
    if (out.some((p) => p.kind === 'half_time' && p.toT > end.onset)) continue;
    const next = sortedWhistles.find((w) => w.onset > cut.t && w.onset <= cut.t + kickAfter);
    const toT = next ? next.onset : cut.t;
    out.push({
      fromT: end.onset,
      toT,
      kind: 'half_time',
      reason: `${end.pattern} whistle at ${clock(end.onset)}, cut at ${clock(cut.t)}${next ? `, next whistle (kick-off?) at ${clock(next.onset)}` : ''}`,
    });
    usedCuts.add(i);
  }

  // Replays: a short stretch between two consecutive cuts.
  for (let i = 0; i + 1 < sortedCuts.length; i++) {
    if (usedCuts.has(i) || usedCuts.has(i + 1)) continue;
    const a = sortedCuts[i];
    const b = sortedCuts[i + 1];
    const len = b.t - a.t;
    if (len < minReplayS || len > maxReplayS) continue;
    out.push({ fromT: a.t, toT: b.t, kind: 'replay', reason: `${len.toFixed(1)} s between cuts at ${clock(a.t)} and ${clock(b.t)}` });
    usedCuts.add(i).add(i + 1);
    i++;
  }
  return out.sort((x, y) => x.fromT - y.fromT);
}

function clock(s: number): string {
  const m = Math.floor(s / 60);
  return `${m}:${(s - m * 60).toFixed(2).padStart(5, '0')}`;
}
