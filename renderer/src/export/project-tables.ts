/**
 * A match project's rows out of the database, and a project file's rows into it as a NEW
 * project in one transaction (all or nothing). Ids are shifted past those already in use,
 * so an opened project never touches another one's rows; its undo history keeps working.
 *
 *   const tables = await readProjectTables(db, 3);
 *   const id = await addProjectTables(db, tables); // a copy of project 3
 */
import { PROJECT_TABLES, renumber, largestIds, type ProjectTable, type ProjectTables } from '../../../engine/project-file/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';

type Row = Record<string, unknown>;

/** Every row of one project, table by table (tracking and footage through its sources). */
export async function readProjectTables(db: WhistlemarkDb, projectId: number): Promise<ProjectTables> {
  return db.transaction('r', PROJECT_TABLES.map((t) => db.table(t)), async () => {
    const project = await db.projects.get(projectId);
    if (!project) throw new Error(`Match project ${projectId} no longer exists.`);
    const out = {} as ProjectTables;
    out.projects = [project as unknown as Row];
    const sources = await db.sources.where('projectId').equals(projectId).sortBy('id');
    out.sources = sources as unknown as Row[];
    const sourceIds = sources.map((s) => s.id!);
    const bySource = async (table: 'trackingMeta' | 'eventLogs' | 'footage') =>
      ((await db.table(table).bulkGet(sourceIds)) as (Row | undefined)[]).filter((r): r is Row => r !== undefined);
    out.trackingMeta = await bySource('trackingMeta');
    out.eventLogs = await bySource('eventLogs');
    out.footage = await bySource('footage');
    out.trackingBlocks = [];
    for (const id of sourceIds) out.trackingBlocks.push(...((await db.trackingBlocks.where('sourceId').equals(id).sortBy('id')) as unknown as Row[]));
    for (const table of ['events', 'anchors', 'clockFits', 'corrections', 'nonLive', 'pitchRegistrations', 'reels', 'clips', 'audit'] as const)
      out[table] = (await db.table(table).where('projectId').equals(projectId).sortBy('id')) as Row[];
    return out;
  });
}

/** Adds the tables as a new project; resolves to its id. Nothing is written if any row fails. */
export async function addProjectTables(db: WhistlemarkDb, tables: ProjectTables): Promise<number> {
  return db.transaction('rw', PROJECT_TABLES.map((t) => db.table(t)), async () => {
    // Shift every table's ids past the largest key in use (and past any id an existing
    // project's undo history may still put back).
    const offsets = new Map<ProjectTable, number>();
    for (const t of PROJECT_TABLES) {
      const last = (await db.table(t).toCollection().last()) as Row | undefined;
      const key = t === 'trackingMeta' || t === 'eventLogs' || t === 'footage' ? undefined : (last?.id as number | undefined);
      offsets.set(t, key ?? 0);
    }
    const historyMax = largestIds({ ...emptyTables(), audit: (await db.audit.toArray()) as unknown as Row[] });
    for (const [t, max] of historyMax) offsets.set(t, Math.max(offsets.get(t) ?? 0, max));
    const shifted = renumber(tables, (t, id) => id + (offsets.get(t) ?? 0));
    for (const t of PROJECT_TABLES) if (shifted[t].length) await db.table(t).bulkAdd(shifted[t]);
    return shifted.projects[0].id as number;
  });
}

export function emptyTables(): ProjectTables {
  return Object.fromEntries(PROJECT_TABLES.map((t) => [t, []])) as unknown as ProjectTables;
}
