/**
 * Project database: store a full match of tracking (2 x 45 min, 25 Hz, 23 objects) in 60 s
 * blocks, then load one period back. Node with fake-indexeddb (the W3C IndexedDB API in
 * JavaScript), compared with one plain IndexedDB put/get of the same period as a single
 * record through fake-indexeddb directly. Then the same in Debian Chromium's real
 * IndexedDB (bench/db-browser-entry.ts, bundled by vite). Prints figures; never fails on a
 * timing.
 */
import 'fake-indexeddb/auto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launchLocalChromium, serveFolder } from '../build/local-chromium.ts';
import { build } from 'vite';
import type { BrowserBenchResult } from './db-browser-entry.ts';
import Dexie from 'dexie';
import { WhistlemarkDb } from '../renderer/src/db/database.ts';
import { createProject, loadTrackingPeriod, storeSource } from '../renderer/src/db/store.ts';
import type { TrackingData } from '../shared-types/index.ts';
import { DEFAULT_PITCH } from '../shared-types/index.ts';

const RATE = 25;
const OBJECTS = 23;
const FRAMES = 45 * 60 * RATE;

function match(): TrackingData {
  const objects = Array.from({ length: OBJECTS }, (_, i) =>
    i === 22 ? { id: 'ball', role: 'ball' as const } : { id: `p${i}`, role: 'player' as const, team: i < 11 ? ('home' as const) : ('away' as const) },
  );
  let seed = 7;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32) * 100 - 50;
  const period = (p: number) => {
    const x = new Float32Array(FRAMES * OBJECTS);
    const y = new Float32Array(FRAMES * OBJECTS);
    for (let i = 0; i < x.length; i++) {
      x[i] = rnd();
      y[i] = rnd() * 0.6;
    }
    return { period: p, firstFrame: 0, frameCount: FRAMES, present: new Uint8Array(FRAMES).fill(1), x, y, homeAttacks: 'positive_x' as const };
  };
  return { rate: RATE, pitch: DEFAULT_PITCH, objects, ballIndex: 22, periods: [period(1), period(2)] };
}

function idbRequest<T>(r: IDBRequest<T>): Promise<T> {
  return new Promise((res, rej) => {
    r.onsuccess = () => res(r.result);
    r.onerror = () => rej(r.error);
  });
}

async function plainBaseline(data: TrackingData): Promise<{ store: number; load: number }> {
  const open = indexedDB.open('bench-plain', 1);
  open.onupgradeneeded = () => open.result.createObjectStore('periods');
  const db = await idbRequest(open);
  const t0 = performance.now();
  await new Promise<void>((res, rej) => {
    const tx = db.transaction('periods', 'readwrite');
    for (const p of data.periods) tx.objectStore('periods').put(p, p.period);
    tx.oncomplete = () => res();
    tx.onerror = () => rej(tx.error);
  });
  const t1 = performance.now();
  const back = await idbRequest(db.transaction('periods').objectStore('periods').get(1));
  const t2 = performance.now();
  if (!back) throw new Error('baseline read nothing');
  db.close();
  indexedDB.deleteDatabase('bench-plain');
  return { store: t1 - t0, load: t2 - t1 };
}

async function main() {
  const data = match();
  const mb = (data.periods.length * FRAMES * OBJECTS * 8) / 2 ** 20;
  const db = new WhistlemarkDb('bench-db');
  const projectId = await createProject(db, 'Bench match', 'bench');
  const t0 = performance.now();
  const sourceId = await storeSource(db, { projectId, file: { fileName: 'bench.csv', path: '/bench.csv', size: 0, mtimeMs: 0 }, payload: { kind: 'tracking', data }, summary: { duration: 5400, periods: [] }, warnings: [], user: 'bench' });
  const t1 = performance.now();
  const loads: number[] = [];
  for (let i = 0; i < 3; i++) {
    const a = performance.now();
    const p = await loadTrackingPeriod(db, sourceId, 1);
    loads.push(performance.now() - a);
    if (p.frameCount !== FRAMES) throw new Error('period came back short');
  }
  loads.sort((a, b) => a - b);
  const base = await plainBaseline(data);
  const store = t1 - t0;
  const load = loads[1];
  console.log(`tracking: 2 periods x ${FRAMES} frames x ${OBJECTS} objects, ${mb.toFixed(1)} MB of x/y, 60 s blocks`);
  console.log(`whistlemark store (one transaction, ${await db.trackingBlocks.count()} blocks): ${store.toFixed(0)} ms (${(mb / (store / 1000)).toFixed(0)} MB/s)`);
  console.log(`whistlemark load one period (median of 3): ${load.toFixed(0)} ms`);
  console.log(`plain fake-indexeddb put of 2 whole periods: ${base.store.toFixed(0)} ms; get one: ${base.load.toFixed(0)} ms`);
  console.log(`ratio store ours/plain: ${(store / base.store).toFixed(2)}; load ours/plain: ${(load / base.load).toFixed(2)}`);
  db.close();
  await Dexie.delete('bench-db');
}
/** Bundle the browser half, serve it on 127.0.0.1 and run it in headless Chromium. */
async function inChromium() {
  const dir = mkdtempSync(join(tmpdir(), 'wm-db-bench-'));
  await build({
    configFile: false,
    logLevel: 'warn',
    build: { outDir: dir, emptyOutDir: false, minify: false, lib: { entry: new URL('./db-browser-entry.ts', import.meta.url).pathname, formats: ['es'], fileName: () => 'bench.js' } },
  });
  writeFileSync(join(dir, 'index.html'), '<!doctype html><meta charset="utf-8"><script type="module">import { runBrowserBench } from "./bench.js"; window.runBrowserBench = runBrowserBench;</script>');
  const { server, url } = await serveFolder(dir);
  const home = join(dir, 'home');
  const browser = await launchLocalChromium(home);
  try {
    const page = await browser.newPage();
    await page.goto(url);
    await page.waitForFunction(() => 'runBrowserBench' in window);
    const r = await page.evaluate(
      ([f, o]) => (window as unknown as { runBrowserBench: (f: number, o: number) => Promise<BrowserBenchResult> }).runBrowserBench(f, o),
      [FRAMES, OBJECTS] as const,
    );
    const load = [...r.loadMs].sort((a, b) => a - b)[1];
    console.log(`\nChromium (real IndexedDB), same data, ${r.mb.toFixed(1)} MB:`);
    console.log(`whistlemark store: ${r.storeMs.toFixed(0)} ms (${(r.mb / (r.storeMs / 1000)).toFixed(0)} MB/s); load one period (median of 3): ${load.toFixed(0)} ms`);
    console.log(`plain IndexedDB put of 2 whole periods: ${r.plainStoreMs.toFixed(0)} ms; get one: ${r.plainLoadMs.toFixed(0)} ms`);
    console.log(`ratio store ours/plain: ${(r.storeMs / r.plainStoreMs).toFixed(2)}; load ours/plain: ${(load / r.plainLoadMs).toFixed(2)}`);
  } finally {
    await browser.close();
    server.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
await inChromium().catch((e) => console.log(`(Chromium part skipped: ${(e as Error).message})`));
