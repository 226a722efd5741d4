// When dist/renderer must be (re)built: missing, or older than any file it bundles
// (renderer/, shared-types/, engine/, the vite config). Shared by `npm start`,
// `whistlemark export` and the browser benchmarks. Plain JS so `node scripts/start.mjs` can use it.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

const SOURCES = ['renderer', 'shared-types', 'engine', 'build/vite.config.ts'];

/** Newest modification time of any file under the given paths (node_modules and dot folders skipped). */
function newestMtime(paths) {
  let newest = 0;
  const walk = (p) => {
    let info;
    try {
      info = statSync(p);
    } catch {
      return;
    }
    if (info.isDirectory()) {
      for (const name of readdirSync(p)) if (name !== 'node_modules' && !name.startsWith('.')) walk(join(p, name));
    } else newest = Math.max(newest, info.mtimeMs);
  };
  paths.forEach(walk);
  return newest;
}

/** 'fresh', 'stale' (sources changed since the build) or 'missing', for the project at `root`. */
export function rendererBuildState(root) {
  const index = join(root, 'dist', 'renderer', 'index.html');
  if (!existsSync(index)) return 'missing';
  return statSync(index).mtimeMs >= newestMtime(SOURCES.map((p) => join(root, p))) ? 'fresh' : 'stale';
}
