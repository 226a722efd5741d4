/**
 * Match project file benchmark (prints, never fails): save (rows → .wmatch bytes → atomic
 * write) and open (read → checked tables) for the demo match and a full-length simulated
 * match, beside zipping the same entry bytes with fflate's plain zipSync and with Info-ZIP's
 * `zip` tool (Debian), and reading them back with unzipSync and `unzip -t`.
 * WM_BENCH_PROJECT_MINUTES=20 npx tsx bench/project-file.bench.ts for a shorter full case (default 90).
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { unzipSync, zipSync } from 'fflate';
import { readProjectFile, writeProjectFile, type ProjectTables } from '../engine/project-file/index.ts';
import { matchTables } from '../engine/project-file/match-tables.ts';
import { syncMatch } from '../engine/sync.ts';
import { openProjectFile, saveProjectFile } from '../electron/host/project-file.ts';
import { simulateMatch, writeEvents, writeTracking } from '../fixtures/sim/index.ts';
import { DEMO, loadSources, type LoadedSources } from '../tests/unit/project-file/demo-project.ts';

const minutes = Number(process.env.WM_BENCH_PROJECT_MINUTES ?? 90);
const scratch = mkdtempSync(join(tmpdir(), 'wm-bench-project-'));
const ms = (t0: number) => performance.now() - t0;
const MB = (n: number) => (n / 1e6).toFixed(1);

function tablesOf(src: LoadedSources, withSync: boolean): ProjectTables {
  const file = (p: string) => ({ fileName: p.split('/').pop()!, path: p, size: statSync(p).size, mtimeMs: 0 });
  return matchTables({
    title: 'bench', user: 'bench', tracking: src.tracking.data, events: src.events.data,
    files: { tracking: file(src.tracking.path), events: file(src.events.path) },
    ...(withSync ? { sync: syncMatch(src.tracking.data, src.events.data) } : {}),
  });
}

async function run(label: string, tables: ProjectTables) {
  const path = join(scratch, `${label}.wmatch`);
  let t0 = performance.now();
  const bytes = await writeProjectFile(tables, { writtenBy: 'bench', databaseVersion: 3 });
  const build = ms(t0);
  t0 = performance.now();
  await saveProjectFile(path, bytes, { overwrite: true });
  const write = ms(t0);
  t0 = performance.now();
  const opened = await openProjectFile(path);
  const open = ms(t0);
  if (opened.tables.trackingBlocks.length !== tables.trackingBlocks.length) throw new Error('round trip lost blocks');

  // The same entry bytes, zipped by the reference tools.
  const entries = unzipSync(bytes);
  const raw = Object.values(entries).reduce((n, e) => n + e.byteLength, 0);
  t0 = performance.now();
  const plain = zipSync(entries, { level: 1 });
  const fflateZip = ms(t0);
  t0 = performance.now();
  unzipSync(plain);
  const fflateUnzip = ms(t0);
  const dir = join(scratch, label);
  for (const [name, b] of Object.entries(entries)) {
    mkdirSync(dirname(join(dir, name)), { recursive: true });
    writeFileSync(join(dir, name), b);
  }
  const zipPath = join(scratch, `${label}-tool.zip`);
  t0 = performance.now();
  spawnSync('zip', ['-q', '-1', '-r', zipPath, '.'], { cwd: dir });
  const zipTool = ms(t0);
  t0 = performance.now();
  const test = spawnSync('unzip', ['-tq', zipPath]);
  const unzipTool = ms(t0);
  if (test.status !== 0) throw new Error('unzip -t failed');
  // And the full read path on the tool's zip bytes for a like-for-like open (checksums + decode excluded there).
  t0 = performance.now();
  await readProjectFile(readFileSync(path));
  const readOnly = ms(t0);

  const row = (what: string, t: number, size?: number, ref?: number) =>
    console.log(`  ${what.padEnd(44)} ${t.toFixed(0).padStart(7)} ms${size !== undefined ? `  ${MB(size).padStart(7)} MB` : '           '}${ref ? `  ×${(t / ref).toFixed(2)} of the reference` : ''}`);
  console.log(`\n${label}: ${tables.trackingBlocks.length} tracking blocks, ${tables.events.length} events, ${tables.corrections.length} corrections; ${MB(raw)} MB of entries`);
  row('save: rows → .wmatch (encode, SHA-256, zip)', build, bytes.byteLength, fflateZip);
  row('save: atomic write to disk (fsync, rename)', write);
  row('open: read + check + decode tables', open, undefined, fflateUnzip);
  row('open: readProjectFile on bytes in memory', readOnly);
  row('fflate zipSync, same entries, level 1', fflateZip, plain.byteLength);
  row('fflate unzipSync of that', fflateUnzip);
  row('zip -1 -r (Info-ZIP, Debian), same entries', zipTool, statSync(zipPath).size, fflateZip);
  row('unzip -t of that', unzipTool);
}

try {
  console.log(`project file benchmark; load average ${loadavg().map((v) => v.toFixed(1)).join(' ')} (2 cores, shared: wall times are slower than on an idle machine)`);
  const demo = await loadSources(DEMO);
  await run('demo (2 × 3.5 min, with sync)', tablesOf(demo, true));

  const t0 = performance.now();
  const world = simulateMatch({ seed: 3, periodSeconds: [minutes * 30, minutes * 30] });
  const full = join(scratch, 'full') + '/';
  mkdirSync(full);
  writeFileSync(full + 'tracking.csv', writeTracking(world, { rate: 25, layout: 'wide' }).text);
  writeFileSync(full + 'events.csv', writeEvents(world, {}).text);
  const fullSrc = await loadSources(full);
  console.log(`\n(simulated and imported a ${minutes}-minute match in ${(ms(t0) / 1000).toFixed(1)} s; no sync run for it, tracking dominates the file)`);
  await run(`full-length (${minutes} min, 25 Hz)`, tablesOf(fullSrc, false));
} finally {
  rmSync(scratch, { recursive: true, force: true });
}
