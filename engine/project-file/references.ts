/**
 * Which fields of which table are row ids or point at rows, so a project's ids can be
 * renumbered as a whole: dense (1..n) when saved, shifted past the ids already in use when
 * opened. Audit entries carry row changes (the undo history) whose keys and rows are
 * renumbered the same way, so undo keeps working in the opened project.
 *
 *   renumber(tables, (table, id) => id + 100) // every id and reference moved by 100
 */
import type { ProjectTable, ProjectTables } from './format.ts';

type Row = Record<string, unknown>;

/** The table that owns each table's primary key ('id', or the source it belongs to). */
const KEY: Record<ProjectTable, { field: string; table: ProjectTable }> = {
  projects: { field: 'id', table: 'projects' },
  sources: { field: 'id', table: 'sources' },
  trackingMeta: { field: 'sourceId', table: 'sources' },
  trackingBlocks: { field: 'id', table: 'trackingBlocks' },
  eventLogs: { field: 'sourceId', table: 'sources' },
  events: { field: 'id', table: 'events' },
  footage: { field: 'sourceId', table: 'sources' },
  anchors: { field: 'id', table: 'anchors' },
  clockFits: { field: 'id', table: 'clockFits' },
  corrections: { field: 'id', table: 'corrections' },
  nonLive: { field: 'id', table: 'nonLive' },
  pitchRegistrations: { field: 'id', table: 'pitchRegistrations' },
  reels: { field: 'id', table: 'reels' },
  clips: { field: 'id', table: 'clips' },
  audit: { field: 'id', table: 'audit' },
};

/** Other fields that hold a row id, and the table it belongs to. */
const REFS: Partial<Record<ProjectTable, Record<string, ProjectTable>>> = {
  sources: { projectId: 'projects' },
  trackingBlocks: { sourceId: 'sources' },
  events: { projectId: 'projects', sourceId: 'sources' },
  anchors: { projectId: 'projects', sourceId: 'sources', pairedWith: 'anchors' },
  clockFits: { projectId: 'projects', sourceId: 'sources' },
  corrections: { projectId: 'projects', sourceId: 'sources' },
  nonLive: { projectId: 'projects', footageSourceId: 'sources' },
  pitchRegistrations: { projectId: 'projects', footageSourceId: 'sources' },
  reels: { projectId: 'projects' },
  clips: { projectId: 'projects', reelId: 'reels' },
  audit: { projectId: 'projects' },
};

export type IdMap = (table: ProjectTable, id: number) => number;

function isRow(v: unknown): v is Row {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && !ArrayBuffer.isView(v);
}

/** Calls `visit(table, id)` for every id and reference in the tables (audit history included). */
export function visitIds(tables: ProjectTables, visit: (table: ProjectTable, id: number) => void): void {
  const visitRow = (table: ProjectTable, row: Row) => {
    const key = KEY[table];
    if (typeof row[key.field] === 'number') visit(key.table, row[key.field] as number);
    for (const [field, target] of Object.entries(REFS[table] ?? {})) if (typeof row[field] === 'number') visit(target, row[field] as number);
  };
  for (const table of Object.keys(tables) as ProjectTable[]) {
    for (const row of tables[table]) {
      visitRow(table, row);
      if (table !== 'audit') continue;
      for (const side of ['before', 'after'] as const) {
        const v = row[side];
        if (isRow(v) && typeof v.sourceId === 'number') visit('sources', v.sourceId);
      }
      for (const c of (row.changes as Row[] | undefined) ?? []) {
        const t = c.table as ProjectTable;
        if (!(t in KEY)) continue;
        if (typeof c.key === 'number') visit(KEY[t].table, c.key);
        for (const side of ['before', 'after'] as const) if (isRow(c[side])) visitRow(t, c[side] as Row);
      }
    }
  }
}

/** A copy of the tables with every id and reference passed through `map`. */
export function renumber(tables: ProjectTables, map: IdMap): ProjectTables {
  const mapRow = (table: ProjectTable, row: Row): Row => {
    const out: Row = { ...row };
    const key = KEY[table];
    if (typeof out[key.field] === 'number') out[key.field] = map(key.table, out[key.field] as number);
    for (const [field, target] of Object.entries(REFS[table] ?? {})) if (typeof out[field] === 'number') out[field] = map(target, out[field] as number);
    if (table === 'audit') {
      for (const side of ['before', 'after'] as const) {
        const v = out[side];
        if (isRow(v) && typeof v.sourceId === 'number') out[side] = { ...v, sourceId: map('sources', v.sourceId) };
      }
      if (Array.isArray(out.changes))
        out.changes = (out.changes as Row[]).map((c) => {
          const t = c.table as ProjectTable;
          if (!(t in KEY)) return c;
          const nc: Row = { ...c };
          if (typeof c.key === 'number') nc.key = map(KEY[t].table, c.key);
          for (const side of ['before', 'after'] as const) if (isRow(c[side])) nc[side] = mapRow(t, c[side] as Row);
          return nc;
        });
    }
    return out;
  };
  const out = {} as ProjectTables;
  for (const table of Object.keys(tables) as ProjectTable[]) out[table] = tables[table].map((r) => mapRow(table, r));
  return out;
}

/** Dense ids 1..n per table, in the order of the original ids (relative order is kept). */
export function denseIdMap(tables: ProjectTables): IdMap {
  const seen = new Map<ProjectTable, Set<number>>();
  visitIds(tables, (t, id) => {
    let s = seen.get(t);
    if (!s) seen.set(t, (s = new Set()));
    s.add(id);
  });
  const maps = new Map<ProjectTable, Map<number, number>>();
  for (const [t, ids] of seen) maps.set(t, new Map([...ids].sort((a, b) => a - b).map((id, i) => [id, i + 1])));
  return (t, id) => maps.get(t)!.get(id)!;
}

/** The largest id each table uses (0 when none), audit history included. */
export function largestIds(tables: ProjectTables): Map<ProjectTable, number> {
  const max = new Map<ProjectTable, number>();
  visitIds(tables, (t, id) => max.set(t, Math.max(max.get(t) ?? 0, id)));
  return max;
}

/** Where each table's primary key lives, for the reader's checks. */
export function keyOf(table: ProjectTable) {
  return KEY[table];
}
export function refsOf(table: ProjectTable): Record<string, ProjectTable> {
  return REFS[table] ?? {};
}
