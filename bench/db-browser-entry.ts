/**
 * Browser half of bench/db.bench.ts: the same store + load as the Node half, on Chromium's
 * real IndexedDB, next to one plain IndexedDB put/get of the same period. Bundled by the
 * bench with vite's library build and run in Debian Chromium.
 */
import Dexie from 'dexie';
import { WhistlemarkDb } from '../renderer/src/db/database.ts';
import { createProject, loadTrackingPeriod, storeSource } from '../renderer/src/db/store.ts';
import type { TrackingData } from '../shared-types/index.ts';
import { DEFAULT_PITCH } from '../shared-types/index.ts';

export interface BrowserBenchResult {
  mb: number;
  storeMs: number;
  loadMs: number[];
  plainStoreMs: number;
  plainLoadMs: number;
}

function match(frames: number, objects: number): TrackingData {
  let seed = 7;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32) * 100 - 50;
  const period = (p: number) => {
    const x = new Float32Array(frames * objects);
    const y = new Float32Array(frames * objects);
    // Random values: Chromium compresses stored values, so smooth data would flatter it.
    for (let i = 0; i < x.length; i++) {
      x[i] = rnd();
      y[i] = rnd() * 0.6;
    }
    return { period: p, firstFrame: 0, frameCount: frames, present: new Uint8Array(frames).fill(1), x, y, homeAttacks: 'positive_x' as const };
  };
  return {
    rate: 25,
    pitch: DEFAULT_PITCH,
    objects: Array.from({ length: objects }, (_, i) => ({ id: `o${i}`, role: i === objects - 1 ? ('ball' as const) : ('player' as const) })),
    ballIndex: objects - 1,
    periods: [period(1), period(2)],
  };
}

function req<T>(r: IDBRequest<T>): Promise<T> {
  return new Promise((res, rej) => {
    r.onsuccess = () => res(r.result);
    r.onerror = () => rej(r.error);
  });
}

export async function runBrowserBench(frames: number, objects: number): Promise<BrowserBenchResult> {
  const data = match(frames, objects);
  const db = new WhistlemarkDb('bench-db-browser');
  const projectId = await createProject(db, 'Bench match', 'bench');
  const t0 = performance.now();
  const sourceId = await storeSource(db, { projectId, file: { fileName: 'bench.csv', path: '/bench.csv', size: 0, mtimeMs: 0 }, payload: { kind: 'tracking', data }, summary: { duration: 0, periods: [] }, warnings: [], user: 'bench' });
  const storeMs = performance.now() - t0;
  const loadMs: number[] = [];
  for (let i = 0; i < 3; i++) {
    const a = performance.now();
    const p = await loadTrackingPeriod(db, sourceId, 1);
    loadMs.push(performance.now() - a);
    if (p.frameCount !== frames) throw new Error('short period');
  }
  db.close();
  await Dexie.delete('bench-db-browser');

  const open = indexedDB.open('bench-plain', 1);
  open.onupgradeneeded = () => open.result.createObjectStore('periods');
  const plain = await req(open);
  const p0 = performance.now();
  await new Promise<void>((res, rej) => {
    const tx = plain.transaction('periods', 'readwrite');
    for (const p of data.periods) tx.objectStore('periods').put(p, p.period);
    tx.oncomplete = () => res();
    tx.onerror = () => rej(tx.error);
  });
  const plainStoreMs = performance.now() - p0;
  const p1 = performance.now();
  await req(plain.transaction('periods').objectStore('periods').get(1));
  const plainLoadMs = performance.now() - p1;
  plain.close();
  indexedDB.deleteDatabase('bench-plain');
  return { mb: (2 * frames * objects * 8) / 2 ** 20, storeMs, loadMs, plainStoreMs, plainLoadMs };
}
