/**
 * Writes and reads of whole sources. An import is stored in ONE transaction at the end,
 * so a crash or reload in the middle leaves the last committed state as it was.
 */
import type { EventLog, FootageProbe, ImportProblem, SourceMapping, TrackingData, TrackingPeriod } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from './database.ts';
import type { EventRow, SourceRow, SourceSummary } from './rows.ts';
import { splitTracking } from './tracking-blocks.ts';
import { joinPeriod } from './tracking-blocks.ts';

export interface SourceFileInfo {
  fileName: string;
  path: string;
  size: number;
  mtimeMs: number;
}

export type ImportedPayload =
  | { kind: 'tracking'; data: TrackingData }
  | { kind: 'events'; data: EventLog }
  | { kind: 'footage'; probe: FootageProbe };

export interface StoreSourceRequest {
  projectId: number;
  file: SourceFileInfo;
  payload: ImportedPayload;
  summary: SourceSummary;
  warnings: ImportProblem[];
  mapping?: SourceMapping;
  detected?: SourceRow['detected'];
  headerSignature?: string;
  /** Remember this mapping for files with the same header signature. */
  rememberMapping?: boolean;
  user: string;
  blockSeconds?: number;
}

const IMPORT_TABLES = ['projects', 'sources', 'trackingMeta', 'trackingBlocks', 'eventLogs', 'events', 'footage', 'audit', 'mappings'] as const;

/** Store one imported source with everything it brings; returns the new source id. */
export async function storeSource(db: WhistlemarkDb, req: StoreSourceRequest): Promise<number> {
  return db.transaction('rw', IMPORT_TABLES.map((t) => db.table(t)), async () => {
    const project = await db.projects.get(req.projectId);
    if (!project) throw new Error(`Match project ${req.projectId} no longer exists; the import was not stored.`);
    const now = Date.now();
    const row: SourceRow = {
      projectId: req.projectId,
      kind: req.payload.kind,
      fileName: req.file.fileName,
      path: req.file.path,
      size: req.file.size,
      mtimeMs: req.file.mtimeMs,
      summary: req.summary,
      warnings: req.warnings,
      importedAt: now,
      ...(req.mapping ? { mapping: req.mapping } : {}),
      ...(req.detected ? { detected: req.detected } : {}),
      ...(req.headerSignature ? { headerSignature: req.headerSignature } : {}),
    };
    const sourceId = (await db.sources.add(row)) as number;
    const p = req.payload;
    if (p.kind === 'tracking') {
      const { meta, blocks } = splitTracking(sourceId, p.data, req.blockSeconds);
      await db.trackingMeta.add(meta);
      await db.trackingBlocks.bulkAdd(blocks);
    } else if (p.kind === 'events') {
      await db.eventLogs.add({ sourceId, pitch: p.data.pitch, teams: p.data.teams, columns: p.data.columns });
      const rows: EventRow[] = p.data.events.map((e) => ({
        sourceId,
        projectId: req.projectId,
        eventId: e.id,
        row: e.row,
        period: e.period,
        kind: e.kind,
        logged: e,
        current: structuredClone(e),
      }));
      await db.events.bulkAdd(rows);
    } else {
      await db.footage.add({ sourceId, probe: p.probe });
    }
    if (req.rememberMapping && req.mapping && req.headerSignature && req.mapping.kind !== undefined) {
      await db.mappings.put({
        signature: req.headerSignature,
        kind: req.mapping.kind,
        mapping: req.mapping,
        fileName: req.file.fileName,
        savedAt: now,
      });
    }
    await db.audit.add({
      projectId: req.projectId,
      at: now,
      user: req.user,
      what: `import ${p.kind} ${req.file.fileName}`,
      after: { sourceId, summary: req.summary, warnings: req.warnings.length },
    });
    await db.projects.update(req.projectId, { updatedAt: now });
    return sourceId;
  });
}

