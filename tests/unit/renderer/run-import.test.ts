import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { createProject, loadTrackingPeriod } from '../../../renderer/src/db/store.ts';
import type { Importers, TextChunks } from '../../../renderer/src/import/importers.ts';
import { runImport, type ImportJob } from '../../../renderer/src/import/run-import.ts';
import type { FetchLike } from '../../../renderer/src/import/text-stream.ts';
import type { ImportProgress, TrackingData, TrackingMapping } from '../../../shared-types/index.ts';
import { DEFAULT_PITCH } from '../../../shared-types/index.ts';

// A tiny local importer for "frame,x,y" text, only so the worker's import path (stream ->
// importer -> one transaction) can be tested without the engine; the engine's own
// importers have their own tests in tests/unit/import.
const lineImporter: Importers = {
  detectSource: () => ({ kind: 'unknown', clues: [], header: [], preview: [], confidence: 0, problems: [] }),
  importEvents: async () => ({ ok: false, problems: [], rejectedRows: [], rows: 0 }),
  async importTracking(chunks: TextChunks, opts) {
    let text = '';
    for await (const c of chunks) {
      text += c;
      opts.onProgress?.({ bytesRead: text.length, bytesTotal: opts.bytesTotal ?? 0, rows: 0, phase: 'reading' });
      if (opts.signal?.aborted) break;
    }
    const lines = text.trim().split('\n').slice(1);
    const problems = lines.flatMap((l, i) =>
      l.split(',').length === 3 ? [] : [{ severity: 'error' as const, file: opts.fileName, line: i + 2, message: 'expected 3 fields' }],
    );
    if (problems.length) return { ok: false, problems, rejectedRows: [], rows: lines.length };
    const vals = lines.map((l) => l.split(',').map(Number));
    const data: TrackingData = {
      rate: 25,
      pitch: DEFAULT_PITCH,
      objects: [{ id: 'ball', role: 'ball' }],
      ballIndex: 0,
      periods: [{ period: 1, firstFrame: vals[0][0], frameCount: vals.length, present: new Uint8Array(vals.length).fill(1), x: Float32Array.from(vals.map((v) => v[1])), y: Float32Array.from(vals.map((v) => v[2])), homeAttacks: 'positive_x' }],
    };
    return { ok: true, data, problems: [], rejectedRows: [], rows: lines.length };
  },
};

/** Serves a string as a streamed response in small chunks (like the host's file service). */
function serve(text: string, chunkSize = 7): FetchLike {
  return async (_url, init) => {
    const bytes = new TextEncoder().encode(text);
    let pos = 0;
    const body = new ReadableStream<Uint8Array>({
      pull(ctrl) {
        if (init?.signal?.aborted) return ctrl.error(new DOMException('aborted', 'AbortError'));
        if (pos >= bytes.length) return ctrl.close();
        ctrl.enqueue(bytes.slice(pos, pos + chunkSize));
        pos += chunkSize;
      },
    });
    return new Response(body, { status: 200 });
  };
}

const mapping = { kind: 'tracking', layout: 'wide', columns: {}, periods: { from: 'column' }, coordinates: { unit: 'm', origin: 'centre', yDown: false, pitch: DEFAULT_PITCH } } as TrackingMapping;
const dbs: WhistlemarkDb[] = [];
afterEach(async () => {
  for (const d of dbs.splice(0)) {
    d.close();
    await Dexie.delete(d.name);
  }
});

async function setup() {
  const db = new WhistlemarkDb(`wm-run-${dbs.length}-${Date.now()}`);
  dbs.push(db);
  const projectId = await createProject(db, 'Test match', 'analyst');
  const job = (text: string): ImportJob => ({
    projectId,
    file: { fileName: 'ball.csv', path: '/x/ball.csv', size: text.length, mtimeMs: 0, url: 'http://127.0.0.1/files/1' },
    mapping,
    headerSignature: 'tracking:3:abc',
    rememberMapping: true,
    user: 'analyst',
  });
  return { db, job };
}

describe('runImport (worker import path)', () => {
  it('streams the file, stores the source in one go and remembers the mapping', async () => {
    const { db, job } = await setup();
    const text = 'frame,x,y\n10,1.5,2\n11,1.75,2.25\n12,2,2.5\n';
    const progress: ImportProgress[] = [];
    const out = await runImport(job(text), { db, importers: lineImporter, fetch: serve(text), onProgress: (p) => progress.push(p), signal: new AbortController().signal });
    expect(out.status).toBe('stored');
    if (out.status !== 'stored') return;
    expect(out.summary.frames).toBe(3);
    expect(out.summary.duration).toBeCloseTo(3 / 25, 9);
    const p = await loadTrackingPeriod(db, out.sourceId, 1);
    expect(Array.from(p.x)).toEqual([1.5, 1.75, 2]);
    expect(p.firstFrame).toBe(10);
    expect((await db.mappings.get('tracking:3:abc'))?.fileName).toBe('ball.csv');
    // Chunks of 7 bytes: several reading reports, then storing, then done.
    expect(progress.filter((x) => x.phase === 'reading').length).toBeGreaterThan(3);
    expect(progress.at(-1)?.phase).toBe('done');
  });

  it('refuses a file with errors and stores nothing', async () => {
    const { db, job } = await setup();
    const text = 'frame,x,y\n10,1.5,2\n11;1.75\n';
    const out = await runImport(job(text), { db, importers: lineImporter, fetch: serve(text), onProgress: () => {}, signal: new AbortController().signal });
    expect(out.status).toBe('refused');
    if (out.status === 'refused') expect(out.problems[0]).toMatchObject({ line: 3, severity: 'error' });
    expect(await db.sources.count()).toBe(0);
    expect(await db.mappings.count()).toBe(0);
  });

  it('stores nothing when cancelled while reading', async () => {
    const { db, job } = await setup();
    const text = 'frame,x,y\n' + Array.from({ length: 200 }, (_, i) => `${i},1,2`).join('\n');
    const ctrl = new AbortController();
    const out = await runImport(job(text), {
      db,
      importers: lineImporter,
      fetch: serve(text),
      onProgress: (p) => {
        if (p.bytesRead > 100) ctrl.abort();
      },
      signal: ctrl.signal,
    });
    expect(out.status).toBe('cancelled');
    expect(await db.sources.count()).toBe(0);
  });

  it('says what went wrong when the file cannot be fetched', async () => {
    const { db, job } = await setup();
    const out = await runImport(job('x'), { db, importers: lineImporter, fetch: async () => new Response('gone', { status: 404, statusText: 'Not Found' }), onProgress: () => {}, signal: new AbortController().signal });
    expect(out.status).toBe('refused');
    if (out.status === 'refused') expect(out.problems[0].message).toMatch(/Reading ball\.csv: .*404/);
  });
});
