/** Share of corrected-event rows whose time is within `tol` s of the simulator's truth (tracking clock). */
import { trueToSource } from '../../../fixtures/sim/truth.ts';

export interface TimedRow {
  row: number;
  period: number;
  t: number | null;
}

// truth.json schema whistlemark-sim-truth/1 (fixtures/README.md): events keyed by row, true time on one clock.
export function shareWithinTruth(truth: { events: { row: number; trueT: number }[] } & object, rows: TimedRow[], tol = 0.2): number {
  let ok = 0;
  for (const r of rows) {
    const e = truth.events.find((x) => x.row === r.row);
    if (!e) throw new Error(`row ${r.row} is not in the truth`);
    const want = trueToSource(truth as never, 'tracking', e.trueT);
    if (want && r.t !== null && want.period === r.period && Math.abs(r.t - want.t) <= tol) ok++;
  }
  return ok / rows.length;
}
