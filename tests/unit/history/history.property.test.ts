import 'fake-indexeddb/auto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import type { AuditSubject, HistoryTable } from '../../../renderer/src/db/rows.ts';
import { commit, nextRedo, nextUndo, redo, undo, type ChangeInput } from '../../../renderer/src/history/history.ts';

// Property-based tests with fast-check (npm): any sequence of analyst edits over the
// history tables, undone as many times, gives back the start table by table; redone, the end.

const TABLES: HistoryTable[] = ['events', 'corrections', 'anchors', 'clockFits', 'nonLive', 'pitchRegistrations', 'reels', 'clips'];
const SUBJECT: Record<HistoryTable, AuditSubject> = {
  events: 'event', corrections: 'correction', anchors: 'anchor', clockFits: 'fit', nonLive: 'nonLive', pitchRegistrations: 'registration', reels: 'reel', clips: 'clip',
};

/** One change of one commit: which table, add / edit / delete, which existing row (by index), what value. */
const changeArb = fc.record({
  table: fc.constantFrom(...TABLES),
  op: fc.constantFrom('add', 'edit', 'delete', 'edit'),
  pick: fc.nat(),
  value: fc.oneof(fc.integer(), fc.double({ noNaN: false }), fc.string({ maxLength: 6 }), fc.constant(undefined)),
  arr: fc.option(fc.float32Array({ maxLength: 4 }), { nil: undefined }),
});
const commitArb = fc.array(changeArb, { minLength: 1, maxLength: 4 });

type Snapshot = Record<string, unknown[]>;
async function snapshot(db: WhistlemarkDb): Promise<Snapshot> {
  const out: Snapshot = {};
  for (const t of TABLES) out[t] = await db.table(t).toArray();
  return out;
}

let n = 0;
async function freshDb() {
  const db = new WhistlemarkDb(`history-prop-${process.pid}-${n++}`);
  await db.projects.add({ id: 1, title: 'p', createdAt: 0, updatedAt: 0 });
  // A few rows present from the start (as after an import), not made through the history.
  for (const t of TABLES) await db.table(t).bulkAdd([{ projectId: 1, seed: 1 }, { projectId: 1, seed: 2 }]);
  return db;
}

async function applyCommit(db: WhistlemarkDb, spec: Parameters<Parameters<typeof commitArb.map>[0]>[0], i: number) {
  const changes: ChangeInput[] = [];
  for (const c of spec) {
    const keys = (await db.table(c.table).toCollection().primaryKeys()) as number[];
    const row = { projectId: 1, v: c.value, step: i, ...(c.arr ? { arr: c.arr } : {}) };
    if (c.op === 'add' || keys.length === 0) changes.push({ table: c.table, after: row });
    else if (c.op === 'edit') changes.push({ table: c.table, key: keys[c.pick % keys.length], after: row });
    else changes.push({ table: c.table, key: keys[c.pick % keys.length] });
  }
  await commit(db, { projectId: 1, user: 'u', subject: SUBJECT[spec[0].table], what: `step ${i}`, changes });
}

