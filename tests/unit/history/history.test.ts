import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { commit, HistoryConflictError, nextRedo, nextUndo, redo, undo } from '../../../renderer/src/history/history.ts';

let db: WhistlemarkDb;
let n = 0;
beforeEach(async () => {
  db = new WhistlemarkDb(`history-${n++}`);
  await db.projects.add({ id: 1, title: 'p', createdAt: 0, updatedAt: 0 });
});
afterEach(async () => {
  await db.delete();
});

const reel = (title: string) => ({ projectId: 1, title, createdAt: 0 });

describe('undo history', () => {
  it('adds, edits and deletes, then undoes and redoes each in order', async () => {
    const [id] = await commit(db, { projectId: 1, user: 'u', subject: 'reel', what: 'add reel', changes: [{ table: 'reels', after: reel('a') }] });
    await commit(db, { projectId: 1, user: 'u', subject: 'reel', what: 'rename reel', changes: [{ table: 'reels', key: id, after: { ...reel('b') } }] });
    await commit(db, { projectId: 1, user: 'u', subject: 'reel', what: 'delete reel', changes: [{ table: 'reels', key: id }] });
    expect(await db.reels.get(id)).toBeUndefined();
    expect((await nextUndo(db, 1))?.what).toBe('delete reel');
    await undo(db, 1, 'u');
    expect((await db.reels.get(id))?.title).toBe('b');
    await undo(db, 1, 'u');
    expect((await db.reels.get(id))?.title).toBe('a');
    await undo(db, 1, 'u');
    expect(await db.reels.get(id)).toBeUndefined();
    expect(await undo(db, 1, 'u')).toBeUndefined();
    expect((await nextRedo(db, 1))?.what).toBe('add reel');
    await redo(db, 1, 'u');
    await redo(db, 1, 'u');
    expect((await db.reels.get(id))?.title).toBe('b');
    // A new change drops what could still be redone.
    await commit(db, { projectId: 1, user: 'u', subject: 'reel', what: 'rename again', changes: [{ table: 'reels', key: id, after: reel('c') }] });
    expect(await nextRedo(db, 1)).toBeUndefined();
    const audit = await db.audit.toArray();
    expect(audit.filter((a) => a.subject === 'undo').map((a) => a.what)).toEqual(['undo: delete reel', 'undo: rename reel', 'undo: add reel', 'redo: add reel', 'redo: rename reel']);
  });

  it('refuses to undo over a change made outside the history, and changes nothing', async () => {
    const [id] = await commit(db, { projectId: 1, user: 'u', subject: 'reel', what: 'add reel', changes: [{ table: 'reels', after: reel('a') }] });
    await db.reels.update(id, { title: 'outside' });
    await expect(undo(db, 1, 'u')).rejects.toBeInstanceOf(HistoryConflictError);
    expect((await db.reels.get(id))?.title).toBe('outside');
    expect((await nextUndo(db, 1))?.what).toBe('add reel');
  });
});
