import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { createProject, loadTrackingPeriod } from '../../../renderer/src/db/store.ts';
import { engineImporters } from '../../../renderer/src/import/engine-importers.ts';
import { prepareFile } from '../../../renderer/src/import/prepare.ts';
import { runImport } from '../../../renderer/src/import/run-import.ts';
import type { FetchLike } from '../../../renderer/src/import/text-stream.ts';
import { mappingGaps } from '../../../renderer/src/mapping/edit.ts';
import type { OpenedFile } from '../../../shared-types/index.ts';
import { standinEventsCsv, standinTrackingCsv } from './standins.ts';

// The renderer's import path with the engine's real importers, on invented stand-in files.
const files = new Map<string, string>();
/** Serves registered texts like the host's file service (with Range support for the head). */
const serve: FetchLike = async (url, init) => {
  const text = files.get(url);
  if (text === undefined) return new Response('not found', { status: 404 });
  const bytes = new TextEncoder().encode(text);
  const range = new Headers(init?.headers).get('Range');
  const m = range && /bytes=(\d+)-(\d+)/.exec(range);
  const body = m ? bytes.slice(Number(m[1]), Number(m[2]) + 1) : bytes;
  let pos = 0;
  return new Response(
    new ReadableStream({
      pull(c) {
        if (pos >= body.length) return c.close();
        c.enqueue(body.slice(pos, pos + 4096));
        pos += 4096;
      },
    }),
    { status: m ? 206 : 200 },
  );
};
function opened(name: string, text: string): OpenedFile {
  const url = `http://127.0.0.1:1/files/${name}`;
  files.set(url, text);
  return { fileId: name, name, path: `/match/${name}`, size: new TextEncoder().encode(text).length, mtimeMs: 0, url };
}

const dbs: WhistlemarkDb[] = [];
afterEach(async () => {
  for (const d of dbs.splice(0)) {
    d.close();
    await Dexie.delete(d.name);
  }
});

describe('import with the engine importers', () => {
  it('detects, maps and stores stand-in tracking and events', async () => {
    const db = new WhistlemarkDb(`wm-engine-${Date.now()}`);
    dbs.push(db);
    const projectId = await createProject(db, 'Stand-in match', 'analyst');
    const signal = new AbortController().signal;

    const trk = await prepareFile(db, engineImporters, serve, opened('tracking.csv', standinTrackingCsv()), 'http://127.0.0.1:1/');
    expect(trk.kind).toBe('tracking');
    if (trk.kind === 'footage' || !trk.mapping) throw new Error('tracking not mapped');
    expect(mappingGaps(trk.mapping, trk.detection.header)).toEqual([]);
    const t = await runImport(
      {
        projectId,
        file: { ...trk.file, fileName: trk.file.name },
        mapping: trk.mapping,
        detected: { confidence: trk.detection.confidence, clues: trk.detection.clues },
        headerSignature: trk.signature,
        rememberMapping: true,
        user: 'analyst',
      },
      { db, importers: engineImporters, fetch: serve, onProgress: () => {}, signal },
    );
    expect(t.status, JSON.stringify(t)).toBe('stored');
    if (t.status !== 'stored') return;
    // 8 s per period at 25 Hz (common practice rate) = 200 frames each.
    expect(t.summary.rate).toBe(25);
    expect(t.summary.periods.map((p) => p.frames)).toEqual([200, 200]);
    expect(t.summary.players).toEqual({ home: 2, away: 2, unknown: 0 });
    expect(t.summary.hasBall).toBe(true);
    expect((await db.sources.get(t.sourceId))?.detected?.confidence).toBe(trk.detection.confidence);
    const p2 = await loadTrackingPeriod(db, t.sourceId, 2);
    expect(p2.frameCount).toBe(200);

    const ev = await prepareFile(db, engineImporters, serve, opened('events.csv', standinEventsCsv()), 'http://127.0.0.1:1/');
    expect(ev.kind).toBe('events');
    if (ev.kind === 'footage' || !ev.mapping) throw new Error('events not mapped');
    const e = await runImport(
      { projectId, file: { ...ev.file, fileName: ev.file.name }, mapping: ev.mapping, headerSignature: ev.signature, rememberMapping: true, user: 'analyst' },
      { db, importers: engineImporters, fetch: serve, onProgress: () => {}, signal },
    );
    expect(e.status, JSON.stringify(e)).toBe('stored');
    if (e.status !== 'stored') return;
    expect(e.summary.eventCount).toBe(6);
    expect(e.summary.eventsByKind).toMatchObject({ kick_off: 2, goal_kick: 1, throw_in: 1, corner: 1 });

    // The same header again comes with the remembered mapping.
    const again = await prepareFile(db, engineImporters, serve, opened('events-2.csv', standinEventsCsv()), 'http://127.0.0.1:1/');
    expect(again.kind !== 'footage' && again.fromMemory).toBe(true);
  });

  it('refuses a garbled events file and stores nothing', async () => {
    const db = new WhistlemarkDb(`wm-engine-bad-${Date.now()}`);
    dbs.push(db);
    const projectId = await createProject(db, 'Stand-in match', 'analyst');
    const good = standinEventsCsv().split('\n');
    const garbled = [...good.slice(0, 4), '1,99:xx.q,Pass,Nobody', '1,,Goal Kick', ...good.slice(4)].join('\n');
    const ev = await prepareFile(db, engineImporters, serve, opened('garbled-events.csv', garbled), 'http://127.0.0.1:1/');
    if (ev.kind === 'footage' || !ev.mapping) throw new Error(`not mapped: ${ev.kind}`);
    const out = await runImport(
      { projectId, file: { ...ev.file, fileName: ev.file.name }, mapping: ev.mapping, headerSignature: ev.signature, rememberMapping: true, user: 'analyst' },
      { db, importers: engineImporters, fetch: serve, onProgress: () => {}, signal: new AbortController().signal },
    );
    expect(out.status).toBe('refused');
    if (out.status === 'refused') {
      // The problem list names the bad lines (header is line 1), and the importer's verdict is an error.
      expect(out.problems.map((p) => p.line)).toEqual(expect.arrayContaining([5, 6]));
      expect(out.problems.some((p) => p.severity === 'error')).toBe(true);
      expect(out.rejectedRows.map((r) => r.line)).toEqual([5, 6]);
    }
    expect(await db.sources.count()).toBe(0);
    expect(await db.events.count()).toBe(0);
    expect(await db.mappings.count()).toBe(0);
  });
});
