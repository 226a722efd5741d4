/**
 * The clocks the player reads out and accepts in its go-to field: footage time, footage
 * frame, SMPTE timecode (engine/timecode; drop-frame for 29.97/59.94), and, through the
 * newest footage clock fit, the tracking frame and the match clock.
 * No DOM here.
 *
 *   parseFootageTime('1:02.5')  -> 62.5
 *   timecodeRateOf(29.97, true) -> 30000/1001 drop-frame
 */
import type { ClockFit, PeriodId } from '../../../shared-types/index.ts';
import { footageToTracking, trackingToFootage } from '../../../engine/fit/footage-map.ts';
import { formatTimecode, frameToTimecode, framesPerDay, parseTimecode, timecodeRate, type TimecodeRate } from '../../../engine/timecode/index.ts';
import { matchClockText } from '../export-clips/plan.ts';

export type ClockKind = 'footage' | 'frame' | 'timecode' | 'match' | 'tracking';

export const CLOCK_LABELS: Record<ClockKind, string> = {
  footage: 'Footage time',
  frame: 'Footage frame',
  timecode: 'Timecode',
  match: 'Match clock',
  tracking: 'Tracking frame',
};

/** What the fit-dependent clocks need besides the footage's own table. */
export interface MatchClocks {
  /** Newest footage -> tracking fit for this footage file. */
  fit?: ClockFit;
  /** Newest event log -> tracking fit (the match clock is the event log's clock); absent = clocks taken as equal. */
  eventFit?: ClockFit;
  /** Tracking rate and each period's first frame number as numbered in the file. */
  tracking?: { rate: number; periods: { period: PeriodId; firstFrame: number; frameCount: number }[] };
}

export class ClockInputError extends Error {}

/**
 * The timecode rate of footage of this nominal rate. 29.97 and 59.94 are the 1000/1001
 * rates (SMPTE ST 12-1) and may count drop-frame; other rates count whole frames.
 */
export function timecodeRateOf(nominalFps: number, dropFrame: boolean): TimecodeRate {
  const whole = Math.max(1, Math.round(nominalFps));
  const ntsc = Math.abs(nominalFps - (whole * 1000) / 1001) < 0.005 && Math.abs(nominalFps - whole) > 0.005;
  if (ntsc) return timecodeRate(whole * 1000, 1001, dropFrame && (whole === 30 || whole === 60));
  return timecodeRate(whole);
}

/** Whether drop-frame counting exists for this footage (30000/1001 and 60000/1001 only). */
export function dropFrameApplies(nominalFps: number): boolean {
  return timecodeRateOf(nominalFps, true).dropFrame;
}

/** Timecode label of footage frame `index` (frame 0 = 00:00:00:00), wrapping after a day. */
export function timecodeOfFrame(index: number, rate: TimecodeRate): string {
  return formatTimecode(frameToTimecode(index % framesPerDay(rate), rate), rate);
}

/** `H:MM:SS.mmm` of footage seconds (hours only when needed). */
export function formatFootageTime(t: number): string {
  const ms = Math.round(Math.max(0, t) * 1000);
  const h = Math.floor(ms / 3_600_000);
  const m = Math.floor(ms / 60_000) % 60;
  const s = Math.floor(ms / 1000) % 60;
  const frac = String(ms % 1000).padStart(3, '0');
  const mm = String(m).padStart(2, '0');
  const ss = String(s).padStart(2, '0');
  return h > 0 ? `${h}:${mm}:${ss}.${frac}` : `${mm}:${ss}.${frac}`;
}

