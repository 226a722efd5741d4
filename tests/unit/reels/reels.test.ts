import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { ClockFit, ClockSegment, MatchEvent } from '../../../shared-types/index.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { undo, redo } from '../../../renderer/src/history/history.ts';
import { eventsMatching, fitGaps, mergeOverlapping, moveInOrder, nonLiveTouched, spanFromPoints, spansFromEvents } from '../../../renderer/src/reels/clip-rules.ts';
import { addClips, addReel, clipsOfReel, deleteReel, mergeClipsInReel, moveClip, updateClip } from '../../../renderer/src/reels/reel-actions.ts';
import { matchClockText, planClip } from '../../../renderer/src/export-clips/plan.ts';
import { reelSidecars, vttTime } from '../../../renderer/src/export-clips/sidecar.ts';

const require = createRequire(import.meta.url);
// webvtt-parser 2.2 from the npm registry: a parser written to the W3C WebVTT spec.
const { WebVTTParser } = require('webvtt-parser') as { WebVTTParser: new () => { parse(s: string, mode?: string): { cues: { id: string; startTime: number; endTime: number; text: string }[]; errors: { message: string; line: number }[] } } };

const ev = (id: string, kind: MatchEvent['kind'], period: number, t: number, team: 'home' | 'away', player = '7'): MatchEvent => ({ id, row: Number(id.slice(1)), period, t, kind, rawKind: kind, team, player, raw: {} });
const row = (e: MatchEvent, moved = 0) => ({ logged: e, current: { ...e, t: e.t + moved } });

const seg = (period: number, fromT: number, toT: number, offset: number, rate = 1): ClockSegment => ({ period, fromT, toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] });

describe('clip rules', () => {
  const events = [row(ev('e1', 'corner', 1, 60, 'home')), row(ev('e2', 'corner', 1, 66, 'away', '9'), 1.5), row(ev('e3', 'shot', 2, 30, 'home')), row(ev('e4', 'corner', 2, 100, 'away'))];

  it('filters by kind, team, player, period, time range and corrected or not', () => {
    expect(eventsMatching(events, { kinds: ['corner'] }).map((r) => r.current.id)).toEqual(['e1', 'e2', 'e4']);
    expect(eventsMatching(events, { kinds: ['corner'], team: 'away' }).map((r) => r.current.id)).toEqual(['e2', 'e4']);
    expect(eventsMatching(events, { player: '9' }).map((r) => r.current.id)).toEqual(['e2']);
    expect(eventsMatching(events, { period: 2 }).map((r) => r.current.id)).toEqual(['e3', 'e4']);
    expect(eventsMatching(events, { fromT: 50, toT: 70 }).map((r) => r.current.id)).toEqual(['e1', 'e2']);
    expect(eventsMatching(events, { corrected: 'corrected' }).map((r) => r.current.id)).toEqual(['e2']);
    expect(eventsMatching(events, { corrected: 'uncorrected' }).map((r) => r.current.id)).toEqual(['e1', 'e3', 'e4']);
  });

  it('puts pre-roll and post-roll round each event on the tracking clock (through the event fit)', () => {
    const fit: ClockFit = { source: 'events', method: 'huber', segments: [seg(1, 0, 3000, 2.0), seg(2, 0, 3000, -1.0)] };
    const spans = spansFromEvents(events.map((r) => r.current), { preRoll: 5, postRoll: 8 }, fit);
    expect(spans.map((s) => [s.period, s.from, s.to])).toEqual([[1, 57, 70], [1, 64.5, 77.5], [2, 24, 37], [2, 94, 107]]);
    expect(() => spansFromEvents([], { preRoll: -1, postRoll: 0 })).toThrow(/pre-roll/);
    expect(() => spanFromPoints(1, 10, 9)).toThrow(/not after in point/);
  });

  it('merges overlapping clips of the same period only', () => {
    const spans = spansFromEvents(events.map((r) => r.current), { preRoll: 5, postRoll: 8 });
    const merged = mergeOverlapping(spans);
    expect(merged.map((s) => [s.period, s.from, s.to, s.eventIds.join('+')])).toEqual([[1, 55, 75.5, 'e1+e2'], [2, 25, 38, 'e3'], [2, 95, 108, 'e4']]);
  });

  it('moves an item in the order', () => {
    expect(moveInOrder(['a', 'b', 'c', 'd'], 0, 2)).toEqual(['b', 'c', 'a', 'd']);
    expect(moveInOrder(['a', 'b', 'c', 'd'], 3, 0)).toEqual(['d', 'a', 'b', 'c']);
  });

  it('flags clips touching a non-live interval or a gap in the footage fit (replay, half-time)', () => {
    const fit: ClockFit = { source: 'footage', method: 'huber', segments: [seg(1, 30, 100, -30), seg(1, 110, 240, -40), seg(2, 300, 500, -300)] };
    expect(fitGaps(fit).map((g) => [g.fromT, g.toT, g.kind])).toEqual([[100, 110, 'replay'], [240, 300, 'half_time']]);
    expect(nonLiveTouched(90, 105, [], fit).map((n) => n.kind)).toEqual(['replay']);
    expect(nonLiveTouched(50, 60, [{ fromT: 55, toT: 56, kind: 'graphics' }], fit).map((n) => n.kind)).toEqual(['graphics']);
    expect(nonLiveTouched(50, 60, [], fit)).toEqual([]);
  });
});

