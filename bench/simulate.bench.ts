/**
 * Simulator and writer speed. Prints figures and ratios; never fails on a timing.
 * Reference library: papaparse's `unparse` (npm) writing the same wide rows, and
 * Number.prototype.toFixed against our fixed formatter.
 *   npx tsx bench/simulate.bench.ts [minutesPerPeriod]
 */
import Papa from 'papaparse';
import { sampleAt } from '../fixtures/sim/sample.ts';
import { simulateMatch } from '../fixtures/sim/simulate.ts';
import { fixedFormatter, writeTracking } from '../fixtures/sim/tracking-writer.ts';
import { writeEvents } from '../fixtures/sim/events-writer.ts';

const minutes = Number(process.argv[2] ?? 10);
const time = <T>(f: () => T): [T, number] => {
  const t = performance.now();
  const r = f();
  return [r, performance.now() - t];
};

const [world, simMs] = time(() => simulateMatch({ seed: 3, periodSeconds: [minutes * 60, minutes * 60] }));
const frames = world.periods.reduce((s, p) => s + p.frameCount, 0);
console.log(`simulate ${2 * minutes} min: ${simMs.toFixed(0)} ms (${((frames / simMs) * 1000).toFixed(0)} true frames/s; full 96-min match ≈ ${((simMs * 96) / (2 * minutes) / 1000).toFixed(1)} s)`);

const [wide, wideMs] = time(() => writeTracking(world, { layout: 'wide' }));
const [long, longMs] = time(() => writeTracking(world, { layout: 'long' }));
console.log(`writeTracking wide: ${wideMs.toFixed(0)} ms, ${(wide.text.length / 1e6).toFixed(1)} MB; long: ${longMs.toFixed(0)} ms, ${(long.text.length / 1e6).toFixed(1)} MB`);
const [, evMs] = time(() => writeEvents(world));
console.log(`writeEvents: ${evMs.toFixed(1)} ms`);

// Same wide rows through papaparse: sampling done first so only the writing is compared.
const buf = new Float64Array(47);
const rows: (string | number)[][] = [];
const [, sampleMs] = time(() => {
  for (const p of world.periods)
    for (let f = 0; f < p.frameCount; f++) {
      sampleAt(world, p.t0 + f / world.rate, buf);
      const row: (string | number)[] = [p.period, f, (f / 25).toFixed(2)];
      for (let i = 0; i < 46; i++) row.push(buf[i].toFixed(2));
      row.push(buf[46].toFixed(2));
      rows.push(row);
    }
});
const [papaText, papaMs] = time(() => Papa.unparse(rows));
console.log(`papaparse.unparse of the same rows: ${papaMs.toFixed(0)} ms (+ ${sampleMs.toFixed(0)} ms building them with toFixed) -> ${(papaText.length / 1e6).toFixed(1)} MB`);
console.log(`ratio writeTracking wide / (toFixed rows + papaparse): ${(wideMs / (papaMs + sampleMs)).toFixed(2)}`);

const values = Array.from({ length: 1_000_000 }, (_, i) => Math.sin(i) * 60);
const [, ownMs] = time(() => { let n = 0; for (const v of values) n += fixedFormatter(v, 2).length; return n; });
const [, stdMs] = time(() => { let n = 0; for (const v of values) n += v.toFixed(2).length; return n; });
console.log(`1e6 numbers: fixedFormatter ${ownMs.toFixed(0)} ms, toFixed ${stdMs.toFixed(0)} ms, ratio ${(ownMs / stdMs).toFixed(2)}`);
