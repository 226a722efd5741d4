/**
 * Browser half of tests/e2e/candidates.e2e.test.ts: the app's own scanFootage() on the
 * demo footage, with the app's database (real IndexedDB), host client and worker, served
 * by the browser host next to the built app. Exposes a few calls for the test to drive.
 */
import { getDb } from '../../../renderer/src/db/database.ts';
import { getHost } from '../../../renderer/src/host/index.ts';
import { importFootage } from '../../../renderer/src/import/footage.ts';
import { undo } from '../../../renderer/src/history/history.ts';
import { createElement } from 'react';
import { createRoot } from 'react-dom/client';
import { confirmNonLive, FindCandidates, rejectNonLive, scanFootage, type ScanProgress } from '../../../renderer/src/candidates/index.ts';
import '../../../renderer/src/styles.css';

const db = getDb();
const host = getHost();
let ids: { projectId: number; sourceId: number } | undefined;

async function setUp() {
  if (ids) return ids;
  await db.open();
  const demo = (await host.demoMatch())!;
  const now = Date.now();
  const projectId = (await db.projects.add({ title: 'Candidates check', createdAt: now, updatedAt: now })) as number;
  const sourceId = await importFootage(db, host, projectId, demo.footage[0], 'tester');
  ids = { projectId, sourceId };
  return ids;
}

async function stored() {
  const { projectId, sourceId } = await setUp();
  const anchors = await db.anchors.where('sourceId').equals(sourceId).toArray();
  const nonLive = await db.nonLive.where('footageSourceId').equals(sourceId).toArray();
  return { projectId, sourceId, anchors: anchors.map((a) => ({ id: a.id, kind: a.anchor.kind, t: a.anchor.t, period: a.anchor.period, origin: a.origin, note: a.anchor.note })), nonLive };
}

const api = {
  async scan(cancelAtPicture = false) {
    const { projectId, sourceId } = await setUp();
    const progress: ScanProgress[] = [];
    const ctl = new AbortController();
    const t0 = performance.now();
    try {
      const r = await scanFootage(db, projectId, sourceId, {
        user: 'tester',
        signal: ctl.signal,
        onProgress: (p) => {
          progress.push(p);
          if (cancelAtPicture && p.phase === 'picture' && p.fraction > 0.3) ctl.abort();
        },
      });
      return { ok: true as const, ms: performance.now() - t0, stored: r.stored, whistles: r.whistles, cuts: r.cuts, timings: r.timings, progress };
    } catch (e) {
      return { ok: false as const, name: (e as Error).name, message: (e as Error).message, progress };
    }
  },
  /** Imports another footage file into a project of its own and scans it (cuts only matter). */
  async scanFile(path: string) {
    await db.open();
    const [file] = await host.openPaths([path]);
    const now = Date.now();
    const projectId = (await db.projects.add({ title: `Check ${file.name}`, createdAt: now, updatedAt: now })) as number;
    const sourceId = await importFootage(db, host, projectId, file, 'tester');
    const r = await scanFootage(db, projectId, sourceId, { user: 'tester' });
    return { cuts: r.cuts, frames: r.timings.frames };
  },
  stored,
  async undo() {
    const { projectId } = await setUp();
    return undo(db, projectId, 'tester');
  },
  async confirm(id: number) {
    await confirmNonLive(db, (await setUp()).projectId, id, 'tester');
  },
  async reject(id: number) {
    await rejectNonLive(db, (await setUp()).projectId, id, 'tester');
  },
};

(globalThis as unknown as { candidates: typeof api }).candidates = api;

/** The Find candidates panel on the check project, as a screen would show it (F, Esc). */
async function showPanel() {
  const { projectId, sourceId } = await setUp();
  createRoot(document.getElementById('panel')!).render(createElement(FindCandidates, { db, projectId, footageSourceId: sourceId, user: 'tester', keys: true }));
}
void showPanel().then(() => (document.getElementById('state')!.textContent = 'ready'));
