// npm start: build the renderer when needed, then open the app on the demo match —
// in Electron when its binary is installed, otherwise in the system browser through the
// loopback host (electron/serve.ts). Says which mode it chose and why.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildElectronBundle, findElectronBinary } from './electron-binary.mjs';
import { rendererBuildState } from './renderer-freshness.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));
const rendererOut = join(root, 'dist', 'renderer', 'index.html');
const say = (line) => console.log(`[start] ${line}`);

function buildRendererIfStale() {
  const state = rendererBuildState(root);
  if (state === 'fresh') {
    say('renderer is up to date (dist/renderer).');
    return;
  }
  say(state === 'stale' ? 'renderer sources changed since the last build: building with vite…' : 'dist/renderer is missing: building with vite…');
  const r = spawnSync('npx', ['vite', 'build', '--config', 'build/vite.config.ts'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) {
    console.error('[start] The renderer build failed (see above). Fix the error and run npm start again.');
    process.exit(r.status ?? 1);
  }
}

function run(cmd, args, env = {}) {
  const child = spawn(cmd, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
  const forward = (signal) => child.kill(signal);
  process.on('SIGINT', forward);
  process.on('SIGTERM', forward);
  child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
}

buildRendererIfStale();
if (!existsSync(join(root, 'fixtures', 'demo', 'tracking.csv'))) {
  say('note: the demo match (fixtures/demo) is not there yet; the app opens empty. Run "npm run demo:regen" to make it.');
}
const electron = findElectronBinary(root);
if (electron.found) {
  say(`Electron mode: found Electron ${electron.version} at ${electron.binary}.`);
  const main = await buildElectronBundle(root, join(root, 'dist', 'electron'));
  run(electron.binary, [main]);
} else {
  say(`Browser mode: ${electron.reason}. Serving the app on 127.0.0.1 instead.`);
  const extra = process.argv.slice(2);
  run(process.execPath, ['--import', 'tsx', join(root, 'electron', 'serve.ts'), ...extra]);
}
