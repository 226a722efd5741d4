/**
 * The analysis runner on the demo match, in a real Dexie database (fake-indexeddb):
 * load from the stored sources, run, store in one transaction, re-run without touching the
 * analyst's decisions. Reference: the engine's syncMatch run directly on the files as the
 * command line does (the same answer must come out of the database path).
 */
import 'fake-indexeddb/auto';
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { syncMatch } from '../../../engine/sync.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { createProject, storeSource } from '../../../renderer/src/db/store.ts';
import { summariseEvents, summariseTracking } from '../../../renderer/src/summaries.ts';
import { analyse, AnalysisCancelledError } from '../../../renderer/src/analysis/analyse.ts';
import { analysisSources, hasAnalysis, loadLoggedEventLog } from '../../../renderer/src/analysis/inputs.ts';
import { isProposal, runKey, storeAnalysis } from '../../../renderer/src/analysis/store-analysis.ts';
import type { AnalysisOutput } from '../../../renderer/src/analysis/protocol.ts';
import { loadSources, type LoadedSources } from '../project-file/demo-project.ts';

let src: LoadedSources;
let direct: ReturnType<typeof syncMatch>;
let db: WhistlemarkDb;
let projectId: number;
let n = 0;

beforeAll(async () => {
  src = await loadSources();
  direct = syncMatch(src.tracking.data, src.events.data);
}, 120_000);

beforeEach(async () => {
  db = new WhistlemarkDb(`analysis-${n++}`);
  projectId = await createProject(db, 'Ferncastle Lanterns v Dunmere Tide', 'ana');
  const info = async (path: string) => ({ fileName: basename(path), path, size: (await stat(path)).size, mtimeMs: 0 });
  await storeSource(db, { projectId, user: 'ana', file: await info(src.tracking.path), payload: { kind: 'tracking', data: src.tracking.data }, summary: summariseTracking(src.tracking.data), warnings: [] });
  await storeSource(db, { projectId, user: 'ana', file: await info(src.events.path), payload: { kind: 'events', data: src.events.data }, summary: summariseEvents(src.events.data), warnings: [] });
});
afterEach(async () => {
  await db.delete();
});

async function runOnce(): Promise<AnalysisOutput> {
  const sources = (await analysisSources(db, projectId))!;
  return analyse(db, sources);
}

