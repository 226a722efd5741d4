/**
 * Renderer memory for a loaded full match (prints figures, never fails). A full-length
 * simulated match (fixtures/sim, 2 x 47-49 min, 25 Hz, 23 objects) written as wide CSV is
 * served on 127.0.0.1 and run through the renderer's own code path in Debian Chromium
 * (bench/renderer-memory-entry.ts: stream -> engine import -> IndexedDB -> load back).
 * Between steps the heap is read over CDP after a forced garbage collection:
 * Performance.getMetrics JSHeapUsedSize (V8 heap; typed-array contents live outside it),
 * the typed-array bytes of the match held, performance.measureUserAgentSpecificMemory
 * (the page is served cross-origin isolated for it) and the renderer processes' RSS from
 * /proc (pids from CDP SystemInfo.getProcessInfo). Goal: a loaded match under 600 MB in the renderer.
 *
 * Run: npx tsx bench/renderer-memory.bench.ts   (WM_BENCH_GENERATOR=own: the small generator)
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type CDPSession, type Page } from 'playwright-core';
import { launchLocalChromium, serveFolder, type ServedFolder } from '../build/local-chromium.ts';
import { build } from 'vite';
import type { TrackingMapping } from '../shared-types/import.ts';
import { detectSource } from '../engine/import/index.ts';
import type * as Entry from './renderer-memory-entry.ts';

const PERIOD_SECONDS = [2820, 2940]; // 47 and 49 minutes: 45 + stoppage (Law 7)
const GOAL_MB = 600;
const mb = (b: number) => (b / 1e6).toFixed(0).padStart(5);

async function wideCsv(): Promise<{ text: string; source: string }> {
  if (process.env.WM_BENCH_GENERATOR !== 'own') {
    const sim = await import('../fixtures/sim/index.ts');
    const world = sim.simulateMatch({ seed: 7, periodSeconds: PERIOD_SECONDS });
    return { text: sim.writeTracking(world, { layout: 'wide', rate: 25 }).text, source: 'fixtures/sim' };
  }
  const { synthFrames, writeWide, coords } = await import('../tests/unit/import/helpers/synthetic.ts');
  const s = synthFrames({ rate: 25, periodS: PERIOD_SECONDS[0], periods: 1 });
  const s2 = synthFrames({ rate: 25, periodS: PERIOD_SECONDS[1], periods: 2 });
  return { text: writeWide({ objects: s.objects, frames: [...s.frames, ...s2.frames.filter((f) => f.period === 2)] }, coords({})), source: 'tests/unit/import/helpers/synthetic.ts' };
}

/** Process ids of the browser's renderers (CDP SystemInfo.getProcessInfo, browser-level). */
async function rendererPids(browserCdp: CDPSession): Promise<number[]> {
  const { processInfo } = await browserCdp.send('SystemInfo.getProcessInfo');
  return processInfo.filter((p) => p.type === 'renderer').map((p) => p.id);
}

/** RSS (bytes) of these processes, read from /proc (Linux). */
function rssOf(pids: number[]): number {
  let rss = 0;
  for (const pid of pids) {
    try {
      const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
      if (m) rss += Number(m[1]) * 1024;
    } catch {
      // the process ended meanwhile
    }
  }
  return rss;
}

interface Reading {
  heapUsed: number;
  heapTotal: number;
  uaMemory: number | string;
  rss: number;
}

async function read(cdp: CDPSession, page: Page, pids: number[]): Promise<Reading> {
  await cdp.send('HeapProfiler.collectGarbage');
  const { metrics } = await cdp.send('Performance.getMetrics');
  const metric = (n: string) => metrics.find((m) => m.name === n)?.value ?? NaN;
  const uaMemory = await page.evaluate(() => (window as unknown as { wm: typeof Entry }).wm.userAgentMemory()).catch((e: Error) => e.message);
  return { heapUsed: metric('JSHeapUsedSize'), heapTotal: metric('JSHeapTotalSize'), uaMemory, rss: rssOf(pids) };
}

