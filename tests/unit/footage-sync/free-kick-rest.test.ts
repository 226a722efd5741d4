/**
 * A free kick's whistle is paired with the moment its ball came to rest (lag-model.ts), so
 * the stored tracking anchor must keep that moment. References: the engine's restart
 * detector run directly (detectRestarts through syncMatch) for what the analysis must
 * store, and the simulator's truth (fixtures/demo/truth.json: whistles, restarts with
 * placedT and playedT) for how far each proposed pairing is from the true one.
 */
import 'fake-indexeddb/auto';
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syncMatch } from '../../../engine/sync.ts';
import { fitFootageClock, proposePairings, type FootagePair, type TrackingAnchorInput } from '../../../engine/footage-sync/index.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { createProject, storeSource } from '../../../renderer/src/db/store.ts';
import { summariseEvents, summariseTracking } from '../../../renderer/src/summaries.ts';
import { analyse } from '../../../renderer/src/analysis/analyse.ts';
import { analysisSources } from '../../../renderer/src/analysis/inputs.ts';
import { storeAnalysis } from '../../../renderer/src/analysis/store-analysis.ts';
import { loadSources } from '../project-file/demo-project.ts';
import { demoTruth, footageWhistles, markedKickOffs, trackingAnchors } from './demo-case.ts';

describe('the analysis stores the moment of rest of each tracking restart', () => {
  let db: WhistlemarkDb;
  afterAll(async () => {
    await db?.delete();
  });

  it('every stored tracking anchor carries the detector’s stillFromT (reference: syncMatch on the files)', async () => {
    const src = await loadSources();
    const direct = syncMatch(src.tracking.data, src.events.data);
    db = new WhistlemarkDb('free-kick-rest');
    const projectId = await createProject(db, 'Ferncastle Lanterns v Dunmere Tide', 'ana');
    const info = async (path: string) => ({ fileName: basename(path), path, size: (await stat(path)).size, mtimeMs: 0 });
    await storeSource(db, { projectId, user: 'ana', file: await info(src.tracking.path), payload: { kind: 'tracking', data: src.tracking.data }, summary: summariseTracking(src.tracking.data), warnings: [] });
    await storeSource(db, { projectId, user: 'ana', file: await info(src.events.path), payload: { kind: 'events', data: src.events.data }, summary: summariseEvents(src.events.data), warnings: [] });
    const sources = (await analysisSources(db, projectId))!;
    const out = await analyse(db, sources);
    await storeAnalysis(db, { projectId, output: out, user: 'ana', trigger: 'automatic' });
    const rows = await db.anchors.where('sourceId').equals(sources.trackingSourceId).toArray();
    expect(rows.length).toBe(direct.trackingAnchors.length);
    const byId = new Map(rows.map((r) => [r.anchor.id, r.anchor]));
    for (const a of direct.trackingAnchors) {
      expect(byId.get(a.id)?.stillFromT, a.id).toBe(a.stillFromT);
      expect(a.stillFromT).toBeLessThanOrEqual(a.t);
    }
    expect(direct.trackingAnchors.some((a) => a.kind === 'free_kick')).toBe(true);
  }, 180_000);
});

describe('free-kick pairings with the moment of rest are tighter (reference: fixtures/demo/truth.json)', () => {
  const trkPeriods = demoTruth.tracking!.periods.map((p) => ({ period: p.period, start: 0, end: (p.lastFrame - p.firstFrame) / demoTruth.tracking!.rate }));
  const opts = { trackingPeriods: trkPeriods, footageDurationS: demoTruth.footage!.durationS };
  const withRest = trackingAnchors();
  const withoutRest: TrackingAnchorInput[] = withRest.map(({ stillFromT: _drop, ...a }) => a);
  const marks = markedKickOffs();
  const fit = fitFootageClock(marks, opts);
  const used = new Set(marks.map((m) => m.trackingAnchorId));
  const propose = (trk: TrackingAnchorInput[]) => proposePairings(fit, footageWhistles(), trk, { nonLive: demoTruth.nonLive ?? [], usedTracking: used });
  const freeKicks = (ps: ReturnType<typeof propose>) => ps.filter((p) => p.kind === 'free_kick');

  it('each free kick is proposed with the true foul whistle either way, but with a smaller miss and a higher score when the rest is known', () => {
    const a = freeKicks(propose(withRest)), b = freeKicks(propose(withoutRest));
    expect(a.length).toBeGreaterThan(0);
    const wh = footageWhistles();
    for (const p of a) {
      const q = b.find((x) => x.trackingAnchorId === p.trackingAnchorId);
      const w = wh.find((x) => x.id === p.footageAnchorId)!;
      // The truth's foul whistle for this free kick: the last foul whistle before the ball is placed.
      const r = demoTruth.restarts[Number(p.trackingAnchorId.slice(3))];
      const trueWhistle = (demoTruth.whistles ?? []).filter((x) => x.reason === 'foul' && x.trueT < r.placedT).sort((x, y) => y.trueT - x.trueT)[0];
      expect(w.trueT).toBe(trueWhistle.trueT);
      console.log(
        `free kick at tracking ${p.tTracking.toFixed(2)} s: with the rest miss ${(p.missS * 1000).toFixed(0)} ms, score ${p.score.toFixed(3)}; ` +
          (q ? `kick only miss ${(q.missS * 1000).toFixed(0)} ms, score ${q.score.toFixed(3)}` : 'kick only: not proposed'),
      );
      if (q) {
        expect(Math.abs(p.missS)).toBeLessThan(Math.abs(q.missS));
        expect(p.score).toBeGreaterThan(q.score);
      }
    }
  });

  it('accepted, the free-kick lag re-estimated from them has a smaller spread with the rest than with the kick', () => {
    const fitWith = (trk: TrackingAnchorInput[]) => {
      const ps = propose(trk);
      const pairs: FootagePair[] = ps.map((p) => ({ footageAnchorId: p.footageAnchorId, trackingAnchorId: p.trackingAnchorId, period: p.period, footageKind: 'whistle', tFootage: p.tFootage, tracking: trk.find((t) => t.id === p.trackingAnchorId)! }));
      return fitFootageClock([...marks, ...pairs], opts).model.lags.find((l) => l.kind === 'free_kick');
    };
    const a = fitWith(withRest), b = fitWith(withoutRest);
    console.log(`free-kick lag with the rest ${a?.lagS.toFixed(2)}±${a?.sdS.toFixed(2)} s (n ${a?.n}, ${a?.ref}); kick only ${b?.lagS.toFixed(2)}±${b?.sdS.toFixed(2)} s (n ${b?.n}, ${b?.ref})`);
    expect(a?.ref).toBe('still');
    expect(a!.sdS).toBeLessThan(b ? b.sdS : Infinity);
  });
});