describe('undo history properties', () => {
  it('N edits then N undos restore the start; N redos restore the end (table by table)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(commitArb, { minLength: 1, maxLength: 8 }), async (commits) => {
        const db = await freshDb();
        try {
          const start = await snapshot(db);
          for (let i = 0; i < commits.length; i++) await applyCommit(db, commits[i], i);
          const end = await snapshot(db);
          for (let i = 0; i < commits.length; i++) expect(await undo(db, 1, 'u')).toBeDefined();
          expect(await nextUndo(db, 1)).toBeUndefined();
          const undone = await snapshot(db);
          for (const t of TABLES) expect(undone[t], t).toEqual(start[t]);
          for (let i = 0; i < commits.length; i++) expect(await redo(db, 1, 'u')).toBeDefined();
          expect(await nextRedo(db, 1)).toBeUndefined();
          const redone = await snapshot(db);
          for (const t of TABLES) expect(redone[t], t).toEqual(end[t]);
        } finally {
          await db.delete();
        }
      }),
      { numRuns: 40 },
    );
  }, 120_000);

  it('any mix of edits, undos and redos matches a stack of states (a new edit drops the redo)', async () => {
    const action = fc.oneof(
      { weight: 3, arbitrary: commitArb.map((c) => ({ kind: 'commit' as const, c })) },
      { weight: 2, arbitrary: fc.constant({ kind: 'undo' as const }) },
      { weight: 1, arbitrary: fc.constant({ kind: 'redo' as const }) },
    );
    await fc.assert(
      fc.asyncProperty(fc.array(action, { minLength: 1, maxLength: 14 }), async (actions) => {
        const db = await freshDb();
        try {
          const states = [await snapshot(db)];
          let at = 0;
          for (let i = 0; i < actions.length; i++) {
            const a = actions[i];
            if (a.kind === 'commit') {
              await applyCommit(db, a.c, i);
              states.splice(at + 1, Infinity, await snapshot(db));
              at++;
            } else if (a.kind === 'undo') {
              const step = await undo(db, 1, 'u');
              expect(step !== undefined).toBe(at > 0);
              if (at > 0) at--;
            } else {
              const step = await redo(db, 1, 'u');
              expect(step !== undefined).toBe(at < states.length - 1);
              if (at < states.length - 1) at++;
            }
            expect(await snapshot(db)).toEqual(states[at]);
          }
        } finally {
          await db.delete();
        }
      }),
      { numRuns: 30 },
    );
  }, 120_000);

  it('every change kind leaves an audit entry with what, before, after, when and who', async () => {
    const db = await freshDb();
    try {
      for (const t of TABLES) {
        const [key] = await commit(db, { projectId: 1, user: 'ana', subject: SUBJECT[t], what: `add ${t}`, changes: [{ table: t, after: { projectId: 1, v: 1 } }] });
        await commit(db, { projectId: 1, user: 'ana', subject: SUBJECT[t], what: `edit ${t}`, changes: [{ table: t, key, after: { projectId: 1, v: 2 } }] });
        await commit(db, { projectId: 1, user: 'ana', subject: SUBJECT[t], what: `delete ${t}`, changes: [{ table: t, key }] });
      }
      const audit = await db.audit.toArray();
      for (const t of TABLES) {
        const entries = audit.filter((a) => a.subject === SUBJECT[t]);
        expect(entries.map((e) => e.what)).toEqual([`add ${t}`, `edit ${t}`, `delete ${t}`]);
        const [add, edit, del] = entries;
        expect(add.changes![0]).toMatchObject({ table: t, before: undefined, after: { v: 1 } });
        expect(edit.changes![0]).toMatchObject({ table: t, before: { v: 1 }, after: { v: 2 } });
        expect(del.changes![0]).toMatchObject({ table: t, before: { v: 2 }, after: undefined });
        for (const e of entries) expect(e).toMatchObject({ user: 'ana', projectId: 1, state: 'done' });
        expect(entries.every((e) => typeof e.at === 'number' && e.at > 0)).toBe(true);
      }
    } finally {
      await db.delete();
    }
  });

  it('undo order survives a restart (a new module instance continues the stamps of the stored history)', async () => {
    const db = await freshDb();
    try {
      // Stamps far in the future, as written by a machine whose clock ran ahead.
      await db.audit.add({ projectId: 1, at: 1, user: 'u', what: 'future step', subject: 'reel', state: 'done', stamp: Date.now() + 86_400_000, changes: [] });
      await commit(db, { projectId: 1, user: 'u', subject: 'reel', what: 'now step', changes: [{ table: 'reels', after: { projectId: 1, title: 'x' } }] });
      expect((await nextUndo(db, 1))?.what).toBe('now step');
    } finally {
      await db.delete();
    }
  });
});
