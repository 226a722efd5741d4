// Finds an installed Electron binary WITHOUT require('electron'): from Electron 42 on,
// requiring the package starts a download (and throws offline), so we read the package's
// own path.txt instead and check that dist/<path.txt> exists and is executable.
import { accessSync, constants, copyFileSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

/**
 * @param {string} projectRoot folder whose node_modules to search (its package.json is the anchor)
 * @returns {{ found: true, binary: string, version: string } | { found: false, reason: string }}
 */
export function findElectronBinary(projectRoot) {
  const require = createRequire(join(projectRoot, 'package.json'));
  let pkgJson;
  try {
    pkgJson = require.resolve('electron/package.json');
  } catch {
    return { found: false, reason: 'the electron package is not installed (it is optional; its binary download needs outside network)' };
  }
  const dir = dirname(pkgJson);
  let version = 'unknown';
  try {
    version = String(JSON.parse(readFileSync(pkgJson, 'utf8')).version ?? 'unknown');
  } catch {
    /* keep unknown */
  }
  let rel;
  try {
    rel = readFileSync(join(dir, 'path.txt'), 'utf8').trim();
  } catch {
    return { found: false, reason: `electron ${version} is installed without its binary (no path.txt: the download was skipped or failed)` };
  }
  if (!rel || rel.includes('..')) return { found: false, reason: `electron ${version}: path.txt is empty or malformed` };
  const binary = join(dir, 'dist', rel);
  try {
    if (!statSync(binary).isFile()) return { found: false, reason: `electron ${version}: ${binary} is not a file` };
    accessSync(binary, constants.X_OK);
  } catch {
    return { found: false, reason: `electron ${version}: ${binary} is missing or not executable` };
  }
  return { found: true, binary, version };
}

/**
 * Bundles electron/main.ts (ESM) and electron/preload.ts (CommonJS, as sandboxed preloads
 * must be) with esbuild (the bundler vite and tsx already use) into `outDir`, and copies
 * the ffmpeg.wasm worker next to them. Returns the path of main.mjs.
 * @param {string} projectRoot
 * @param {string} outDir
 * @param {{ bundlePackages?: boolean }} [opts] bundle node_modules too (tests), instead of resolving them at run time
 */
export async function buildElectronBundle(projectRoot, outDir, opts = {}) {
  const { build } = await import('esbuild');
  mkdirSync(outDir, { recursive: true });
  const common = { bundle: true, platform: 'node', target: 'node20', external: ['electron'], logLevel: 'warning' };
  await build({
    ...common,
    entryPoints: [join(projectRoot, 'electron', 'main.ts')],
    outfile: join(outDir, 'main.mjs'),
    format: 'esm',
    sourcemap: true,
    ...(opts.bundlePackages ? {} : { packages: 'external' }),
  });
  await build({ ...common, entryPoints: [join(projectRoot, 'electron', 'preload.ts')], outfile: join(outDir, 'preload.cjs'), format: 'cjs' });
  copyFileSync(join(projectRoot, 'electron', 'host', 'footage', 'wasm-ffmpeg-worker.mjs'), join(outDir, 'wasm-ffmpeg-worker.mjs'));
  return join(outDir, 'main.mjs');
}
