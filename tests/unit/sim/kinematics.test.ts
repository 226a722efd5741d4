import { describe, expect, it } from 'vitest';
import { ACCEL_CAP, SPEED_CAP } from '../../../fixtures/sim/teams.ts';
import { demoWorld } from './demo-world.ts';

// Caps: ../shared/REFERENCES.md "Plausible physical values" (common practice, from memory):
// elite top speed about 9.5–10.5 m/s, sustained accelerations up to about 4–6 m/s².
const w = demoWorld();
const dt = 1 / w.rate;

describe('player motion is humanly possible (common practice, REFERENCES.md)', () => {
  it('the simulator caps are inside the published ranges', () => {
    expect(SPEED_CAP).toBeLessThanOrEqual(10.5);
    expect(ACCEL_CAP).toBeLessThanOrEqual(6);
  });

  it('no player runs faster than the speed cap (first differences of true positions)', () => {
    let top = 0;
    for (const p of w.periods)
      for (let f = 1; f < p.frameCount; f++)
        for (let o = 0; o < 22; o++) {
          const v = Math.hypot(p.x[f * 23 + o] - p.x[(f - 1) * 23 + o], p.y[f * 23 + o] - p.y[(f - 1) * 23 + o]) / dt;
          if (v > top) top = v;
        }
    expect(top).toBeLessThanOrEqual(SPEED_CAP + 0.01);
    expect(top).toBeGreaterThan(6); // somebody sprints
  });

  it('no player accelerates harder than the cap (second differences of true positions)', () => {
    let top = 0;
    for (const p of w.periods)
      for (let f = 2; f < p.frameCount; f++)
        for (let o = 0; o < 22; o++) {
          const i0 = (f - 2) * 23 + o, i1 = (f - 1) * 23 + o, i2 = f * 23 + o;
          const ax = (p.x[i2] - 2 * p.x[i1] + p.x[i0]) / (dt * dt), ay = (p.y[i2] - 2 * p.y[i1] + p.y[i0]) / (dt * dt);
          top = Math.max(top, Math.hypot(ax, ay));
        }
    // Float32 storage adds about 0.01 m/s² of rounding noise to a second difference.
    expect(top).toBeLessThanOrEqual(ACCEL_CAP + 0.05);
  });

  it('passes leave the foot at 8–25 m/s (common practice, REFERENCES.md)', () => {
    const speeds: number[] = [];
    for (const e of w.events) {
      if (e.kind !== 'pass') continue;
      const p = w.periods.find((q) => q.period === e.period)!;
      const f = Math.round((e.t - p.t0) * w.rate) + 1; // first frame after the kick
      const v = Math.hypot(p.x[f * 23 + 22] - p.x[(f - 1) * 23 + 22], p.y[f * 23 + 22] - p.y[(f - 1) * 23 + 22]) / dt;
      speeds.push(v);
    }
    expect(speeds.length).toBeGreaterThan(40);
    for (const v of speeds) {
      expect(v).toBeGreaterThanOrEqual(8 - 0.1); // less one frame of rolling deceleration
      expect(v).toBeLessThanOrEqual(25.01);
    }
  });

  it('density: about 8–12 passes and about 1 restart per minute of play (brief; common practice)', () => {
    const minutes = w.periods.reduce((s, p) => s + (p.end - p.start) / 60, 0);
    const passes = w.events.filter((e) => e.kind === 'pass').length / minutes;
    const restarts = w.restarts.filter((r) => r.cause !== 'period_start').length / minutes;
    expect(passes).toBeGreaterThan(6);
    expect(passes).toBeLessThan(14);
    expect(restarts).toBeGreaterThan(0.5);
    expect(restarts).toBeLessThan(3);
  });
});