/** Seconds, `M:SS.s` or `H:MM:SS.s`; throws ClockInputError with what to write. */
export function parseFootageTime(text: string): number {
  const s = text.trim();
  const m = /^(?:(\d+):)?(?:(\d+):)?(\d+(?:\.\d+)?)$/.exec(s);
  if (!m) throw new ClockInputError(`footage time "${text}": write seconds (83.4), M:SS.s (1:23.4) or H:MM:SS.s`);
  const parts = [m[1], m[2], m[3]].filter((p) => p !== undefined).map(Number);
  const secs = parts[parts.length - 1];
  if (parts.length > 1 && secs >= 60) throw new ClockInputError(`footage time "${text}": seconds ${secs} must be below 60 after a colon`);
  if (parts.length === 3 && parts[1] >= 60) throw new ClockInputError(`footage time "${text}": minutes ${parts[1]} must be below 60 after hours`);
  return parts.reduce((acc, p) => acc * 60 + p, 0);
}

/** A whole non-negative number; throws ClockInputError naming the clock. */
function parseWhole(text: string, what: string): number {
  const s = text.trim();
  if (!/^\d+$/.test(s)) throw new ClockInputError(`${what} "${text}": write a whole number, e.g. 1250`);
  return Number(s);
}

/** Seconds before the period's start that the match clock counts from (second period from 45:00; Law 7, common practice). */
function periodBase(period: PeriodId): number {
  return period === 2 ? 45 * 60 : period === 3 ? 90 * 60 : period === 4 ? 105 * 60 : 0;
}

/** Event clock -> tracking clock through the event fit's segment for the period. */
function eventToTracking(eventFit: ClockFit | undefined, period: PeriodId, t: number): number {
  const seg = eventFit?.segments.find((s) => s.period === period);
  return seg ? seg.offset + seg.rate * t : t;
}
function trackingToEvent(eventFit: ClockFit | undefined, period: PeriodId, t: number): number {
  const seg = eventFit?.segments.find((s) => s.period === period && s.rate !== 0);
  return seg ? (t - seg.offset) / seg.rate : t;
}

export interface MatchReadout {
  period: PeriodId;
  /** Tracking seconds since the period's first tracking frame. */
  trackingT: number;
  trackingFrame?: number;
  /** `MM:SS.s`, the event log's clock (second period from 45:00). */
  matchClock: string;
}

/** Tracking and match clock at footage time t, or undefined outside the fit (lead-in, half-time) or without one. */
export function matchReadout(clocks: MatchClocks, footageT: number): MatchReadout | undefined {
  if (!clocks.fit) return undefined;
  const m = footageToTracking(clocks.fit, footageT);
  if (!m) return undefined;
  const p = clocks.tracking?.periods.find((q) => q.period === m.period);
  const trackingFrame = p && clocks.tracking ? p.firstFrame + Math.round(m.t * clocks.tracking.rate) : undefined;
  return { period: m.period, trackingT: m.t, trackingFrame, matchClock: matchClockText(m.period, trackingToEvent(clocks.eventFit, m.period, m.t)) };
}

/** Periods the fit covers, in order. */
function fittedPeriods(fit: ClockFit): PeriodId[] {
  return [...new Set(fit.segments.map((s) => s.period))].sort((a, b) => a - b);
}

/**
 * Match clock text -> period and event-clock seconds. Accepts `MM:SS(.s)`; a leading
 * `p1 ` / `p2 ` names the period (needed for added time, e.g. `p1 46:10`), otherwise
 * 45:00 and later is the second period when the fit has one.
 */
export function parseMatchClock(text: string, periods: PeriodId[]): { period: PeriodId; t: number } {
  const m = /^\s*(?:p(\d)\s+)?(\d{1,3}):(\d{1,2}(?:\.\d+)?)\s*$/i.exec(text);
  if (!m) throw new ClockInputError(`match clock "${text}": write MM:SS.s as the event log counts it (second period from 45:00), e.g. 52:10.4; add "p1 " for first-period added time`);
  const secs = Number(m[3]);
  if (secs >= 60) throw new ClockInputError(`match clock "${text}": seconds ${secs} must be below 60`);
  const total = Number(m[2]) * 60 + secs;
  let period: PeriodId;
  if (m[1]) period = Number(m[1]) as PeriodId;
  else {
    const bases = periods.filter((p) => periodBase(p) <= total);
    period = bases.length ? bases[bases.length - 1] : (periods[0] ?? 1);
  }
  if (periods.length && !periods.includes(period)) throw new ClockInputError(`match clock "${text}": period ${period} is not in the footage clock fit (it has ${periods.join(', ')})`);
  const t = total - periodBase(period);
  if (t < 0) throw new ClockInputError(`match clock "${text}": before the start of period ${period} (${matchClockText(period, 0)})`);
  return { period, t };
}

