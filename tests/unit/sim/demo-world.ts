/** Shared by the sim tests: the demo match simulated once per test file (about a second). */
import { DEMO_SIM } from '../../../fixtures/sim/demo-config.ts';
import { simulateMatch } from '../../../fixtures/sim/simulate.ts';
import type { MatchWorld, SimPeriod } from '../../../fixtures/sim/types.ts';

let cached: MatchWorld | undefined;
export function demoWorld(): MatchWorld {
  cached ??= simulateMatch(DEMO_SIM);
  return cached;
}

/** Frame index in the period's arrays of true time t (rounded to the nearest frame). */
export const frameOf = (w: MatchWorld, p: SimPeriod, t: number): number => Math.round((t - p.t0) * w.rate);

export const at = (p: SimPeriod, f: number, o: number): { x: number; y: number } => ({ x: p.x[f * 23 + o], y: p.y[f * 23 + o] });