describe('analysis runner', () => {
  it('finds both sources and rebuilds the logged event log in file order', async () => {
    const s = await analysisSources(db, projectId);
    expect(s).toBeDefined();
    const log = await loadLoggedEventLog(db, s!.eventSourceId);
    expect(log.events.map((e) => e.id)).toEqual(src.events.data.events.map((e) => e.id));
    expect(await hasAnalysis(db, projectId, s!.eventSourceId)).toBe(false);
  });

  it('gives from the database what the engine gives on the files, and stores it in one go', async () => {
    const out = await runOnce();
    // Reference: syncMatch on the imported files directly (as `whistlemark sync` does).
    expect(out.fit.segments.map((s) => s.offset)).toEqual(direct.fit.segments.map((s) => s.offset));
    expect(out.corrections.map((c) => c.trackingTime)).toEqual(direct.corrections.map((c) => c.trackingTime));
    const run = await storeAnalysis(db, { projectId, output: out, user: 'ana', trigger: 'automatic' });
    const wanted = direct.corrections.filter(isProposal);
    expect(run.proposals).toBe(wanted.length);
    expect(wanted.length).toBeGreaterThan(20);
    const rows = await db.corrections.where('projectId').equals(projectId).toArray();
    expect(rows.every((r) => r.status === 'proposed' && r.sourceId === out.eventSourceId)).toBe(true);
    expect(rows.map((r) => r.eventId).sort()).toEqual(wanted.map((c) => c.eventId).sort());
    const anchors = await db.anchors.where('projectId').equals(projectId).toArray();
    expect(anchors.filter((a) => a.anchor.source === 'tracking' && a.sourceId === out.trackingSourceId && a.origin === 'detected')).toHaveLength(direct.trackingAnchors.length);
    expect(anchors.filter((a) => a.anchor.source === 'events' && a.sourceId === out.eventSourceId && a.origin === 'detected')).toHaveLength(direct.eventAnchors.length);
    const fits = await db.clockFits.where('projectId').equals(projectId).toArray();
    expect(fits).toHaveLength(1);
    expect(fits[0].fit.source).toBe('events');
    expect(fits[0].sourceId).toBe(out.eventSourceId);
    expect((await db.settings.get(runKey(projectId)))?.value).toMatchObject({ proposals: wanted.length, trigger: 'automatic' });
    const audit = await db.audit.where('projectId').equals(projectId).toArray();
    expect(audit.some((a) => a.what.startsWith('analysis (automatic)'))).toBe(true);
    expect(await hasAnalysis(db, projectId, out.eventSourceId)).toBe(true);
  });

  it('a re-run replaces detections and open proposals but keeps decided corrections and the analyst’s anchors', async () => {
    const out = await runOnce();
    await storeAnalysis(db, { projectId, output: out, user: 'ana', trigger: 'automatic' });
    const rows = await db.corrections.where('projectId').equals(projectId).sortBy('eventId');
    const [acc, rej, open] = rows;
    await db.corrections.update(acc.id!, { status: 'accepted' });
    await db.corrections.update(rej.id!, { status: 'rejected' });
    await db.anchors.add({ projectId, sourceId: out.trackingSourceId, anchor: { id: 'mine', source: 'tracking', kind: 'corner', period: 1, t: 50, confidence: 1 }, origin: 'analyst' });
    // A second run that proposes the accepted one 2 s later and the open one 1 s later.
    const moved = structuredClone(out);
    for (const c of moved.corrections) {
      if (c.eventId === acc.eventId) c.trackingTime += 2;
      if (c.eventId === open.eventId) c.trackingTime += 1;
    }
    const run = await storeAnalysis(db, { projectId, output: moved, user: 'ana', trigger: 'on request' });
    expect(run.keptDecided).toBe(2);
    expect(run.changedUnderDecided.map((c) => c.eventId)).toEqual([acc.eventId]);
    const after = await db.corrections.where('projectId').equals(projectId).toArray();
    expect(after).toHaveLength(rows.length);
    expect(after.find((r) => r.id === acc.id)).toEqual({ ...acc, status: 'accepted' });
    expect(after.find((r) => r.id === rej.id)).toEqual({ ...rej, status: 'rejected' });
    const o = after.find((r) => r.id === open.id)!;
    expect(o.status).toBe('proposed');
    expect(o.proposal.trackingTime).toBeCloseTo(open.proposal.trackingTime + 1, 9);
    const anchors = await db.anchors.where('projectId').equals(projectId).toArray();
    expect(anchors.filter((a) => a.origin === 'detected')).toHaveLength(out.trackingAnchors.length + out.eventAnchors.length);
    expect(anchors.filter((a) => a.origin === 'analyst')).toHaveLength(1);
    expect(await db.clockFits.where('projectId').equals(projectId).count()).toBe(1);
  });

  it('stores nothing when the run is cancelled or a source vanished meanwhile', async () => {
    const sources = (await analysisSources(db, projectId))!;
    const ac = new AbortController();
    ac.abort();
    await expect(analyse(db, sources, () => {}, ac.signal)).rejects.toBeInstanceOf(AnalysisCancelledError);
    const out = await analyse(db, sources);
    await db.sources.delete(sources.eventSourceId);
    await expect(storeAnalysis(db, { projectId, output: out, user: 'ana', trigger: 'on request' })).rejects.toThrow(/no longer in this match project/);
    expect(await db.corrections.count()).toBe(0);
    expect(await db.anchors.count()).toBe(0);
    expect(await db.clockFits.count()).toBe(0);
  });

  it('reports progress in order up to the alignment', async () => {
    const phases: string[] = [];
    await analyse(db, (await analysisSources(db, projectId))!, (p) => phases.push(p.phase));
    expect(phases[0]).toBe('loading');
    expect(phases.at(-1)).toBe('aligning');
  });
});
