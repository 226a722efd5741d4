/**
 * The player's clocks: timecode labels through engine/timecode (worked values of SMPTE ST
 * 12-1 from ../shared/REFERENCES.md, there marked "from memory"; swept against the
 * `smpte-timecode` package from the npm registry), footage time text, and go-to targets
 * through a footage clock fit (match clock, tracking frame).
 */
import Timecode from 'smpte-timecode';
import { describe, expect, it } from 'vitest';
import type { ClockFit, ClockSegment } from '../../../shared-types/index.ts';
import { ClockInputError, dropFrameApplies, formatFootageTime, goToTarget, matchReadout, parseFootageTime, parseMatchClock, timecodeOfFrame, timecodeRateOf, type MatchClocks } from '../../../renderer/src/player/clocks.ts';
import { playerActionOf } from '../../../renderer/src/player/player-keys.ts';

const seg = (period: 1 | 2, fromT: number, toT: number, offset: number, rate: number): ClockSegment => ({ period, fromT, toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] });

describe('timecode of footage frames', () => {
  it('29.97 drop-frame: the worked values of SMPTE ST 12-1 (REFERENCES.md, from memory)', () => {
    const df = timecodeRateOf(29.97, true);
    expect(df.dropFrame).toBe(true);
    expect(timecodeOfFrame(1799, df)).toBe('00:00:59;29');
    expect(timecodeOfFrame(1800, df)).toBe('00:01:00;02');
    expect(timecodeOfFrame(17982, df)).toBe('00:10:00;00');
    expect(timecodeOfFrame(107892, df)).toBe('01:00:00;00');
    const df60 = timecodeRateOf(59.94, true);
    expect(timecodeOfFrame(215784, df60)).toBe('01:00:00;00');
    expect(timecodeOfFrame(90000, timecodeRateOf(25, true))).toBe('01:00:00:00');
  });
  it('drop-frame applies only to the 1000/1001 rates of 30 and 60', () => {
    expect([25, 50, 29.97, 30000 / 1001, 59.94, 30, 24, 23.976].map(dropFrameApplies)).toEqual([false, false, true, true, true, false, false, false]);
  });
  it('agrees with smpte-timecode (npm) on a sweep of frames at 29.97 DF, 29.97 NDF, 25 and 50', () => {
    const cases = [
      { rate: timecodeRateOf(30000 / 1001, true), fps: 29.97, df: true },
      { rate: timecodeRateOf(30000 / 1001, false), fps: 29.97, df: false },
      { rate: timecodeRateOf(25, false), fps: 25, df: false },
      { rate: timecodeRateOf(50, false), fps: 50, df: false },
    ];
    for (const c of cases) {
      for (let f = 0; f < 400_000; f += 997) {
        expect(timecodeOfFrame(f, c.rate)).toBe(Timecode(f, c.fps, c.df).toString());
      }
    }
  });
});

describe('footage time text', () => {
  it('parses seconds, M:SS.s and H:MM:SS.s, and formats back', () => {
    expect(parseFootageTime('83.4')).toBeCloseTo(83.4, 9);
    expect(parseFootageTime('1:23.4')).toBeCloseTo(83.4, 9);
    expect(parseFootageTime('1:02:03.5')).toBeCloseTo(3723.5, 9);
    expect(formatFootageTime(3723.5)).toBe('1:02:03.500');
    expect(formatFootageTime(62.04)).toBe('01:02.040');
  });
  it('refuses what it cannot read, saying what to write', () => {
    expect(() => parseFootageTime('1:75')).toThrow(/below 60/);
    expect(() => parseFootageTime('abc')).toThrow(/write seconds/);
  });
});

