/**
 * Clip lists as plain data: which events a filter picks, the clip each event gives with
 * its pre-roll and post-roll, merging clips that overlap, moving a clip in the order, and
 * whether a clip touches footage that is not live play. No database, no DOM: the Reels
 * screen turns these answers into history commits.
 *
 *   const picked = eventsMatching(events, { kinds: ['corner'], team: 'away' });
 *   const spans = spansFromEvents(picked, { preRoll: 5, postRoll: 8 }, eventFit);  // tracking clock
 *   mergeOverlapping(spans)            // -> fewer spans, event ids joined
 */
import type { ClockFit, EventKind, MatchEvent, PeriodId, TeamSide } from '../../../shared-types/index.ts';
import type { EventRow } from '../db/rows.ts';

export interface EventFilter {
  kinds?: EventKind[];
  team?: TeamSide;
  /** Player label as in the log (shirt number or id). */
  player?: string;
  period?: PeriodId;
  /** Event-clock seconds since the period's start, inclusive. */
  fromT?: number;
  toT?: number;
  /** 'corrected': current differs from logged; 'uncorrected': unchanged; absent: either. */
  corrected?: 'corrected' | 'uncorrected';
}

/** True when the analyst's corrections moved the event in time or place. */
export function isCorrected(e: Pick<EventRow, 'logged' | 'current'>): boolean {
  const a = e.logged;
  const b = e.current;
  return a.t !== b.t || a.period !== b.period || a.x !== b.x || a.y !== b.y;
}

export function eventsMatching<E extends Pick<EventRow, 'logged' | 'current'>>(events: E[], f: EventFilter): E[] {
  return events.filter((row) => {
    const e = row.current;
    if (f.kinds?.length && !f.kinds.includes(e.kind)) return false;
    if (f.team && e.team !== f.team) return false;
    if (f.player && (e.player ?? '').trim() !== f.player.trim()) return false;
    if (f.period !== undefined && e.period !== f.period) return false;
    if (f.fromT !== undefined && e.t < f.fromT) return false;
    if (f.toT !== undefined && e.t > f.toT) return false;
    if (f.corrected === 'corrected' && !isCorrected(row)) return false;
    if (f.corrected === 'uncorrected' && isCorrected(row)) return false;
    return true;
  });
}

/**
 * Event clock -> tracking clock through the event log's clock fit (the segment of the
 * event's period nearest to the time). Without a fit the clocks are taken as equal.
 */
export function eventToTracking(fit: ClockFit | undefined, period: PeriodId, t: number): number {
  const segs = fit?.segments.filter((s) => s.period === period) ?? [];
  if (!segs.length) return t;
  let best = segs[0];
  let bestD = Infinity;
  for (const s of segs) {
    const d = t < s.fromT ? s.fromT - t : t > s.toT ? t - s.toT : 0;
    if (d < bestD) {
      best = s;
      bestD = d;
    }
  }
  return best.offset + best.rate * t;
}

/** A clip's place on the tracking clock plus what it was built from. */
export interface ClipSpan {
  period: PeriodId;
  from: number;
  to: number;
  eventIds: string[];
  preRoll: number;
  postRoll: number;
  title: string;
}

export interface RollOptions {
  preRoll: number;
  postRoll: number;
}

const KIND_WORDS: Record<string, string> = { kick_off: 'Kick-off', goal_kick: 'Goal kick', throw_in: 'Throw-in', free_kick: 'Free kick' };
export function kindWord(k: string): string {
  return KIND_WORDS[k] ?? k.charAt(0).toUpperCase() + k.slice(1).replace(/_/g, ' ');
}

/** Title of a clip made from one event, e.g. "Corner · away 7 · 2nd 12:04". */
export function eventTitle(e: MatchEvent): string {
  const who = [e.team, e.player].filter(Boolean).join(' ');
  return [kindWord(e.kind), who, matchClockText(e.period, e.t).replace(/\.\d$/, '')].filter(Boolean).join(' · ');
}

/** Match clock text of event-clock seconds: the second period counts on from 45:00 (Law 7, common practice). */
export function matchClockText(period: PeriodId, t: number): string {
  const base = period === 2 ? 45 * 60 : period === 3 ? 90 * 60 : period === 4 ? 105 * 60 : 0;
  // Tenths cut, not rounded, as a running clock shows them (59.97 s is still 00:59.9).
  const tenths = Math.floor(Math.max(0, base + t) * 10 + 1e-6);
  const m = Math.floor(tenths / 600);
  const rest = tenths - m * 600;
  return `${String(m).padStart(2, '0')}:${String(Math.floor(rest / 10)).padStart(2, '0')}.${rest % 10}`;
}


/** m:ss of seconds since a period's start. */
export function clockText(s: number): string {
  const v = Math.max(0, Math.round(s));
  return `${Math.floor(v / 60)}:${String(v % 60).padStart(2, '0')}`;
}

