/**
 * Event clock readers: match clock "MM:SS(.s)" (also "H:MM:SS", "45+2:10" for stoppage),
 * plain seconds, and ISO-8601 wall clock (parsed by date-fns parseISO, which follows the
 * standard's basic and extended formats).
 */
import { parseISO } from 'date-fns';

const MATCH_CLOCK = /^\s*(\d{1,3})(?:\+(\d{1,2}))?:(\d{1,2})(?::(\d{1,2}))?(?:[.,](\d+))?\s*$/;

/**
 * Seconds shown by a match clock. "45+2:10" reads as 47:10 (stoppage added to the minute).
 * NaN when the text is not a clock.
 */
export function parseMatchClock(s: string): number {
  const m = MATCH_CLOCK.exec(s);
  if (!m) return NaN;
  const frac = m[5] ? Number('0.' + m[5]) : 0;
  if (m[4] !== undefined) {
    // H:MM:SS
    const [h, mi, se] = [Number(m[1]), Number(m[3]), Number(m[4])];
    if (mi > 59 || se > 59) return NaN;
    return h * 3600 + mi * 60 + se + frac;
  }
  const minutes = Number(m[1]) + (m[2] ? Number(m[2]) : 0);
  const seconds = Number(m[3]);
  if (seconds > 59) return NaN;
  return minutes * 60 + seconds + frac;
}

export const looksLikeMatchClock = (s: string): boolean => MATCH_CLOCK.test(s);

/** ISO-8601 date-time: must carry a date and a time part (wall clock). */
export const looksLikeIso = (s: string): boolean => /^\s*\d{4}-?\d{2}-?\d{2}[T ]\d{2}/.test(s);

/** Milliseconds since the epoch for an ISO-8601 date-time, NaN when unparseable. */
export function parseIsoMs(s: string): number {
  if (!looksLikeIso(s)) return NaN;
  const d = parseISO(s.trim());
  const ms = d.getTime();
  return Number.isFinite(ms) ? ms : NaN;
}

/** Usual period starts on a continuing match clock (Law 7: 45-minute halves; extra time 15). */
export const CONTINUING_STARTS_S: Record<number, number> = { 1: 0, 2: 2700, 3: 5400, 4: 6300, 5: 7200 };
