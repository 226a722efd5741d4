import 'fake-indexeddb/auto';
import Dexie from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import { SCHEMA_V1, WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { createProject, deleteProject, deleteSource, loadTracking, loadTrackingPeriod, storeSource } from '../../../renderer/src/db/store.ts';
import { framesPerBlock } from '../../../renderer/src/db/tracking-blocks.ts';
import type { EventLog, TrackingData } from '../../../shared-types/index.ts';
import { DEFAULT_PITCH } from '../../../shared-types/index.ts';

// fake-indexeddb implements the W3C IndexedDB API in Node; it stands in for the browser's
// database here (the e2e suite covers real Chromium IndexedDB).
let dbCount = 0;
const opened: Dexie[] = [];
function freshName() {
  return `wm-test-${process.pid}-${dbCount++}`;
}
afterEach(async () => {
  for (const d of opened.splice(0)) {
    d.close();
    await Dexie.delete(d.name);
  }
});
function openDb(name = freshName()) {
  const db = new WhistlemarkDb(name);
  opened.push(db);
  return db;
}

/** Two periods of invented tracking: 3 objects, position = a function of frame and object. */
function makeTracking(rate: number, frames: number[]): TrackingData {
  const objects = [
    { id: 'h1', role: 'player' as const, team: 'home' as const },
    { id: 'a1', role: 'player' as const, team: 'away' as const },
    { id: 'ball', role: 'ball' as const },
  ];
  const n = objects.length;
  return {
    rate,
    pitch: DEFAULT_PITCH,
    objects,
    ballIndex: 2,
    periods: frames.map((count, i) => {
      const x = new Float32Array(count * n);
      const y = new Float32Array(count * n);
      const present = new Uint8Array(count).fill(1);
      for (let f = 0; f < count; f++)
        for (let o = 0; o < n; o++) {
          x[f * n + o] = (f % 100) * 0.5 - o;
          y[f * n + o] = o * 3 - (f % 7);
        }
      present[5] = 0;
      x.fill(NaN, 5 * n, 6 * n);
      return { period: i + 1, firstFrame: i * 100000, frameCount: count, present, x, y, homeAttacks: i === 0 ? 'positive_x' : 'negative_x' };
    }),
  };
}

const file = { fileName: 'tracking.csv', path: '/tmp/tracking.csv', size: 1234, mtimeMs: 1 };

describe('project database', () => {
  it('stores tracking in blocks and loads a period back bit for bit', async () => {
    const db = openDb();
    const projectId = await createProject(db, 'Evening match', 'analyst');
    const data = makeTracking(25, [25 * 130 + 7, 25 * 61]);
    const summary = { duration: 0, periods: [] };
    const sourceId = await storeSource(db, { projectId, file, payload: { kind: 'tracking', data }, summary, warnings: [], user: 'analyst' });
    // 60 s blocks at 25 Hz = 1500 frames; 3257 frames -> 3 blocks, 1525 -> 2 blocks.
    expect(framesPerBlock(25)).toBe(1500);
    expect(await db.trackingBlocks.where('sourceId').equals(sourceId).count()).toBe(5);
    const p1 = await loadTrackingPeriod(db, sourceId, 1);
    expect(p1.frameCount).toBe(data.periods[0].frameCount);
    expect(p1.x).toBeInstanceOf(Float32Array);
    expect(Array.from(p1.x)).toEqual(Array.from(data.periods[0].x));
    expect(Array.from(p1.y)).toEqual(Array.from(data.periods[0].y));
    expect(Array.from(p1.present)).toEqual(Array.from(data.periods[0].present));
    const all = await loadTracking(db, sourceId);
    expect(all.periods.map((p) => p.homeAttacks)).toEqual(['positive_x', 'negative_x']);
    expect(all.periods[1].firstFrame).toBe(100000);
  });

  it('stores events with a logged and a current copy, and an audit row', async () => {
    const db = openDb();
    const projectId = await createProject(db, 'Evening match', 'analyst');
    const log: EventLog = {
      pitch: DEFAULT_PITCH,
      teams: { home: 'Harbour Town', away: 'Moor Rovers' },
      columns: ['period', 'time', 'type'],
      events: [1, 2, 3].map((r) => ({ id: `e${r}`, row: r, period: 1, t: r * 10, kind: 'pass', rawKind: 'Pass', raw: { type: 'Pass' } })),
    };
    const sourceId = await storeSource(db, { projectId, file: { ...file, fileName: 'events.csv' }, payload: { kind: 'events', data: log }, summary: { duration: 20, periods: [] }, warnings: [], user: 'analyst' });
    const rows = await db.events.where('sourceId').equals(sourceId).sortBy('row');
    expect(rows.map((r) => r.current.t)).toEqual([10, 20, 30]);
    expect(rows[0].current).not.toBe(rows[0].logged);
    const audit = await db.audit.where('projectId').equals(projectId).toArray();
    expect(audit.map((a) => a.what)).toEqual(['create project "Evening match"', 'import events events.csv']);
    expect(audit[1].user).toBe('analyst');
  });

  it('stores nothing when the import transaction fails part way (all-or-nothing)', async () => {
    const db = openDb();
    const projectId = await createProject(db, 'Evening match', 'analyst');
    const data = makeTracking(25, [3000]);
    // A block with a non-cloneable value makes bulkAdd throw after sources/meta were added.
    (data.periods[0] as unknown as { ballZ: unknown }).ballZ = { slice: () => () => 0 };
    await expect(
      storeSource(db, { projectId, file, payload: { kind: 'tracking', data }, summary: { duration: 0, periods: [] }, warnings: [], user: 'a' }),
    ).rejects.toThrow();
    expect(await db.sources.count()).toBe(0);
    expect(await db.trackingMeta.count()).toBe(0);
    expect(await db.trackingBlocks.count()).toBe(0);
    expect(await db.audit.filter((a) => a.what.startsWith('import')).count()).toBe(0);
  });

  it('refuses to store into a project that does not exist', async () => {
    const db = openDb();
    await expect(
      storeSource(db, { projectId: 99, file, payload: { kind: 'tracking', data: makeTracking(25, [10]) }, summary: { duration: 0, periods: [] }, warnings: [], user: 'a' }),
    ).rejects.toThrow(/no longer exists/);
    expect(await db.sources.count()).toBe(0);
  });

  it('deletes a source and a project with everything that hangs on them', async () => {
    const db = openDb();
    const projectId = await createProject(db, 'Evening match', 'analyst');
    const other = await createProject(db, 'Other match', 'analyst');
    const s1 = await storeSource(db, { projectId, file, payload: { kind: 'tracking', data: makeTracking(25, [2000]) }, summary: { duration: 0, periods: [] }, warnings: [], user: 'a' });
    await storeSource(db, { projectId: other, file, payload: { kind: 'tracking', data: makeTracking(25, [100]) }, summary: { duration: 0, periods: [] }, warnings: [], user: 'a' });
    await deleteSource(db, s1, 'a');
    expect(await db.trackingBlocks.where('sourceId').equals(s1).count()).toBe(0);
    expect(await db.sources.count()).toBe(1);
    await deleteProject(db, other);
    expect(await db.projects.count()).toBe(1);
    expect(await db.sources.count()).toBe(0);
    expect(await db.trackingBlocks.count()).toBe(0);
  });

  it('rejects an empty project title', async () => {
    const db = openDb();
    await expect(createProject(db, '   ', 'a')).rejects.toThrow(/title/);
  });
});

describe('schema migrations', () => {
  it('upgrades a version-1 database: events gain their corrected copy', async () => {
    const name = freshName();
    // Write a database exactly as the first release did.
    const v1 = new Dexie(name);
    v1.version(1).stores(SCHEMA_V1);
    await v1.table('projects').add({ title: 'Old match', createdAt: 1, updatedAt: 1 });
    const logged = { id: 'e1', row: 1, period: 1, t: 12.5, kind: 'goal_kick', rawKind: 'GK', raw: {} };
    await v1.table('events').add({ sourceId: 1, projectId: 1, eventId: 'e1', row: 1, period: 1, kind: 'goal_kick', logged });
    v1.close();

    const db = openDb(name);
    await db.open();
    expect(db.verno).toBe(3);
    const [row] = await db.events.toArray();
    expect(row.current).toEqual(logged);
    expect(await db.events.where('[projectId+kind]').equals([1, 'goal_kick']).count()).toBe(1);
    expect((await db.projects.toArray())[0].title).toBe('Old match');
  });
});
