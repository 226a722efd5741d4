import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { ClockFit, ClockSegment } from '../../../shared-types/index.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { undo } from '../../../renderer/src/history/history.ts';
import { planClip } from '../../../renderer/src/export-clips/plan.ts';
import { clipsOfReel, addReel } from '../../../renderer/src/reels/reel-actions.ts';
import { durationText, markedSpan, marksReadout, frameClock, type MarkInputs } from '../../../renderer/src/marks/mark-span.ts';
import { markActionOf } from '../../../renderer/src/marks/mark-keys.ts';
import { loadLastReel, loadMarks, marksKey, readMarks, saveMarks } from '../../../renderer/src/marks/mark-store.ts';
import { addMarkedClip } from '../../../renderer/src/marks/add-marked-clip.ts';
import { playerActionOf } from '../../../renderer/src/player/player-keys.ts';
import { layerForKey } from '../../../renderer/src/watch/LayerPanel.tsx';
import { SYNC_KEYS } from '../../../renderer/src/sync/SyncScreen.tsx';
import { reviewActionFor } from '../../../renderer/src/review/review-keys.ts';

const seg = (period: number, fromT: number, toT: number, offset: number, rate = 1): ClockSegment => ({ period, fromT, toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] });

// 25 fps footage, 400 s. Period 1 is footage 10–200 s (tracking = footage − 10), a replay
// 120–126 s left out of the fit (second segment resumes at tracking 110), half-time
// 200–230 s, period 2 from 230 s (tracking = footage − 230), drifting 100 ppm.
const pts = Array.from({ length: 10_000 }, (_, i) => i / 25);
const fit: ClockFit = { source: 'footage', method: 'huber', segments: [seg(1, 10, 120, -10), seg(1, 126, 200, -16), seg(2, 230, 400, -230 * 1.0001, 1.0001)] };
// Event clock 2 s behind tracking in period 1 (tracking = event + 2), equal in period 2.
const eventFit: ClockFit = { source: 'events', method: 'huber', segments: [seg(1, 0, 3000, 2), seg(2, 0, 3000, 0)] };
const inp: MarkInputs = { pts, nominalFps: 25, fit, eventFit };
const frameOf = (t: number) => Math.round(t * 25);