describe('go-to targets', () => {
  const pts = Array.from({ length: 25 * 600 }, (_, i) => i / 25); // 10 min at 25 fps
  const fit: ClockFit = { source: 'footage', method: 'huber', segments: [seg(1, 30, 250, -30, 1), seg(2, 300, 520, -300.5, 1.0001)] };
  const clocks: MatchClocks = { fit, tracking: { rate: 25, periods: [{ period: 1, firstFrame: 1000, frameCount: 25 * 230 }, { period: 2, firstFrame: 9000, frameCount: 25 * 230 }] } };
  const inp = { pts, nominalFps: 25, rate: timecodeRateOf(25, false), clocks };

  it('footage frame, timecode and footage time', () => {
    expect(goToTarget('frame', '1500', inp)).toEqual({ frame: 1500 });
    expect(goToTarget('timecode', '00:01:00:00', inp)).toEqual({ frame: 1500 });
    expect(goToTarget('footage', '1:00.5', inp)).toEqual({ t: 60.5 });
    expect(() => goToTarget('frame', '15000', inp)).toThrow(/after the last frame \(14999/);
    expect(() => goToTarget('timecode', '00:01:00;00', inp)).toThrow(ClockInputError);
    expect(() => goToTarget('footage', '10:01', inp)).toThrow(/after the end/);
  });
  it('match clock and tracking frame through the fit (first period from 00:00, second from 45:00)', () => {
    // Period 1: tracking t = footage - 30, no event fit: match clock = tracking time.
    expect(goToTarget('match', '02:00.0', inp)).toEqual({ t: 150 });
    // Period 2: footage = (t + 300.5) / 1.0001 with t = 47:10 - 45:00 = 130 s.
    const t2 = goToTarget('match', '47:10', inp) as { t: number };
    expect(t2.t).toBeCloseTo((130 + 300.5) / 1.0001, 9);
    // First-period added time needs the period named.
    expect((goToTarget('match', 'p1 03:00', inp) as { t: number }).t).toBe(210);
    expect(() => goToTarget('match', 'p2 10:00', inp)).toThrow(/before the start of period 2/);
    // Tracking frame 1000 + 25*60 is tracking t = 60 s of period 1 -> footage 90 s.
    expect((goToTarget('tracking', String(1000 + 1500), inp) as { t: number }).t).toBeCloseTo(90, 9);
    expect(() => goToTarget('tracking', '500', inp)).toThrow(/not in any period/);
    expect(() => goToTarget('match', '44:00', { ...inp, clocks: {} })).toThrow(/no footage clock fit/);
  });
  it('readouts are the inverse of go-to', () => {
    const r = matchReadout(clocks, 90)!;
    expect(r).toMatchObject({ period: 1, trackingFrame: 2500, matchClock: '01:00.0' });
    const t2 = (goToTarget('match', '47:10.4', inp) as { t: number }).t;
    expect(matchReadout(clocks, t2)!.matchClock).toBe('47:10.4');
    expect(matchReadout(clocks, 10)).toBeUndefined(); // lead-in: not live
  });
  it('a match clock at 45:00 or later is the second period unless named', () => {
    expect(parseMatchClock('45:00', [1, 2])).toEqual({ period: 2, t: 0 });
    expect(parseMatchClock('44:59.9', [1, 2]).period).toBe(1);
    expect(parseMatchClock('46:00', [1])).toEqual({ period: 1, t: 2760 });
  });
});

describe('player keys', () => {
  it('maps the documented keys and leaves Ctrl/Alt combinations to the app', () => {
    expect(playerActionOf({ key: ' ' })).toEqual({ kind: 'toggle' });
    expect(playerActionOf({ key: 'ArrowRight' })).toEqual({ kind: 'step', frames: 1 });
    expect(playerActionOf({ key: ',' })).toEqual({ kind: 'step', frames: -1 });
    expect(playerActionOf({ key: 'ArrowLeft', shiftKey: true })).toEqual({ kind: 'jump', seconds: -5 });
    expect(playerActionOf({ key: 'L' })).toEqual({ kind: 'shuttle', direction: 1 });
    expect(playerActionOf({ key: 'j' })).toEqual({ kind: 'shuttle', direction: -1 });
    expect(playerActionOf({ key: 'k' })).toEqual({ kind: 'stop' });
    expect(playerActionOf({ key: '1', altKey: true })).toBeUndefined();
    expect(playerActionOf({ key: 'z', ctrlKey: true })).toBeUndefined();
  });
});
