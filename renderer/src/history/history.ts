/**
 * The undo history of a match project, kept in the audit trail itself so it survives a
 * restart and works across screens.
 *
 * Every analyst change goes through `commit()`: it writes the rows and one audit entry
 * carrying each row's before and after, in one transaction. `undo()` puts the befores
 * back, `redo()` the afters. A new change after an undo drops what could be redone, as
 * in any editor. Undo refuses (and says why) when a row was changed since by something
 * that did not go through the history, instead of overwriting it.
 *
 *   await commit(db, { projectId, user, subject: 'correction', what: 'accept correction e12',
 *     changes: [{ table: 'corrections', key: 7, after: { ...row, status: 'accepted' } }] });
 *   await undo(db, projectId, user);   // -> { what: 'accept correction e12' }
 */
import type { AuditRow, AuditSubject, HistoryTable, RowChange } from '../db/rows.ts';
import type { WhistlemarkDb } from '../db/database.ts';

export interface ChangeInput {
  table: HistoryTable;
  /** Absent for a new row: the key is given by the database and recorded. */
  key?: number;
  /** The row as it should be afterwards; absent deletes the row. */
  after?: unknown;
}

export interface CommitRequest {
  projectId: number;
  user: string;
  subject: AuditSubject;
  what: string;
  changes: ChangeInput[];
}

export interface HistoryStep {
  auditId: number;
  what: string;
  subject?: AuditSubject;
}

export class HistoryConflictError extends Error {}

const HISTORY_TABLES: HistoryTable[] = ['events', 'corrections', 'anchors', 'clockFits', 'nonLive', 'pitchRegistrations', 'reels', 'clips'];

function tablesOf(db: WhistlemarkDb) {
  return [...HISTORY_TABLES.map((t) => db.table(t)), db.audit, db.projects];
}

let lastStamp = 0;
/**
 * Strictly increasing ms stamps, so two changes in one millisecond keep their order; and
 * past the newest stamp stored, so the order holds after a restart, and in a project
 * opened from a file written on a machine whose clock ran ahead.
 */
async function nextStamp(db: WhistlemarkDb, projectId: number): Promise<number> {
  const newest = await db.audit.where('[projectId+stamp]').between([projectId, -Infinity], [projectId, Infinity]).last();
  lastStamp = Math.max(Date.now(), lastStamp + 1, (newest?.stamp ?? 0) + 1);
  return lastStamp;
}

/** Writes the changes and records them as one undoable step. Returns the keys written, in order. */
export async function commit(db: WhistlemarkDb, req: CommitRequest): Promise<number[]> {
  if (!req.changes.length) return [];
  return db.transaction('rw', tablesOf(db), async () => {
    const recorded: RowChange[] = [];
    const keys: number[] = [];
    for (const c of req.changes) {
      const table = db.table(c.table);
      const before = c.key === undefined ? undefined : await table.get(c.key);
      let key = c.key;
      if (c.after === undefined) {
        if (key !== undefined) await table.delete(key);
      } else if (key === undefined) {
        key = (await table.add(stripId(c.after))) as number;
      } else {
        await table.put({ ...(c.after as object), id: key });
      }
      if (key === undefined) continue;
      const after = c.after === undefined ? undefined : await table.get(key);
      recorded.push({ table: c.table, key, before: clone(before), after: clone(after) });
      keys.push(key);
    }
    await dropRedo(db, req.projectId);
    const now = Date.now();
    await db.audit.add({
      projectId: req.projectId,
      at: now,
      user: req.user,
      what: req.what,
      subject: req.subject,
      changes: recorded,
      state: 'done',
      stamp: await nextStamp(db, req.projectId),
    });
    await db.projects.update(req.projectId, { updatedAt: now });
    return keys;
  });
}

/** The step undo would take back, if any. */
export async function nextUndo(db: WhistlemarkDb, projectId: number): Promise<HistoryStep | undefined> {
  const row = await latest(db, projectId, 'done');
  return row && step(row);
}

/** The step redo would do again, if any. */
export async function nextRedo(db: WhistlemarkDb, projectId: number): Promise<HistoryStep | undefined> {
  const row = await latest(db, projectId, 'undone');
  return row && step(row);
}

