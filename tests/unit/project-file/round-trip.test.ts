import 'fake-indexeddb/auto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { denseIdMap, PROJECT_TABLES, readProjectFile, renumber, writeProjectFile, type ProjectTables } from '../../../engine/project-file/index.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { addProjectTables, readProjectTables } from '../../../renderer/src/export/project-tables.ts';
import { nextUndo, nextRedo, redo, undo } from '../../../renderer/src/history/history.ts';
import { buildProject, loadSources, type LoadedSources } from './demo-project.ts';

// fake-indexeddb (W3C IndexedDB in Node) stands in for Chromium's IndexedDB here; the
// exports e2e test does the same round trip in real Chromium.
let db: WhistlemarkDb;
let src: LoadedSources;
let projectId: number;
beforeAll(async () => {
  db = new WhistlemarkDb(`project-rt-${process.pid}`);
  src = await loadSources();
  // A project before ours, so ids in the database do not start at 1.
  await buildProject(db, src, 'Another match');
  projectId = await buildProject(db, src);
}, 60_000);
afterAll(async () => {
  await db.delete();
});

const canonical = (t: ProjectTables) => renumber(t, denseIdMap(t));

describe('match project file round trip (demo match)', () => {
  it('save -> open as a new project gives identical content, table by table, and the file ids are dense', async () => {
    const before = await readProjectTables(db, projectId);
    expect(before.trackingBlocks.length).toBeGreaterThan(0);
    expect(before.corrections.length).toBe(src.events.data.events.length);
    const bytes = await writeProjectFile(before, { writtenBy: 'test', databaseVersion: db.verno });
    const read = await readProjectFile(bytes, 'demo.wmatch');
    expect(read.manifest.title).toBe('Ferncastle Lanterns v Dunmere Tide');
    expect(read.tables.projects[0].id).toBe(1);
    const opened = await addProjectTables(db, read.tables);
    expect(opened).not.toBe(projectId);
    const after = await readProjectTables(db, opened);
    const a = canonical(before);
    const b = canonical(after);
    for (const t of PROJECT_TABLES) {
      expect(b[t].length, t).toBe(a[t].length);
      expect(b[t], t).toEqual(a[t]);
    }
    // Typed arrays come back as typed arrays, bit for bit.
    expect(after.trackingBlocks[0].x).toBeInstanceOf(Float32Array);
    expect(after.trackingBlocks[0].present).toBeInstanceOf(Uint8Array);
    // NaN standard errors of a fallback segment, if any, and the rest of the fit survive.
    expect(after.clockFits[0].fit).toEqual(before.clockFits[0].fit);
    // The original project is untouched.
    expect(canonical(await readProjectTables(db, projectId))).toEqual(a);
  });

  it('the opened project keeps its own undo history and undoing it leaves the original alone', async () => {
    const bytes = await writeProjectFile(await readProjectTables(db, projectId), { writtenBy: 'test', databaseVersion: db.verno });
    const opened = await addProjectTables(db, (await readProjectFile(bytes)).tables);
    expect((await nextUndo(db, opened))?.what).toBe((await nextUndo(db, projectId))?.what);
    expect((await nextRedo(db, opened))?.what).toBe('accept one more');
    const original = canonical(await readProjectTables(db, projectId));
    await redo(db, opened, 'u');
    await undo(db, opened, 'u'); // 'accept one more' again
    await undo(db, opened, 'u'); // 'delete clip' -> the clip comes back under its new id
    const clips = await db.clips.where('projectId').equals(opened).toArray();
    expect(clips).toHaveLength(2);
    const reel = await db.reels.where('projectId').equals(opened).first();
    expect(clips.every((c) => c.reelId === reel!.id)).toBe(true);
    expect(canonical(await readProjectTables(db, projectId))).toEqual(original);
  });
});