/** One span per event, in event order (period, then time). Rolls are clamped at 0 s. */
export function spansFromEvents(events: MatchEvent[], roll: RollOptions, fit?: ClockFit): ClipSpan[] {
  if (!(roll.preRoll >= 0) || !(roll.postRoll >= 0)) throw new RangeError(`pre-roll ${roll.preRoll} s / post-roll ${roll.postRoll} s: both must be 0 or more seconds`);
  return [...events]
    .sort((a, b) => a.period - b.period || a.t - b.t)
    .map((e) => {
      const t = eventToTracking(fit, e.period, e.t);
      return {
        period: e.period,
        from: Math.max(0, t - roll.preRoll),
        to: t + roll.postRoll,
        eventIds: [e.id],
        preRoll: roll.preRoll,
        postRoll: roll.postRoll,
        title: eventTitle(e),
      };
    });
}

/** A span from in/out points (tracking clock), e.g. marked with I and O on the player. */
export function spanFromPoints(period: PeriodId, inT: number, outT: number, title = 'Marked clip'): ClipSpan {
  if (!(outT > inT)) throw new RangeError(`out point ${outT.toFixed(2)} s is not after in point ${inT.toFixed(2)} s: mark the in point first, then a later out point`);
  return { period, from: inT, to: outT, eventIds: [], preRoll: 0, postRoll: 0, title };
}

/**
 * Joins spans of the same period that overlap (or touch within `gap` seconds) into one,
 * keeping the first span's place in the order; titles and event ids are joined.
 * Returns the groups as indices into `spans` so a caller can keep one row and delete the rest.
 */
export function overlapGroups(spans: Pick<ClipSpan, 'period' | 'from' | 'to'>[], gap = 0): number[][] {
  const byStart = spans.map((_, i) => i).sort((a, b) => spans[a].period - spans[b].period || spans[a].from - spans[b].from);
  const groups: number[][] = [];
  let cur: number[] = [];
  let curEnd = -Infinity;
  let curPeriod: PeriodId | undefined;
  for (const i of byStart) {
    const s = spans[i];
    if (cur.length && s.period === curPeriod && s.from <= curEnd + gap) {
      cur.push(i);
      curEnd = Math.max(curEnd, s.to);
    } else {
      if (cur.length) groups.push(cur);
      cur = [i];
      curEnd = s.to;
      curPeriod = s.period;
    }
  }
  if (cur.length) groups.push(cur);
  return groups.map((g) => g.sort((a, b) => a - b));
}

export function mergeOverlapping(spans: ClipSpan[], gap = 0): ClipSpan[] {
  return overlapGroups(spans, gap)
    .sort((a, b) => a[0] - b[0])
    .map((g) => {
      const parts = g.map((i) => spans[i]);
      return {
        period: parts[0].period,
        from: Math.min(...parts.map((p) => p.from)),
        to: Math.max(...parts.map((p) => p.to)),
        eventIds: [...new Set(parts.flatMap((p) => p.eventIds))],
        preRoll: parts[0].preRoll,
        postRoll: parts[0].postRoll,
        title: parts.length === 1 ? parts[0].title : `${parts[0].title} (+${parts.length - 1})`,
      };
    });
}

/** The order after moving item `from` to position `to` (both indices into `ids`). */
export function moveInOrder<T>(ids: T[], from: number, to: number): T[] {
  const out = [...ids];
  if (from < 0 || from >= out.length) return out;
  const [x] = out.splice(from, 1);
  out.splice(Math.max(0, Math.min(out.length, to)), 0, x);
  return out;
}

/** Footage seconds [fromT, toT) that show no live play. */
export interface NonLiveSpan {
  fromT: number;
  toT: number;
  kind: string;
}

/**
 * Non-live stretches a clip's footage span [fromF, toF] touches: confirmed or proposed
 * intervals and the fit's gaps (footage between two fitted segments, e.g. a replay that
 * replaced live play or half-time).
 */
export function nonLiveTouched(fromF: number, toF: number, intervals: NonLiveSpan[], fit?: ClockFit): NonLiveSpan[] {
  const all = [...intervals, ...(fit ? fitGaps(fit) : [])];
  // A stretch ending exactly where the clip starts counts: the clip was cut short by it.
  return all.filter((n) => n.fromT < toF + 0.05 && n.toT > fromF - 0.05);
}

/** Footage between consecutive segments of a footage fit (nothing there maps to tracking). */
export function fitGaps(fit: ClockFit): NonLiveSpan[] {
  const segs = [...fit.segments].sort((a, b) => a.fromT - b.fromT);
  const out: NonLiveSpan[] = [];
  for (let i = 1; i < segs.length; i++) {
    if (segs[i].fromT - segs[i - 1].toT > 0.08) out.push({ fromT: segs[i - 1].toT, toT: segs[i].fromT, kind: segs[i].period !== segs[i - 1].period ? 'half_time' : 'replay' });
  }
  return out;
}