describe('reel actions are undoable steps', () => {
  let db: WhistlemarkDb;
  let n = 0;
  const ctx = { projectId: 1, user: 'analyst' };
  beforeEach(async () => {
    db = new WhistlemarkDb(`reels-${n++}`);
    await db.projects.add({ id: 1, title: 'p', createdAt: 0, updatedAt: 0 });
  });
  afterEach(() => db.delete());

  it('adds, edits, reorders, merges and deletes; each undoes and redoes', async () => {
    const reelId = await addReel(db, ctx, 'Corners');
    const spans = spansFromEvents([ev('e1', 'corner', 1, 60, 'home'), ev('e2', 'corner', 1, 66, 'away'), ev('e3', 'corner', 1, 200, 'away')], { preRoll: 5, postRoll: 8 });
    await addClips(db, ctx, reelId, spans);
    let clips = await clipsOfReel(db, reelId);
    expect(clips.map((c) => c.eventIds?.[0])).toEqual(['e1', 'e2', 'e3']);

    await updateClip(db, ctx, clips[0].id, { title: 'First corner', note: 'watch the near post' });
    expect((await db.clips.get(clips[0].id))?.note).toBe('watch the near post');
    await expect(updateClip(db, ctx, clips[0].id, { to: 10 })).rejects.toThrow(/must be after in/);

    await moveClip(db, ctx, reelId, 2, 0);
    expect((await clipsOfReel(db, reelId)).map((c) => c.eventIds?.[0])).toEqual(['e3', 'e1', 'e2']);
    await undo(db, 1, 'analyst');
    expect((await clipsOfReel(db, reelId)).map((c) => c.eventIds?.[0])).toEqual(['e1', 'e2', 'e3']);

    expect(await mergeClipsInReel(db, ctx, reelId)).toBe(1);
    clips = await clipsOfReel(db, reelId);
    expect(clips.map((c) => [c.from, c.to, c.eventIds])).toEqual([[55, 74, ['e1', 'e2']], [195, 208, ['e3']]]);
    expect(clips[0].note).toBe('watch the near post');
    await undo(db, 1, 'analyst');
    expect((await clipsOfReel(db, reelId)).length).toBe(3);
    await redo(db, 1, 'analyst');
    expect((await clipsOfReel(db, reelId)).length).toBe(2);

    await deleteReel(db, ctx, reelId);
    expect(await db.clips.count()).toBe(0);
    await undo(db, 1, 'analyst');
    expect(await db.clips.count()).toBe(2);
    expect((await db.reels.get(reelId))?.title).toBe('Corners');
  });
});