describe('in/out marks -> clip span', () => {
  it('in is the start of the in-frame, out the end of the out-frame, on the tracking clock', () => {
    const r = markedSpan({ inFrame: frameOf(70), outFrame: frameOf(82.4) - 1 }, inp);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.span.period).toBe(1);
    expect(r.span.from).toBeCloseTo(60, 9);
    expect(r.span.to).toBeCloseTo(72.4, 9); // end of the frame before 82.4 s is 82.4 s
    expect(r.span.durationS).toBeCloseTo(12.4, 9);
    // Match clock = event clock (tracking − 2 s here), Law 7 layout (common practice).
    expect(r.span.matchIn).toBe('00:58.0');
    expect(r.span.matchOut).toBe('01:10.4');
    expect(r.span.title).toBe('Marked 00:58–01:10');
    expect(r.span.unfittedS).toBe(0);
    expect(marksReadout(r)).toBe('P1 in 00:58.0 · out 01:10.4 · 12.4 s');
  });

  it('one marked frame is a one-frame clip, and the export plan gives back exactly the marked frames', () => {
    for (const [a, b] of [[frameOf(70), frameOf(70)], [1750, 2061], [frameOf(300), frameOf(310) + 3]]) {
      const r = markedSpan({ inFrame: a, outFrame: b }, inp);
      if (!r.ok) throw new Error(r.problem);
      const plan = planClip({ id: 1, projectId: 1, reelId: 1, order: 0, period: r.span.period, from: r.span.from, to: r.span.to, title: r.span.title }, 0, {
        fit,
        eventFit,
        probe: { pts, nominalFps: 25, frameCount: pts.length, duration: 400 },
        tracking: { rate: 25, firstFrame: { 1: 0, 2: 0 } },
        events: [],
        nonLive: [],
      });
      expect([plan.footage.inFrame, plan.footage.outFrame - 1]).toEqual([a, b]);
    }
    expect(durationText(0.04)).toBe('0.04 s');
  });

  it('period 2 goes through its own segment (drift included) and counts on from 45:00', () => {
    const r = markedSpan({ inFrame: frameOf(290), outFrame: frameOf(300) }, inp);
    if (!r.ok) throw new Error(r.problem);
    expect(r.span.period).toBe(2);
    expect(r.span.from).toBeCloseTo(60 * 1.0001, 9);
    expect(r.span.to).toBeCloseTo((70 + 0.04) * 1.0001, 9);
    expect(r.span.matchIn).toBe('46:00.0');
  });

  it('refuses reversed marks, marks in two periods, and ends outside the fit, saying what to do', () => {
    const reversed = markedSpan({ inFrame: 2000, outFrame: 1999 }, inp);
    expect(reversed.ok).toBe(false);
    expect(!reversed.ok && reversed.problem).toMatch(/out point \(frame 1999\) is before the in point \(frame 2000\).*later frame/);
    const twoPeriods = markedSpan({ inFrame: frameOf(190), outFrame: frameOf(240) }, inp);
    expect(!twoPeriods.ok && twoPeriods.problem).toMatch(/period 1 .* period 2.*one clip per period/);
    const halfTime = markedSpan({ inFrame: frameOf(190), outFrame: frameOf(210) }, inp);
    expect(!halfTime.ok && halfTime.problem).toMatch(/out point \(frame 5250.*does not cover.*live play/);
    const inReplay = markedSpan({ inFrame: frameOf(123), outFrame: frameOf(130) }, inp);
    expect(!inReplay.ok && inReplay.problem).toMatch(/in point \(frame 3075, footage 123.00 s\).*does not cover/);
    const leadIn = markedSpan({ inFrame: frameOf(5), outFrame: frameOf(20) }, inp);
    expect(!leadIn.ok && leadIn.problem).toMatch(/in point.*does not cover/);
    // A fit reaching back before tracking starts (negative tracking time) is refused too.
    const early = markedSpan({ inFrame: frameOf(5), outFrame: frameOf(20) }, { ...inp, fit: { ...fit, segments: [seg(1, 0, 120, -10)] } });
    expect(!early.ok && early.problem).toMatch(/5.0 s before tracking of period 1 starts/);
  });

  it('keeps a replay inside the span (one period) and says how much footage the fit leaves out there', () => {
    const r = markedSpan({ inFrame: frameOf(115), outFrame: frameOf(130) }, inp);
    if (!r.ok) throw new Error(r.problem);
    expect(r.span.from).toBeCloseTo(105, 9);
    expect(r.span.to).toBeCloseTo(114.04, 9);
    expect(r.span.unfittedS).toBeCloseTo(6, 9);
  });

  it('asks for what is missing: either mark, a frame of this footage, a fit', () => {
    expect(markedSpan({}, inp)).toMatchObject({ ok: false, problem: expect.stringMatching(/press Y.*U/) });
    expect(markedSpan({ outFrame: 5 }, inp)).toMatchObject({ ok: false, problem: expect.stringMatching(/No in point/) });
    expect(markedSpan({ inFrame: 5 }, inp)).toMatchObject({ ok: false, problem: expect.stringMatching(/No out point/) });
    expect(markedSpan({ inFrame: 5, outFrame: 10_000 }, inp)).toMatchObject({ ok: false, problem: expect.stringMatching(/frame 10000.*0–9999/) });
    expect(markedSpan({ inFrame: 500, outFrame: 600 }, { ...inp, fit: undefined })).toMatchObject({ ok: false, problem: expect.stringMatching(/no footage clock fit.*Sync screen/) });
    expect(frameClock(frameOf(70), inp)).toBe('P1 00:58.0');
    expect(frameClock(frameOf(210), inp)).toBe('not live');
  });
});

describe('mark keys', () => {
  it('Y marks in, U out, Shift+U clears; nothing with Ctrl/Alt', () => {
    expect(markActionOf({ key: 'y' })).toBe('in');
    expect(markActionOf({ key: 'Y' })).toBe('in'); // Caps Lock
    expect(markActionOf({ key: 'u' })).toBe('out');
    expect(markActionOf({ key: 'U', shiftKey: true })).toBe('clear');
    expect(markActionOf({ key: 'Y', shiftKey: true })).toBeUndefined();
    expect(markActionOf({ key: 'u', ctrlKey: true })).toBeUndefined();
    expect(markActionOf({ key: 'y', altKey: true })).toBeUndefined();
  });

  it('collide with no player, Watch layer, Sync or Review key', () => {
    for (const key of ['y', 'Y', 'u', 'U']) {
      const shiftKey = key === key.toUpperCase();
      expect(playerActionOf({ key, shiftKey })).toBeUndefined();
      expect(layerForKey(key)).toBeUndefined();
      expect(SYNC_KEYS.some((s) => s.key.toLowerCase() === key.toLowerCase())).toBe(false);
      expect(reviewActionFor({ key, shiftKey, ctrlKey: false, altKey: false, metaKey: false }, false)).toBeUndefined();
    }
    // Watch's own letters and Sync's action letters (renderer/src/watch/WatchScreen.tsx, sync/SyncScreen.tsx).
    for (const taken of ['p', 'r', 's', 'a', 'n', 'x', 'c', 'f', 'w', '[', ']', 'i', 'o']) expect(markActionOf({ key: taken })).toBeUndefined();
  });
});

