/**
 * Browser half of bench/renderer-memory.bench.ts: the renderer's own code path for a
 * tracking file. Streams the served CSV through openTextStream into engine/import's
 * importTracking (what the import worker runs), stores it with storeSource in Chromium's
 * real IndexedDB, drops it, then loads the whole match back with loadTracking (how the
 * renderer holds a match for overlays and sync). Each step keeps its result on `held` so
 * the Node half can read the heap between steps. Bundled by the bench with vite.
 */
import { importTracking } from '../engine/import/index.ts';
import type { TrackingData, TrackingMapping } from '../shared-types/index.ts';
import { WhistlemarkDb } from '../renderer/src/db/database.ts';
import { createProject, loadTracking, storeSource } from '../renderer/src/db/store.ts';
import { openTextStream } from '../renderer/src/import/text-stream.ts';
import { summariseTracking } from '../renderer/src/summaries.ts';

export interface StepFigures {
  ms: number;
  /** Bytes of the typed arrays (x, y, present, ball height) of the match held now. */
  typedBytes: number;
  frames: number;
  objects: number;
}

let held: TrackingData | null = null;
let db: WhistlemarkDb | null = null;
let sourceId = 0;

function typedBytes(d: TrackingData): number {
  let n = 0;
  for (const p of d.periods) n += p.x.byteLength + p.y.byteLength + p.present.byteLength + (p.ballZ?.byteLength ?? 0);
  return n;
}

function figures(ms: number): StepFigures {
  const d = held!;
  return { ms, typedBytes: typedBytes(d), frames: d.periods.reduce((a, p) => a + p.frameCount, 0), objects: d.objects.length };
}

/** Import the served file and store it (one transaction); the imported match stays held. */
export async function importAndStore(url: string, size: number, mapping: TrackingMapping): Promise<StepFigures & { problems: string[] }> {
  const t0 = performance.now();
  const chunks = await openTextStream((u, init) => fetch(u, init), url);
  const r = await importTracking(chunks, { fileName: 'match-wide.csv', mapping, bytesTotal: size });
  if (!r.ok || !r.data) throw new Error(`import refused: ${JSON.stringify(r.problems.slice(0, 3))}`);
  held = r.data;
  db = new WhistlemarkDb('memory-bench');
  const projectId = await createProject(db, 'Memory bench match', 'bench');
  sourceId = await storeSource(db, {
    projectId,
    file: { fileName: 'match-wide.csv', path: '/match-wide.csv', size, mtimeMs: 0 },
    payload: { kind: 'tracking', data: r.data },
    summary: summariseTracking(r.data, r.rows, r.rejectedRows.length),
    warnings: r.problems.filter((p) => p.severity === 'warning'),
    mapping,
    user: 'bench',
  });
  return { ...figures(performance.now() - t0), problems: r.problems.map((p) => `${p.severity}: ${p.message}`) };
}

/** Let go of everything the import made (the Node half collects garbage after this). */
export function drop(): void {
  held = null;
}

/** Load the stored match back from IndexedDB, as the renderer does; it stays held. */
export async function loadBack(): Promise<StepFigures> {
  const t0 = performance.now();
  held = await loadTracking(db!, sourceId);
  return figures(performance.now() - t0);
}

/** Chromium's own estimate (JS heap plus array buffers), when the page is cross-origin isolated. */
export async function userAgentMemory(): Promise<number | string> {
  const p = performance as Performance & { measureUserAgentSpecificMemory?: () => Promise<{ bytes: number }> };
  if (!crossOriginIsolated) return 'page not cross-origin isolated';
  if (!p.measureUserAgentSpecificMemory) return 'not available';
  return (await p.measureUserAgentSpecificMemory()).bytes;
}

export async function cleanUp(): Promise<void> {
  held = null;
  db?.close();
  await indexedDB.deleteDatabase('memory-bench');
}