describe('export plan and sidecars', () => {
  // Demo footage fit from fixtures/demo/truth.json: per live segment true = offset + rate·s
  // for both clocks, so footage -> tracking is composed from the two (the simulator's truth).
  const truth = JSON.parse(readFileSync(new URL('../../../fixtures/demo/truth.json', import.meta.url), 'utf8'));
  const pts = Array.from({ length: 1000 }, (_, i) => i / 25);
  const fit: ClockFit = { source: 'footage', method: 'huber', segments: [seg(1, 0, 39.96, -10)] };
  const probe = { pts, nominalFps: 25, frameCount: pts.length, duration: 40 };

  it('gives whole frames for in/out, SMPTE timecode, match clock and tracking frames', () => {
    const p = planClip({ id: 5, projectId: 1, reelId: 1, order: 0, period: 1, from: 2.01, to: 4.5, title: 'A, "quoted" clip', note: 'line one\nline two' }, 0, {
      fit,
      probe,
      tracking: { rate: 25, firstFrame: { 1: 1000 } },
      events: [ev('e1', 'corner', 1, 3, 'home'), ev('e2', 'shot', 1, 9, 'home')],
      nonLive: [],
    });
    // footage = tracking + 10 s: in 12.01 s -> frame 300 (12.00 s on screen), out 14.5 s -> frame 362 (exclusive)
    expect(p.footage).toEqual({ inFrame: 300, outFrame: 362, inT: 12, outT: 14.48 });
    expect(p.durationS).toBeCloseTo(2.48, 6);
    // SMPTE ST 12-1, 25 fps non-drop: frame 300 = 00:00:12:00, frame 362 = 00:00:14:12
    expect(p.timecode).toEqual({ in: '00:00:12:00', out: '00:00:14:12' });
    expect(p.tracking.inFrame).toBe(1000 + 50);
    expect(p.matchClock.in).toBe('00:02.0');
    expect(p.events.map((e) => [e.id, e.atClipS])).toEqual([['e1', 1]]);
    expect(matchClockText(2, 64.25)).toBe('46:04.2');

    const files = reelSidecars('Corners', [p, { ...p, index: 1, title: 'Second' }], { titleCardS: 0, reelFile: 'corners.mp4' });
    const vtt = new WebVTTParser().parse(files.vtt, 'metadata');
    expect(vtt.errors).toEqual([]);
    expect(vtt.cues.map((c) => [c.id, c.startTime, c.endTime])).toEqual([
      ['clip-1', 0, 2.48],
      ['event-1', 1, 2.48],
      ['clip-2', 2.48, 4.96],
      ['event-2', 3.48, 4.96],
    ]);
    expect(vttTime(3725.5)).toBe('01:02:05.500');
    // RFC 4180: the CSV reads back through papaparse (npm registry) with the same fields.
    const Papa = require('papaparse') as typeof import('papaparse');
    const parsed = Papa.parse<string[]>(files.csv.trim(), { newline: '\r\n' });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data[1][1]).toBe('A, "quoted" clip');
    expect(parsed.data[1][16]).toBe('line one\nline two');
    expect(parsed.data[1][7]).toBe('00:00:12:00');
    const json = JSON.parse(files.json);
    expect(json.clips[0].in).toMatchObject({ footageFrame: 300, timecode: '00:00:12:00', trackingFrame: 1050 });
    expect(truth.footage.fps).toBe(25);
  });

  it('pulls a clip end that falls in a replay gap in to the shown footage, and flags it', () => {
    const gapFit: ClockFit = { source: 'footage', method: 'huber', segments: [seg(2, 0, 100, -10), seg(2, 110, 200, -20)] };
    // tracking 88..95 is not shown (footage 98..100 then a 10 s replay, live again from 110 = tracking 90)
    const p = planClip({ id: 1, projectId: 1, reelId: 1, order: 0, period: 2, from: 95, to: 100, title: 'x' }, 0, { fit: gapFit, probe: { ...probe, pts: Array.from({ length: 6000 }, (_, i) => i / 25), duration: 240 }, tracking: { rate: 25, firstFrame: {} }, events: [], nonLive: [] });
    expect(p.footage.inT).toBeCloseTo(115, 6);
    expect(p.nonLive.map((n) => n.kind)).toEqual([]);
    const q = planClip({ id: 1, projectId: 1, reelId: 1, order: 0, period: 2, from: 87, to: 100, title: 'x' }, 0, { fit: gapFit, probe: { ...probe, pts: Array.from({ length: 6000 }, (_, i) => i / 25), duration: 240 }, tracking: { rate: 25, firstFrame: {} }, events: [], nonLive: [] });
    expect(q.footage.inT).toBeCloseTo(97, 6);
    expect(q.nonLive.map((n) => n.kind)).toEqual(['replay']);
  });

  it('refuses a clip the footage fit does not cover, saying which clip and what to do', () => {
    expect(() => planClip({ id: 1, projectId: 1, reelId: 1, order: 0, period: 2, from: 5, to: 9, title: 'Late' }, 3, { fit, probe, tracking: { rate: 25, firstFrame: {} }, events: [], nonLive: [] })).toThrow(/clip 4 "Late".*not covered.*Sync screen/);
  });
});
