/**
 * Joint choice of one candidate (or none) per event, keeping the log's order: a monotone
 * dynamic programme over events in log order, where each placed event must come after the
 * previous placed one. Events left unplaced carry the last placed time forward; those
 * states are kept as a small Pareto front (earlier time, higher score), which is exact
 * for the order constraint while staying linear in the number of candidates.
 */

export interface Option {
  /** Candidate time, s. */
  t: number;
  score: number;
}

export interface EventOptions {
  options: Option[];
  nullScore: number;
  /** May share a time with the previous placed event (e.g. period start with kick-off). */
  mayTie?: boolean;
}

interface State {
  t: number;
  score: number;
  /** Chosen option index for this event, -1 for none. */
  pick: number;
  prev: State | null;
}

const FRONT_CAP = 16;

/** `chooseMonotone(events) -> picks` (option index per event, -1 when left unplaced). */
export function chooseMonotone(events: EventOptions[]): number[] {
  // States after event i: sorted by time ascending with strictly increasing score
  // (anything later and not better is dominated).
  let front: State[] = [{ t: -Infinity, score: 0, pick: -1, prev: null }];
  const fronts: State[][] = [];
  for (const ev of events) {
    const next: State[] = [];
    // Prefix maxima over the front (time ascending): best state with t < x.
    const prefBest: State[] = [];
    for (let i = 0; i < front.length; i++) prefBest.push(i === 0 || front[i].score > prefBest[i - 1].score ? front[i] : prefBest[i - 1]);
    for (let k = 0; k < ev.options.length; k++) {
      const o = ev.options[k];
      const p = bestBefore(front, prefBest, o.t, !!ev.mayTie);
      if (p) next.push({ t: o.t, score: p.score + o.score, pick: k, prev: p });
    }
    for (const s of front) next.push({ t: s.t, score: s.score + ev.nullScore, pick: -1, prev: s });
    next.sort((a, b) => a.t - b.t || b.score - a.score);
    const pruned: State[] = [];
    for (const s of next) if (!pruned.length || s.score > pruned[pruned.length - 1].score) pruned.push(s);
    // Keep the front small: the best-scoring states, still in time order.
    front = pruned.length > FRONT_CAP ? pruned.slice(pruned.length - FRONT_CAP) : pruned;
    fronts.push(front);
  }
  let end = front.reduce((a, b) => (b.score > a.score ? b : a));
  const picks = new Array<number>(events.length).fill(-1);
  for (let i = events.length - 1; i >= 0 && end; i--) {
    picks[i] = end.pick;
    end = end.prev!;
  }
  return picks;
}

/** The best state whose time is before t (or equal, when ties are allowed). */
function bestBefore(front: State[], prefBest: State[], t: number, tie: boolean): State | undefined {
  let lo = 0, hi = front.length - 1, ans = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (front[mid].t < t || (tie && front[mid].t <= t)) { ans = mid; lo = mid + 1; } else hi = mid - 1;
  }
  return ans >= 0 ? prefBest[ans] : undefined;
}
