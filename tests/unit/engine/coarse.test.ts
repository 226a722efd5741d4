import { describe, expect, it } from 'vitest';
import { alignRestarts } from '../../../engine/align/coarse.ts';
import type { Anchor, RestartKind } from '../../../shared-types/domain.ts';
import { rng } from './helpers/rng.ts';

const KINDS: RestartKind[] = ['throw_in', 'throw_in', 'throw_in', 'goal_kick', 'corner', 'free_kick', 'free_kick'];

/** Two restart lists of one invented half: tracking truth and a jittery, incomplete log. */
function scenario(offset: number, seed: number) {
  const r = rng(seed);
  const trk: Anchor[] = [];
  const evt: Anchor[] = [];
  let t = 2 + 5 * r();
  let i = 0;
  const add = (kind: RestartKind, tt: number) => {
    i++;
    if (r() > 0.07) trk.push({ id: `t${i}`, source: 'tracking', kind, period: 1, t: tt + offset, confidence: 0.9 });
    if (r() > 0.07) {
      // Goal kicks are often logged seconds off (REFERENCES.md, hand-tagged logs).
      const err = kind === 'goal_kick' ? (r() - 0.3) * 12 : 0.4 * r.normal();
      evt.push({ id: `e${i}`, source: 'events', kind, period: 1, t: tt + err, confidence: 0.7 });
    }
  };
  add('kick_off', t);
  while (t < 2700) {
    t += 15 + 50 * r();
    add(KINDS[Math.floor(r() * KINDS.length)], t);
  }
  return { trk, evt };
}

describe('coarse alignment by dynamic programming over restart sequences (invented half, Laws restart kinds)', () => {
  for (const [offset, seed] of [[187.32, 1], [-64.5, 2], [612.0, 3], [3.1, 4]] as const) {
    it(`recovers an offset of ${offset} s without a hint`, () => {
      const { trk, evt } = scenario(offset, seed);
      const [m] = alignRestarts(trk, evt);
      expect(Math.abs(m.offset - offset)).toBeLessThan(0.3);
      expect(m.margin).toBeGreaterThan(0.3);
      // Pairs join the same true restart (same number in the ids).
      const right = m.pairs.filter((p) => p.tracking.id.slice(1) === p.source.id.slice(1)).length;
      expect(right / m.pairs.length).toBeGreaterThan(0.95);
      expect(m.pairs.length).toBeGreaterThan(0.8 * Math.min(trk.length, evt.length));
    });
  }

  it('is unsure when the two lists have nothing in common', () => {
    const a = scenario(100, 7).trk;
    const b = scenario(0, 8).evt;
    const [m] = alignRestarts(a, b);
    expect(m.margin).toBeLessThan(0.3);
  });
});