export interface GoToInput {
  pts: ArrayLike<number>;
  nominalFps: number;
  rate: TimecodeRate;
  clocks: MatchClocks;
}

export type GoToTarget = { frame: number } | { t: number };

/** Text typed in one clock -> a frame or a footage time to show. Throws ClockInputError saying what to write. */
export function goToTarget(kind: ClockKind, text: string, inp: GoToInput): GoToTarget {
  const last = inp.pts.length - 1;
  const inRange = (f: number, what: string) => {
    if (f > last) throw new ClockInputError(`${what} is after the last frame (${last}, ${formatFootageTime(inp.pts[last])})`);
    return { frame: f };
  };
  switch (kind) {
    case 'footage': {
      const t = parseFootageTime(text);
      const end = inp.pts[last] + 1 / (inp.nominalFps || 25);
      if (t >= end) throw new ClockInputError(`footage time ${formatFootageTime(t)} is after the end of the footage (${formatFootageTime(end)})`);
      return { t };
    }
    case 'frame':
      return inRange(parseWhole(text, 'footage frame'), `footage frame ${text.trim()}`);
    case 'timecode': {
      let f: number;
      try {
        f = parseTimecode(text.trim(), inp.rate);
      } catch (e) {
        throw new ClockInputError((e as Error).message);
      }
      return inRange(f, `timecode ${text.trim()} (frame ${f})`);
    }
    case 'match': {
      if (!inp.clocks.fit) throw new ClockInputError('match clock: there is no footage clock fit yet; mark the kick-offs on the Sync screen first');
      const { period, t } = parseMatchClock(text, fittedPeriods(inp.clocks.fit));
      const tTrk = eventToTracking(inp.clocks.eventFit, period, t);
      const tf = trackingToFootage(inp.clocks.fit, period, tTrk);
      if (tf === undefined) throw new ClockInputError(`match clock ${text.trim()}: period ${period} at that time is not covered by the footage clock fit`);
      return inFootage(tf, `match clock ${text.trim()}`, inp);
    }
    case 'tracking': {
      if (!inp.clocks.fit) throw new ClockInputError('tracking frame: there is no footage clock fit yet; mark the kick-offs on the Sync screen first');
      const n = parseWhole(text, 'tracking frame');
      const tr = inp.clocks.tracking;
      if (!tr) throw new ClockInputError('tracking frame: the project has no tracking imported');
      const p = tr.periods.find((q) => n >= q.firstFrame && n < q.firstFrame + q.frameCount);
      if (!p) throw new ClockInputError(`tracking frame ${n}: not in any period (${tr.periods.map((q) => `period ${q.period}: ${q.firstFrame}–${q.firstFrame + q.frameCount - 1}`).join('; ')})`);
      const tf = trackingToFootage(inp.clocks.fit, p.period, (n - p.firstFrame) / tr.rate);
      if (tf === undefined) throw new ClockInputError(`tracking frame ${n}: period ${p.period} at that time is not covered by the footage clock fit`);
      return inFootage(tf, `tracking frame ${n}`, inp);
    }
  }
}

/** A fitted footage time must fall inside this file (one file per half: the other half's moments are elsewhere). */
function inFootage(t: number, what: string, inp: GoToInput): GoToTarget {
  const end = inp.pts[inp.pts.length - 1] + 1 / (inp.nominalFps || 25);
  if (t < 0 || t >= end) throw new ClockInputError(`${what} is at footage ${t < 0 ? '-' : ''}${formatFootageTime(Math.abs(t))}, outside this footage file (00:00.000–${formatFootageTime(end)})`);
  return { t };
}
