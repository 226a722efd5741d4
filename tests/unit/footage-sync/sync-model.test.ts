/**
 * The Sync screen's model on the demo (reference: fixtures/demo/truth.json): a kick-off
 * marked in footage pairs with the right period's tracking kick-off with or without a fit;
 * an action's changes carry the anchor and the replaced fit; the history commit writes
 * them as one step that undo takes back (fake-indexeddb stands in for the browser's
 * IndexedDB here; the e2e runs the same in Chromium).
 */
import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import type { AnchorRow } from '../../../renderer/src/db/rows.ts';
import { commit, undo } from '../../../renderer/src/history/history.ts';
import { autoPair, changesWithFit, computeSync, type SyncInputs } from '../../../renderer/src/sync/sync-model.ts';
import { demoTruth, FPS, firstFrameAfter, trackingAnchors } from './demo-case.ts';

const trk = trackingAnchors();
const trackingRows: AnchorRow[] = trk.map((a, i) => ({ id: 100 + i, projectId: 1, sourceId: 2, origin: 'detected', anchor: { id: a.id, source: 'tracking', kind: a.kind, period: a.period, t: a.t, confidence: 1 } }));
const base: SyncInputs = {
  projectId: 1, footageSourceId: 3, footageRows: [], trackingRows, nonLive: [], trackingRate: 25,
  trackingPeriods: demoTruth.tracking!.periods.map((p) => ({ period: p.period, firstFrame: p.firstFrame, frameCount: p.lastFrame - p.firstFrame + 1, homeAttacks: 'positive_x', framesPerBlock: 1500, blockCount: 4, hasBallZ: true })),
  footageFps: FPS, footageDuration: demoTruth.footage!.durationS,
};
const kickFrame = (period: number) => firstFrameAfter(demoTruth.restarts.find((r) => r.kind === 'kick_off' && r.period === period)!.playedT);
const firstKick = (period: number) => trackingRows.filter((r) => r.anchor.kind === 'kick_off' && r.anchor.period === period).sort((a, b) => a.anchor.t - b.anchor.t)[0];
const footageRow = (id: number, t: number, pairedWith: AnchorRow): AnchorRow => ({ id, projectId: 1, sourceId: 3, origin: 'analyst', anchor: { id: `fm${id}`, source: 'footage', kind: 'kick_off', period: pairedWith.anchor.period, t, confidence: 1 }, pairedWith: pairedWith.id, pairedAnchorId: pairedWith.anchor.id });

describe('marking kick-offs pairs them with the period’s tracking kick-off', () => {
  it('without any fit: the first kick-off goes to period 1, the next one (later in footage) to period 2', () => {
    const s0 = computeSync(base);
    const a = autoPair('kick_off', kickFrame(1) / FPS, s0, base);
    expect(a.period).toBe(1);
    expect(a.tracking).toBe(firstKick(1));
    const one = { ...base, footageRows: [footageRow(1, kickFrame(1) / FPS, firstKick(1))] };
    const b = autoPair('kick_off', kickFrame(2) / FPS, computeSync(one), one);
    expect(b.period).toBe(2);
    expect(b.tracking).toBe(firstKick(2));
  });

  it('with a fit: the kick-off after the goal pairs with that kick-off, not the period start', () => {
    const two = { ...base, footageRows: [footageRow(1, kickFrame(1) / FPS, firstKick(1)), footageRow(2, kickFrame(2) / FPS, firstKick(2))] };
    const goalKick = demoTruth.restarts.filter((r) => r.kind === 'kick_off' && r.period === 2)[1];
    const c = autoPair('kick_off', firstFrameAfter(goalKick.playedT) / FPS, computeSync(two), two);
    expect(c.period).toBe(2);
    expect(c.tracking?.anchor.id).toBe(trk[demoTruth.restarts.indexOf(goalKick)].id);
  });

  it('pairs survive a re-analysis that renews tracking row ids (matched by anchor id)', () => {
    const rows = [footageRow(1, kickFrame(1) / FPS, firstKick(1))];
    const renewed = trackingRows.map((r) => ({ ...r, id: r.id! + 1000 }));
    expect(computeSync({ ...base, footageRows: rows, trackingRows: renewed }).pairs.length).toBe(1);
  });
});

describe('an action is one undoable step with the replaced fit', () => {
  let db: WhistlemarkDb;
  let n = 0;
  beforeEach(async () => {
    db = new WhistlemarkDb(`sync-model-${n++}`);
    await db.projects.add({ id: 1, title: 'p', createdAt: 0, updatedAt: 0 });
  });
  afterEach(async () => {
    await db.delete();
  });

  it('mark, mark again (fit replaced in place), undo (back to the first fit)', async () => {
    const first = footageRow(1, kickFrame(1) / FPS, firstKick(1));
    const { id: _drop, ...newRow } = first;
    let changes = changesWithFit(base, undefined, [{ table: 'anchors', after: newRow }], [newRow as AnchorRow]);
    expect(changes.map((c) => c.table)).toEqual(['anchors', 'clockFits']);
    const [anchorId, fitId] = await commit(db, { projectId: 1, user: 'u', subject: 'anchor', what: 'mark kick-off', changes });
    const fit1 = (await db.clockFits.get(fitId))!;
    expect(fit1.fit.source).toBe('footage');
    expect(fit1.sourceId).toBe(3);
    const stored1 = (await db.anchors.get(anchorId))!;
    const second = footageRow(0, kickFrame(2) / FPS, firstKick(2));
    const { id: _d2, ...second2 } = second;
    changes = changesWithFit(base, fit1, [{ table: 'anchors', after: second2 }], [stored1, second2 as AnchorRow]);
    await commit(db, { projectId: 1, user: 'u', subject: 'anchor', what: 'mark kick-off 2', changes });
    expect(await db.clockFits.count()).toBe(1);
    expect((await db.clockFits.get(fitId))!.fit.segments.length).toBe(2);
    await undo(db, 1, 'u');
    expect(await db.anchors.count()).toBe(1);
    expect((await db.clockFits.get(fitId))!.fit.segments.length).toBe(1);
  });
});