/** Takes back the latest change; resolves to what was undone, or undefined when there is none. */
export async function undo(db: WhistlemarkDb, projectId: number, user: string): Promise<HistoryStep | undefined> {
  return db.transaction('rw', tablesOf(db), async () => {
    const row = await latest(db, projectId, 'done');
    if (!row) return undefined;
    await apply(db, row, 'back');
    await db.audit.update(row.id!, { state: 'undone', stamp: await nextStamp(db, projectId) });
    await db.audit.add({ projectId, at: Date.now(), user, what: `undo: ${row.what}`, subject: 'undo' });
    return step(row);
  });
}

/** Does the latest undone change again. */
export async function redo(db: WhistlemarkDb, projectId: number, user: string): Promise<HistoryStep | undefined> {
  return db.transaction('rw', tablesOf(db), async () => {
    const row = await latest(db, projectId, 'undone');
    if (!row) return undefined;
    await apply(db, row, 'forward');
    await db.audit.update(row.id!, { state: 'done', stamp: await nextStamp(db, projectId) });
    await db.audit.add({ projectId, at: Date.now(), user, what: `redo: ${row.what}`, subject: 'undo' });
    return step(row);
  });
}

async function latest(db: WhistlemarkDb, projectId: number, state: 'done' | 'undone'): Promise<AuditRow | undefined> {
  // Newest stamp first; entries without changes (imports, undo notes) are not steps.
  let found: AuditRow | undefined;
  await db.audit
    .where('[projectId+stamp]')
    .between([projectId, -Infinity], [projectId, Infinity])
    .reverse()
    .until(() => found !== undefined)
    .each((r) => {
      if (found === undefined && r.changes && r.state === state) found = r;
    });
  // A redo takes the step undone last: undo re-stamps a step, so it is the newest 'undone'.
  return found;
}

async function dropRedo(db: WhistlemarkDb, projectId: number): Promise<void> {
  const undone = await db.audit
    .where('[projectId+stamp]')
    .between([projectId, -Infinity], [projectId, Infinity])
    .filter((r) => r.state === 'undone')
    .primaryKeys();
  for (const id of undone) await db.audit.update(id, { state: 'dropped' });
}

async function apply(db: WhistlemarkDb, row: AuditRow, direction: 'back' | 'forward'): Promise<void> {
  const changes = direction === 'back' ? [...row.changes!].reverse() : row.changes!;
  for (const c of changes) {
    const table = db.table(c.table);
    const expected = direction === 'back' ? c.after : c.before;
    const target = direction === 'back' ? c.before : c.after;
    const now = await table.get(c.key);
    if (!sameValue(now, expected)) {
      throw new HistoryConflictError(
        `Cannot ${direction === 'back' ? 'undo' : 'redo'} “${row.what}”: the ${c.table} row ${c.key} was changed since by something outside the undo history. Nothing was changed.`,
      );
    }
    if (target === undefined) await table.delete(c.key);
    else await table.put(clone(target));
  }
}

function step(row: AuditRow): HistoryStep {
  return { auditId: row.id!, what: row.what, ...(row.subject ? { subject: row.subject } : {}) };
}

function stripId(v: unknown): unknown {
  if (v && typeof v === 'object' && 'id' in v) {
    const { id: _id, ...rest } = v as Record<string, unknown>;
    return rest;
  }
  return v;
}

function clone<T>(v: T): T {
  return v === undefined ? v : structuredClone(v);
}

/** Structural equality of stored rows (plain data and typed arrays). */
export function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (a === undefined || b === undefined || a === null || b === null) return false;
  if (typeof a !== 'object' || typeof b !== 'object') return Number.isNaN(a) && Number.isNaN(b);
  if (ArrayBuffer.isView(a) || ArrayBuffer.isView(b)) {
    if (!ArrayBuffer.isView(a) || !ArrayBuffer.isView(b)) return false;
    const x = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
    const y = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
    return x.length === y.length && x.every((v, i) => v === y[i]);
  }
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  const ka = Object.keys(a as object).filter((k) => (a as Record<string, unknown>)[k] !== undefined);
  const kb = Object.keys(b as object).filter((k) => (b as Record<string, unknown>)[k] !== undefined);
  if (ka.length !== kb.length) return false;
  return ka.every((k) => sameValue((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}
