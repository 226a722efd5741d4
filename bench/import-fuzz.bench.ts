/**
 * Import fuzzing at depth (prints counts, never fails the build on timing): at least
 * 10,000 fast-check cases per importer and for detectSource, the same properties as
 * tests/unit/import/fuzz.test.ts. A broken property is printed with its counterexample
 * and makes this script exit non-zero (that is a bug, not a timing).
 *
 * Run: npm run bench -- import-fuzz   (WM_FUZZ_RUNS=20000 for more)
 */
import { fuzzDetect, fuzzImporter, type Target } from '../tests/unit/import/helpers/fuzz.ts';

const runs = Math.max(10_000, Number(process.env.WM_FUZZ_RUNS) || 0);
const seed = Number(process.env.WM_FUZZ_SEED) || Date.now() % 2 ** 31;
console.log(`fast-check seed ${seed}, ${runs} runs per target (WM_FUZZ_SEED to replay)`);
let failed = 0;
for (const target of ['trackingCsv', 'trackingJsonl', 'eventsCsv', 'eventsJson'] as Target[]) {
  const t0 = performance.now();
  try {
    const tried = await fuzzImporter(target, runs, seed);
    console.log(`${target.padEnd(14)} ${tried.toLocaleString().padStart(7)} cases tried, contract held (${((performance.now() - t0) / 1000).toFixed(1)} s)`);
  } catch (e) {
    failed++;
    console.log(`${target.padEnd(14)} FAILED: ${(e as Error).message.slice(0, 2000)}`);
  }
}
{
  const t0 = performance.now();
  try {
    const tried = fuzzDetect(runs, seed);
    console.log(`${'detectSource'.padEnd(14)} ${tried.toLocaleString().padStart(7)} cases tried, well-formed (${((performance.now() - t0) / 1000).toFixed(1)} s)`);
  } catch (e) {
    failed++;
    console.log(`detectSource   FAILED: ${(e as Error).message.slice(0, 2000)}`);
  }
}
if (failed) process.exitCode = 1;
