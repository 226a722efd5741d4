/**
 * Builds a whole match project in a database the way the app does: the demo's tracking and
 * event log imported (the engine's importers, stored by storeSource), the engine's sync
 * stored as anchors, a clock fit and proposed corrections, then analyst work through the
 * undo history (accepts, a reject, an edit, a non-live interval, a reel with clips, a
 * registration, one undone step). Used by the project-file tests and the benchmark.
 */
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { detectSource, importEvents, importTracking } from '../../../engine/import/index.ts';
import { syncMatch } from '../../../engine/sync.ts';
import { readHead, readTextChunks } from '../../../electron/host/text-stream.ts';
import type { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { createProject, storeSource } from '../../../renderer/src/db/store.ts';
import { commit, undo } from '../../../renderer/src/history/history.ts';
import { summariseEvents, summariseTracking } from '../../../renderer/src/summaries.ts';
import type { EventLog, TrackingData } from '../../../shared-types/index.ts';

export const DEMO = new URL('../../../fixtures/demo/', import.meta.url).pathname;

export async function loadSources(dir = DEMO, trackingName = 'tracking.csv', eventsName = 'events.csv') {
  const load = async <T>(name: string, kind: 'tracking' | 'events', importer: typeof importTracking | typeof importEvents) => {
    const path = dir + name;
    const d = detectSource(name, await readHead(path));
    if (d.kind !== kind || !d.mapping) throw new Error(`${path}: not detected as ${kind}`);
    const r = await (importer as (c: AsyncIterable<string>, o: object) => Promise<{ ok: boolean; data?: T }>)(readTextChunks(path), {
      fileName: name,
      mapping: d.mapping,
      bytesTotal: (await stat(path)).size,
    });
    if (!r.ok || !r.data) throw new Error(`${path}: import failed`);
    return { data: r.data, mapping: d.mapping, path };
  };
  return {
    tracking: await load<TrackingData>(trackingName, 'tracking', importTracking),
    events: await load<EventLog>(eventsName, 'events', importEvents),
  };
}

export type LoadedSources = Awaited<ReturnType<typeof loadSources>>;

export async function buildProject(db: WhistlemarkDb, src: LoadedSources, title = 'Ferncastle Lanterns v Dunmere Tide'): Promise<number> {
  const user = 'analyst';
  const projectId = await createProject(db, title, user);
  const fileInfo = async (path: string) => {
    const s = await stat(path);
    return { fileName: basename(path), path, size: s.size, mtimeMs: s.mtimeMs };
  };
  const trkId = await storeSource(db, {
    projectId, user, file: await fileInfo(src.tracking.path), payload: { kind: 'tracking', data: src.tracking.data },
    summary: summariseTracking(src.tracking.data), warnings: [], mapping: src.tracking.mapping,
  });
  const evtId = await storeSource(db, {
    projectId, user, file: await fileInfo(src.events.path), payload: { kind: 'events', data: src.events.data },
    summary: summariseEvents(src.events.data), warnings: [], mapping: src.events.mapping,
  });
  const footageId = (await db.sources.add({
    projectId, kind: 'footage', fileName: 'footage.mp4', path: DEMO + 'footage.mp4', size: 1, mtimeMs: 0,
    summary: { duration: 480, periods: [] }, warnings: [], importedAt: 0,
  })) as number;
  const sync = syncMatch(src.tracking.data, src.events.data);
  await commit(db, {
    projectId, user, subject: 'anchor', what: 'detected anchors',
    changes: [
      ...sync.trackingAnchors.map((a) => ({ table: 'anchors' as const, after: { projectId, sourceId: trkId, anchor: a, origin: 'detected' } })),
      ...sync.eventAnchors.map((a) => ({ table: 'anchors' as const, after: { projectId, sourceId: evtId, anchor: a, origin: 'detected' } })),
    ],
  });
  await commit(db, { projectId, user, subject: 'fit', what: 'events clock fit', changes: [{ table: 'clockFits', after: { projectId, sourceId: evtId, fit: sync.fit, createdAt: 1 } }] });
  const corrIds = await commit(db, {
    projectId, user, subject: 'correction', what: 'proposed corrections',
    changes: sync.corrections.map((c) => ({ table: 'corrections' as const, after: { projectId, sourceId: evtId, eventId: c.eventId, status: 'proposed', proposal: c, updatedAt: 1 } })),
  });
  const corr = await db.corrections.bulkGet(corrIds);
  for (const c of corr.slice(0, 5)) await commit(db, { projectId, user, subject: 'correction', what: `accept ${c!.eventId}`, changes: [{ table: 'corrections', key: c!.id, after: { ...c, status: 'accepted' } }] });
  await commit(db, { projectId, user, subject: 'correction', what: 'reject', changes: [{ table: 'corrections', key: corr[6]!.id, after: { ...corr[6], status: 'rejected' } }] });
  await commit(db, { projectId, user, subject: 'correction', what: 'edit', changes: [{ table: 'corrections', key: corr[7]!.id, after: { ...corr[7], status: 'edited', edited: { period: 1, t: 12.34 } } }] });
  const ev = await db.events.where('sourceId').equals(evtId).first();
  await commit(db, { projectId, user, subject: 'event', what: 'move event', changes: [{ table: 'events', key: ev!.id, after: { ...ev, current: { ...ev!.current, t: ev!.current.t + 0.4 } } }] });
  await commit(db, { projectId, user, subject: 'nonLive', what: 'replay', changes: [{ table: 'nonLive', after: { projectId, footageSourceId: footageId, fromT: 100, toT: 112.5, kind: 'replay', status: 'confirmed' } }] });
  const [reelId] = await commit(db, { projectId, user, subject: 'reel', what: 'new reel', changes: [{ table: 'reels', after: { projectId, title: 'Pressing', createdAt: 2 } }] });
  await commit(db, { projectId, user, subject: 'clip', what: 'clips', changes: [1, 2].map((i) => ({ table: 'clips' as const, after: { projectId, reelId, order: i, period: 1, from: i * 10, to: i * 10 + 8 } })) });
  await commit(db, { projectId, user, subject: 'registration', what: 'register pitch', changes: [{ table: 'pitchRegistrations', after: { projectId, footageSourceId: footageId, data: { keyframes: [{ t: 0, h: [1, 0, 0, 0, 1, 0, 0, 0, 1] }] }, updatedAt: 3 } }] });
  // A deleted clip and an undone step: the history must survive the file too.
  const clip = await db.clips.where('reelId').equals(reelId).first();
  await commit(db, { projectId, user, subject: 'clip', what: 'delete clip', changes: [{ table: 'clips', key: clip!.id }] });
  await commit(db, { projectId, user, subject: 'correction', what: 'accept one more', changes: [{ table: 'corrections', key: corr[8]!.id, after: { ...corr[8], status: 'accepted' } }] });
  await undo(db, projectId, user);
  return projectId;
}
