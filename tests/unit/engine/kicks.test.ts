import { describe, expect, it } from 'vitest';
import { ballTouches } from '../../../engine/refine/kicks.ts';
import { pathAt, type Key } from './helpers/synthetic.ts';
import { rng } from './helpers/rng.ts';

/**
 * A ball path with kinks at known, off-frame times (constant-velocity legs, so the true
 * kick moment is where the legs meet: geometry, not a tuned value).
 */
function series(keys: Key[], rate: number, seconds: number, noise: number, seed: number) {
  const r = rng(seed);
  const n = Math.round(seconds * rate);
  const bx = new Float64Array(n), by = new Float64Array(n);
  for (let f = 0; f < n; f++) {
    const p = pathAt(keys, f / rate);
    bx[f] = p.x + noise * r.normal();
    by[f] = p.y + noise * r.normal();
  }
  return { bx, by };
}

describe('ball touches from the trajectory', () => {
  // Dribble at 4 m/s, pass at 15 m/s at t = 3.517 s, received and turned at 6.262 s.
  const keys: Key[] = [{ t: 0, x: -10, y: 0 }, { t: 3.517, x: 4.068, y: 0 }, { t: 6.262, x: 4.068 + 15 * 2.745 * 0.8, y: 15 * 2.745 * 0.6 }, { t: 9, x: 40, y: 40 }];
  for (const rate of [25, 10]) {
    it(`finds both kinks to a fraction of a frame at ${rate} Hz with 7.5 cm noise`, () => {
      const { bx, by } = series(keys, rate, 9, 0.075, 3);
      const touches = ballTouches(bx, by, rate).filter((t) => t.dv > 5);
      expect(touches.length).toBe(2);
      expect(Math.abs(touches[0].t - 3.517)).toBeLessThan(0.5 / rate);
      expect(Math.abs(touches[1].t - 6.262)).toBeLessThan(0.5 / rate);
      expect(touches[0].speedAfter).toBeGreaterThan(13);
      expect(touches[0].speedAfter).toBeLessThan(17);
    });
  }
  it('reports nothing on a steady roll', () => {
    const { bx, by } = series([{ t: 0, x: 0, y: 0 }, { t: 10, x: 50, y: 10 }], 25, 10, 0.075, 4);
    expect(ballTouches(bx, by, 25).filter((t) => t.dv > 5)).toEqual([]);
  });
});
