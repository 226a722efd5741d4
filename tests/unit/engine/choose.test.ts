import { describe, expect, it } from 'vitest';
import { chooseMonotone, type EventOptions } from '../../../engine/refine/choose.ts';

/** Exhaustive search over every assignment, the definition the programme must match. */
function bruteForce(events: EventOptions[]): number {
  let best = -Infinity;
  const rec = (i: number, lastT: number, score: number) => {
    if (i === events.length) return void (best = Math.max(best, score));
    const ev = events[i];
    rec(i + 1, lastT, score + ev.nullScore);
    ev.options.forEach((o) => {
      if (o.t > lastT || (ev.mayTie && o.t >= lastT)) rec(i + 1, o.t, score + o.score);
    });
  };
  rec(0, -Infinity, 0);
  return best;
}

function total(events: EventOptions[], picks: number[]): number {
  let s = 0, last = -Infinity;
  picks.forEach((p, i) => {
    if (p < 0) return void (s += events[i].nullScore);
    const o = events[i].options[p];
    expect(o.t > last || (events[i].mayTie && o.t >= last)).toBe(true); // log order kept
    last = o.t;
    s += o.score;
  });
  return s;
}

describe('monotone joint choice of candidates', () => {
  it('keeps log order where a greedy pick would not', () => {
    // Event 0's best option (t=5) comes after event 1's only good option (t=4): greedy
    // takes both and breaks the order; the joint choice gives event 0 its t=3 option.
    const events: EventOptions[] = [
      { options: [{ t: 3, score: -1 }, { t: 5, score: 0 }], nullScore: -7 },
      { options: [{ t: 4, score: 0 }], nullScore: -7 },
    ];
    expect(chooseMonotone(events)).toEqual([0, 0]);
  });

  it('equals exhaustive search on random small cases (the optimum by definition)', () => {
    let seed = 9;
    const r = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    for (let trial = 0; trial < 200; trial++) {
      const events: EventOptions[] = Array.from({ length: 1 + Math.floor(r() * 6) }, (_, i) => ({
        options: Array.from({ length: Math.floor(r() * 4) }, () => ({ t: i + (r() - 0.5) * 4, score: -r() * 10 })),
        nullScore: -5,
        mayTie: r() < 0.2,
      }));
      const picks = chooseMonotone(events);
      expect(total(events, picks)).toBeCloseTo(bruteForce(events), 9);
    }
  });
});
