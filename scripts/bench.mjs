#!/usr/bin/env node
// Runs every bench/*.bench.ts (or the ones named on the command line) one after another.
// Benchmarks print figures and ratios; they never fail the build on a timing.
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';

const dir = new URL('../bench/', import.meta.url).pathname;
const wanted = process.argv.slice(2);
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.includes(w)))
  .sort();
let failed = 0;
for (const f of files) {
  console.log(`\n=== bench/${f}`);
  const r = spawnSync('npx', ['tsx', '--expose-gc', dir + f], { stdio: 'inherit' });
  if (r.status !== 0) {
    failed++;
    console.log(`(bench/${f} stopped with exit ${r.status ?? r.signal})`);
  }
}
console.log(`\n${files.length} benchmarks run, ${failed} stopped early.`);
