#!/usr/bin/env node
// The whole suite: type check, unit + host tests, then the browser end-to-end tests.
import { spawnSync } from 'node:child_process';

const steps = [
  ['typecheck', 'npx', ['tsc', '-p', 'tsconfig.json', '--noEmit']],
  ['unit + host', 'npx', ['vitest', 'run', '--config', 'build/vitest.config.ts']],
  ['build renderer', 'npx', ['vite', 'build', '--config', 'build/vite.config.ts', '--logLevel', 'warn']],
  ['end-to-end', 'npx', ['vitest', 'run', '--config', 'build/vitest.e2e.config.ts', '--passWithNoTests']],
];
for (const [name, cmd, args] of steps) {
  console.log(`\n== ${name}: ${cmd} ${args.join(' ')}`);
  const r = spawnSync(cmd, args, { stdio: 'inherit' });
  if (r.status !== 0) {
    console.error(`\n${name} failed (exit ${r.status ?? r.signal}).`);
    process.exit(r.status ?? 1);
  }
}
console.log('\nAll test steps passed.');
