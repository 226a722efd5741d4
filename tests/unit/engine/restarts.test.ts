import { describe, expect, it } from 'vitest';
import { detectRestarts } from '../../../engine/anchors/restarts.ts';
import { restartKindAt } from '../../../engine/anchors/geometry.ts';
import { syntheticTracking, ownHalfSpot, type Key } from './helpers/synthetic.ts';

// Places from the Laws of the Game, Law 1 (values in /work/shared/REFERENCES.md) on a
// 105 x 68 m field: centre mark (0, 0); penalty mark 11 m from the goal line; goal area
// 5.5 m deep and 5.5 m beyond each post (posts 7.32 m apart); corner arc radius 1 m.
const HL = 52.5, HW = 34;
const pitch = { length: 105, width: 68 };

describe('restart places by Law 1 geometry', () => {
  const cases: [string, number, number, string][] = [
    ['centre mark (Law 8 kick-off)', 0.3, -0.2, 'kick_off'],
    ['penalty mark 11 m out (Law 14)', HL - 11, 0.2, 'penalty'],
    ['inside the goal area, 5.5 m box corner (Law 16)', -(HL - 5.3), 3.66 + 5.3, 'goal_kick'],
    ['corner arc radius 1 m (Law 17)', HL - 0.6, -(HW - 0.5), 'corner'],
    ['on the touchline (Law 15)', 12, HW, 'throw_in'],
    ['elsewhere: free kick (Law 13)', -20, 8, 'free_kick'],
    ['just outside the goal area depth is not a goal kick (Law 16)', HL - 7.5, 0, 'free_kick'],
  ];
  for (const [name, x, y, kind] of cases) it(name, () => expect(restartKindAt(x, y, pitch)).toBe(kind));
});

/** A rest at p from t0 to t1, then a leg at speed v in direction (dx, dy) for 1 s. */
function restThenKick(keys: Key[], p: { x: number; y: number }, t0: number, t1: number, dx: number, dy: number, v = 12) {
  const d = Math.hypot(dx, dy);
  keys.push({ t: t0, ...p }, { t: t1, ...p }, { t: t1 + 1, x: p.x + (v * dx) / d, y: p.y + (v * dy) / d });
}

describe('detectRestarts on hand-built tracking (25 Hz, 7.5 cm noise)', () => {
  // Kick times fall between frames on purpose (sub-frame estimate).
  const truth: { kind: string; t: number; x: number; y: number }[] = [];
  const keys: Key[] = [];
  // [kind, resting place, rest from, kicked at, direction, where the ball left the field]
  type Step = [string, { x: number; y: number }, number, number, number, number, { x: number; y: number } | null];
  const plan: Step[] = [
    ['kick_off', { x: 0, y: 0 }, 0, 5.013, -1, 0.3, null],
    ['goal_kick', { x: -(HL - 4), y: 6 }, 14, 17.531, 1, 0.2, { x: -(HL + 1.5), y: 8 }],
    ['corner', { x: HL - 0.5, y: HW - 0.5 }, 27, 30.27, -1, -1, { x: HL + 1.5, y: HW - 5 }],
    ['throw_in', { x: 10, y: -HW }, 40, 42.118, 0.2, 1, { x: 12, y: -HW - 2 }],
    ['free_kick', { x: -15, y: 9 }, 52, 55.09, 1, 0, null],
    ['penalty', { x: HL - 11, y: 0 }, 66, 69.4, 1, 0.05, null],
  ];
  for (const [kind, p, t0, t1, dx, dy, out] of plan) {
    // Out-of-play restarts (Laws 15-17): the ball first leaves the field, then is fetched.
    if (out) keys.push({ t: t0 - 4, ...out });
    else if (keys.length) keys.push({ t: t0 - 1.5, x: p.x + 3, y: p.y }); // ball brought over
    restThenKick(keys, p, t0, t1, dx, dy);
    truth.push({ kind, t: t1, ...p });
  }
  // Players: in own halves until the kick-off, then everyone shifts about.
  const players = (t: number, i: number) => {
    const s = ownHalfSpot(i);
    return t < 5.013 ? s : { x: s.x + 3 * Math.sin(t + i), y: s.y + 3 * Math.cos(0.7 * t + i) };
  };
  const tracking = syntheticTracking({ rate: 25, durationS: 75, ball: keys, players, seed: 5, noise: 0.075 });
  const found = detectRestarts(tracking).filter((a) => a.kind !== 'period_start' && a.kind !== 'period_end');

  it('finds each restart once, with the Laws kind', () => {
    expect(found.map((a) => a.kind)).toEqual(truth.map((t) => t.kind));
  });
  it('times the kick within one frame (0.04 s) of the true moment and places it within 0.2 m', () => {
    for (let i = 0; i < truth.length; i++) {
      expect(Math.abs(found[i].t - truth[i].t)).toBeLessThan(0.04);
      expect(Math.hypot(found[i].x! - truth[i].x, found[i].y! - truth[i].y)).toBeLessThan(0.2);
    }
  });
  it('marks the first kick-off as the period start', () => {
    const start = detectRestarts(tracking).find((a) => a.kind === 'period_start');
    expect(start?.t).toBeCloseTo(truth[0].t, 1);
  });
});

describe('kick-off from formation when there is no ball', () => {
  it('finds the moment players leave a Law 8 formation', () => {
    const kick = 6.02;
    const players = (t: number, i: number) => {
      const s = ownHalfSpot(i);
      return t < kick ? s : { x: s.x + (i < 11 ? 4 : -4) * (t - kick), y: s.y };
    };
    const tracking = syntheticTracking({ rate: 25, durationS: 20, players, seed: 2 });
    const ko = detectRestarts(tracking).filter((a) => a.kind === 'kick_off');
    expect(ko.length).toBe(1);
    expect(Math.abs(ko[0].t - kick)).toBeLessThan(0.5);
    expect(ko[0].confidence).toBeLessThan(0.8);
  });
});