/** Delete one source and everything derived from it, in one transaction. */
export async function deleteSource(db: WhistlemarkDb, sourceId: number, user: string): Promise<void> {
  const tables = ['sources', 'trackingMeta', 'trackingBlocks', 'eventLogs', 'events', 'footage', 'anchors', 'clockFits', 'corrections', 'audit', 'pitchRegistrations', 'nonLive'];
  await db.transaction('rw', tables.map((t) => db.table(t)), async () => {
    const src = await db.sources.get(sourceId);
    if (!src) return;
    await db.trackingBlocks.where('sourceId').equals(sourceId).delete();
    await db.trackingMeta.delete(sourceId);
    await db.events.where('sourceId').equals(sourceId).delete();
    await db.eventLogs.delete(sourceId);
    await db.footage.delete(sourceId);
    await db.anchors.where('sourceId').equals(sourceId).delete();
    await db.clockFits.where('sourceId').equals(sourceId).delete();
    await db.corrections.where('sourceId').equals(sourceId).delete();
    await db.pitchRegistrations.where('footageSourceId').equals(sourceId).delete();
    await db.nonLive.where('footageSourceId').equals(sourceId).delete();
    await db.sources.delete(sourceId);
    await db.audit.add({ projectId: src.projectId, at: Date.now(), user, what: `delete ${src.kind} ${src.fileName}`, before: { sourceId, summary: src.summary } });
  });
}

/** Delete a project with all its sources and derived rows, in one transaction. */
export async function deleteProject(db: WhistlemarkDb, projectId: number): Promise<void> {
  await db.transaction('rw', db.tables, async () => {
    const sourceIds = (await db.sources.where('projectId').equals(projectId).primaryKeys()) as number[];
    for (const id of sourceIds) {
      await db.trackingBlocks.where('sourceId').equals(id).delete();
      await db.trackingMeta.delete(id);
      await db.eventLogs.delete(id);
      await db.footage.delete(id);
    }
    for (const t of ['sources', 'events', 'anchors', 'clockFits', 'corrections', 'audit', 'pitchRegistrations', 'reels', 'clips', 'nonLive', 'exportJobs']) {
      await db.table(t).where('projectId').equals(projectId).delete();
    }
    await db.projects.delete(projectId);
  });
}

export async function createProject(db: WhistlemarkDb, title: string, user: string, demo = false): Promise<number> {
  const clean = title.trim();
  if (!clean) throw new Error('A match project needs a title.');
  return db.transaction('rw', db.projects, db.audit, async () => {
    const now = Date.now();
    const id = (await db.projects.add({ title: clean, createdAt: now, updatedAt: now, ...(demo ? { demo: true } : {}) })) as number;
    await db.audit.add({ projectId: id, at: now, user, what: `create project "${clean}"` });
    return id;
  });
}

/** Load one tracking period of a source, reassembled from its blocks. */
export async function loadTrackingPeriod(db: WhistlemarkDb, sourceId: number, period: number): Promise<TrackingPeriod> {
  return db.transaction('r', db.trackingMeta, db.trackingBlocks, async () => {
    const meta = await db.trackingMeta.get(sourceId);
    if (!meta) throw new Error(`Source ${sourceId} has no tracking in the database.`);
    const pm = meta.periods.find((p) => p.period === period);
    if (!pm) throw new Error(`Tracking source ${sourceId} has no period ${period}.`);
    const blocks = await db.trackingBlocks
      .where('[sourceId+period+block]')
      .between([sourceId, period, 0], [sourceId, period, Infinity])
      .toArray();
    return joinPeriod(meta, pm, blocks);
  });
}

/** Load a whole tracking source. */
export async function loadTracking(db: WhistlemarkDb, sourceId: number): Promise<TrackingData> {
  const meta = await db.trackingMeta.get(sourceId);
  if (!meta) throw new Error(`Source ${sourceId} has no tracking in the database.`);
  const periods: TrackingPeriod[] = [];
  for (const pm of meta.periods) periods.push(await loadTrackingPeriod(db, sourceId, pm.period));
  return { rate: meta.rate, pitch: meta.pitch, objects: meta.objects, ballIndex: meta.ballIndex, periods };
}