async function main(): Promise<void> {
  const t0 = performance.now();
  const { text, source } = await wideCsv();
  const body = Buffer.from(text, 'latin1');
  const mapping = detectSource('match-wide.csv', text.slice(0, 65536)).mapping as TrackingMapping;
  console.log(`wide CSV from ${source}: ${(body.length / 1e6).toFixed(1)} MB, generated in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

  const dir = mkdtempSync(join(tmpdir(), 'wm-mem-bench-'));
  let served: ServedFolder | undefined;
  try {
    await build({
      configFile: false,
      logLevel: 'warn',
      build: { outDir: dir, emptyOutDir: false, minify: false, lib: { entry: new URL('./renderer-memory-entry.ts', import.meta.url).pathname, formats: ['es'], fileName: () => 'bench.js' } },
    });
    writeFileSync(join(dir, 'index.html'), '<!doctype html><meta charset="utf-8"><script type="module">import * as wm from "./bench.js"; window.wm = wm;</script>');
    // Cross-origin isolation (COOP + COEP) so measureUserAgentSpecificMemory is offered.
    const isolation = { 'cross-origin-opener-policy': 'same-origin', 'cross-origin-embedder-policy': 'require-corp' };
    served = await serveFolder(dir, { headers: isolation, routes: { '/match-wide.csv': { type: 'text/csv', body } } });
    const home = join(dir, 'home');
    const browser = await launchLocalChromium(home);
    try {
      const page = await browser.newPage();
      await page.goto(served.url);
      await page.waitForFunction(() => 'wm' in window);
      const cdp = await page.context().newCDPSession(page);
      await cdp.send('Performance.enable');
      const pids = await rendererPids(await browser.newBrowserCDPSession());
      const rows: [string, Reading, Entry.StepFigures | null][] = [];
      rows.push(['page loaded, nothing held', await read(cdp, page, pids), null]);

      // Peak renderer RSS while importing, sampled from /proc (needs nothing from the busy page).
      let peakRss = 0;
      const poll = setInterval(() => (peakRss = Math.max(peakRss, rssOf(pids))), 100);
      const imported = await page.evaluate(
        ([url, size, m]) => (window as unknown as { wm: typeof Entry }).wm.importAndStore(url, size, m),
        ['/match-wide.csv', body.length, mapping] as const,
      );
      clearInterval(poll);
      rows.push(['imported + stored, match held', await read(cdp, page, pids), imported]);
      await page.evaluate(() => (window as unknown as { wm: typeof Entry }).wm.drop());
      rows.push(['import dropped', await read(cdp, page, pids), null]);
      const loaded = await page.evaluate(() => (window as unknown as { wm: typeof Entry }).wm.loadBack());
      const atLoad = await read(cdp, page, pids);
      rows.push(['loaded back from IndexedDB, held', atLoad, loaded]);

      console.log(`import problems: ${imported.problems.join(' | ') || 'none'}`);
      console.log(`import + store ${(imported.ms / 1000).toFixed(1)} s; load back ${(loaded.ms / 1000).toFixed(1)} s; ${loaded.frames.toLocaleString()} frames x ${loaded.objects} objects`);
      console.log('step'.padEnd(36), 'JS heap MB'.padStart(10), 'heap total'.padStart(10), 'typed MB'.padStart(9), 'UA memory MB'.padStart(13), 'renderer RSS MB'.padStart(16));
      for (const [name, r, f] of rows) {
        const ua = typeof r.uaMemory === 'number' ? mb(r.uaMemory) : '-';
        console.log(name.padEnd(36), mb(r.heapUsed).padStart(10), mb(r.heapTotal).padStart(10), (f ? mb(f.typedBytes) : '-').padStart(9), ua.padStart(13), mb(r.rss).padStart(16));
      }
      const notes = rows.map(([, r]) => r.uaMemory).filter((u) => typeof u === 'string');
      if (notes.length) console.log(`(measureUserAgentSpecificMemory: ${notes[0]})`);
      console.log(`peak renderer RSS during import + store: ${mb(peakRss).trim()} MB`);
      const base = rows[0][1];
      const loadedCost = atLoad.heapUsed - base.heapUsed + loaded.typedBytes;
      console.log(
        `loaded match: JS heap +${mb(atLoad.heapUsed - base.heapUsed).trim()} MB + typed arrays ${mb(loaded.typedBytes).trim()} MB = ${mb(loadedCost).trim()} MB; ` +
          `renderer RSS ${mb(atLoad.rss).trim()} MB; goal < ${GOAL_MB} MB: ${atLoad.rss < GOAL_MB * 1e6 ? 'met (RSS)' : loadedCost < GOAL_MB * 1e6 ? 'met for the data, not for the whole renderer RSS' : 'NOT met'}`,
      );
      await page.evaluate(() => (window as unknown as { wm: typeof Entry }).wm.cleanUp());
    } finally {
      await browser.close();
    }
  } finally {
    served?.server.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