describe('marks and reels in the database', () => {
  let db: WhistlemarkDb;
  let n = 0;
  const ctx = { projectId: 1, user: 'analyst' };
  beforeEach(async () => {
    db = new WhistlemarkDb(`marks-${n++}`);
    await db.projects.add({ id: 1, title: 'p', createdAt: 0, updatedAt: 0 });
  });
  afterEach(() => db.delete());

  it('keeps the marks per project and footage; a damaged or foreign row reads as no marks', async () => {
    await saveMarks(db, 1, 7, { inFrame: 100, outFrame: 150 });
    expect(await loadMarks(db, 1, 7)).toEqual({ inFrame: 100, outFrame: 150 });
    expect(await loadMarks(db, 1, 8)).toEqual({});
    expect(await loadMarks(db, 2, 7)).toEqual({});
    await saveMarks(db, 1, 7, { inFrame: 100 });
    expect(await loadMarks(db, 1, 7)).toEqual({ inFrame: 100 });
    await db.settings.put({ key: marksKey(1), value: { footageSourceId: 7, inFrame: -3, outFrame: 'x' } });
    expect(await loadMarks(db, 1, 7)).toEqual({});
    expect(readMarks('garbage', 7)).toEqual({});
  });

  it('adds the marked clip to a reel in one undoable step and remembers the reel', async () => {
    const reelId = await addReel(db, ctx, 'Pressing');
    const r = markedSpan({ inFrame: frameOf(70), outFrame: frameOf(82.4) - 1 }, inp);
    if (!r.ok) throw new Error(r.problem);
    const added = await addMarkedClip(db, ctx, r.span, { reelId });
    expect(added).toMatchObject({ reelId, reelTitle: 'Pressing', title: 'Marked 00:58–01:10', newReel: false });
    const [clip] = await clipsOfReel(db, reelId);
    expect(clip).toMatchObject({ period: 1, title: 'Marked 00:58–01:10', eventIds: [], preRoll: 0, postRoll: 0, layers: ['dots', 'ball'] });
    expect(clip.from).toBeCloseTo(60, 9);
    expect(clip.to).toBeCloseTo(72.4, 9);
    expect(await loadLastReel(db, 1)).toBe(reelId);
    expect((await undo(db, 1, 'analyst'))?.what).toBe('add clip "Marked 00:58–01:10"');
    expect(await clipsOfReel(db, reelId)).toEqual([]);
    expect(await db.reels.get(reelId)).toBeDefined();
  });

  it('makes a new reel first when asked (its own step), with the title typed', async () => {
    const r = markedSpan({ inFrame: frameOf(290), outFrame: frameOf(300) }, inp);
    if (!r.ok) throw new Error(r.problem);
    const added = await addMarkedClip(db, ctx, r.span, { newReelTitle: '  Second half  ' }, 'Late run', ['dots', 'offside']);
    expect(added).toMatchObject({ reelTitle: 'Second half', title: 'Late run', newReel: true });
    expect((await clipsOfReel(db, added.reelId)).map((c) => [c.title, c.layers])).toEqual([['Late run', ['dots', 'offside']]]);
    await undo(db, 1, 'analyst');
    await undo(db, 1, 'analyst');
    expect(await db.reels.count()).toBe(0);
  });

  it('refuses a reel that is gone and writes nothing', async () => {
    const r = markedSpan({ inFrame: frameOf(70), outFrame: frameOf(80) }, inp);
    if (!r.ok) throw new Error(r.problem);
    await expect(addMarkedClip(db, ctx, r.span, { reelId: 99 })).rejects.toThrow(/no longer exists.*choose another reel/);
    expect(await db.clips.count()).toBe(0);
    expect(await db.audit.count()).toBe(0);
  });
});
