import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import type { ExportJobRow } from '../../../renderer/src/db/rows.ts';
import { clipsLeft, resumeAfterRestart } from '../../../renderer/src/reels/export-queue.ts';
import type { HostApi } from '../../../shared-types/index.ts';

// The page's start-up side of the export queue, on a real Dexie database (fake-indexeddb).
// pixi.js needs a browser to load; these jobs fail before any frame is drawn.
vi.mock('../../../renderer/src/overlay/renderer.ts', () => ({ createOverlayRenderer: () => Promise.reject(new Error('no overlay renderer in this test')) }));
const dbs: WhistlemarkDb[] = [];
afterEach(async () => {
  for (const db of dbs.splice(0)) await db.delete();
});
function freshDb() {
  const db = new WhistlemarkDb(`wm-export-queue-${dbs.length}-${Date.now()}`);
  dbs.push(db);
  return db;
}
// The jobs below name a reel that does not exist, so the runner fails them before it would
// need the host: the host is never called.
const host = new Proxy({}, { get: (_t, k) => () => Promise.reject(new Error(`host.${String(k)} was not expected`)) }) as HostApi;

function job(projectId: number, patch: Partial<ExportJobRow> = {}): ExportJobRow {
  return { projectId, reelId: 999, clipIds: [1, 2, 3], state: 'running', directory: '/out', path: 'embedded', progress: 0.3, outputs: ['r-01-a.mp4', 'r-01-a.vtt'], createdAt: 1, updatedAt: 1, ...patch };
}

async function settled(db: WhistlemarkDb, id: number): Promise<ExportJobRow> {
  for (let i = 0; i < 200; i++) {
    const j = (await db.exportJobs.get(id))!;
    if (j.state === 'failed' || j.state === 'done' || j.state === 'cancelled') return j;
    await new Promise((r) => setTimeout(r, 5));
  }
  throw new Error(`job ${id} never finished`);
}

describe('resumeAfterRestart', () => {
  it('queues and runs a job cut off by a restart, and says so, only on the first call of the page', async () => {
    const db = freshDb();
    const said: string[] = [];
    const cut = (await db.exportJobs.add(job(41))) as number;
    await resumeAfterRestart(db, host, 41, (m) => said.push(m));
    expect(said).toEqual(['An export cut off by the restart resumes with its next clip (see Reels).']);
    // It went back to the queue and the runner took it (and failed it: its reel is gone).
    const after = await settled(db, cut);
    expect(after.state).toBe('failed');
    expect(after.message).toMatch(/reel 999 no longer exists/);
    expect(after.outputs).toEqual(['r-01-a.mp4', 'r-01-a.vtt']);

    // Later in the same page a 'running' job is one running now: left alone, nothing said.
    const now = (await db.exportJobs.add(job(41, { createdAt: 2 }))) as number;
    await resumeAfterRestart(db, host, 41, (m) => said.push(m));
    await new Promise((r) => setTimeout(r, 20));
    expect((await db.exportJobs.get(now))!.state).toBe('running');
    expect(said).toHaveLength(1);
  });

  it('leaves other projects\' jobs alone and counts several', async () => {
    const db = freshDb();
    const said: string[] = [];
    await db.exportJobs.bulkAdd([job(42), job(42, { createdAt: 2 }), job(43)]);
    await resumeAfterRestart(db, host, 42, (m) => said.push(m));
    expect(said).toEqual(['2 exports cut off by the restart resume with their next clips (see Reels).']);
    expect((await db.exportJobs.where('projectId').equals(43).first())!.state).toBe('running');
  });
});

describe('clipsLeft', () => {
  it('counts the clips whose MP4 is written', () => {
    expect(clipsLeft(job(1))).toEqual({ left: 2, total: 3 });
    expect(clipsLeft(job(1, { outputs: [] }))).toEqual({ left: 3, total: 3 });
    expect(clipsLeft(job(1, { outputs: ['a.mp4', 'a.vtt', 'b.mp4', 'b.vtt', 'c.mp4', 'c.vtt', 'r.csv'] }))).toEqual({ left: 0, total: 3 });
  });
});
