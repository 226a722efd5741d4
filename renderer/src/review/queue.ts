/**
 * The review queue: proposed corrections joined with their events, ordered by how much
 * they matter, filtered the way the analyst asks, and counted.
 *
 * Weight = size of the change × confidence, where size is the time shift in seconds plus
 * the place shift at 5 m per second (a rough running speed, (common practice)), so a
 * restart moved 10 m weighs like one moved 2 s. Restarts (and period starts) come first:
 * they anchor the clock and open every clip.
 *
 *   orderQueue(buildQueue(corrections, events))  // -> restarts by weight, then the rest by weight
 */
import { isRestartKind, type EventKind, type PeriodId, type TeamSide } from '../../../shared-types/index.ts';
import type { CorrectionRow, EventRow } from '../db/rows.ts';

/** Metres of place shift that weigh as one second of time shift. */
export const METRES_PER_SECOND = 5;

export interface QueueItem {
  correction: CorrectionRow;
  event: EventRow;
  kind: EventKind;
  team?: TeamSide;
  period: PeriodId;
  /** Tracking clock: the logged time through the clock fit, and the proposed (or edited) time. */
  loggedT: number;
  proposedT: number;
  /** Proposed minus logged, seconds. */
  shiftS: number;
  /** Metres between the logged and the proposed place (0 when either is unknown). */
  placeShiftM: number;
  /** Seconds-equivalent size of the change. */
  size: number;
  confidence: number;
  weight: number;
  restart: boolean;
  open: boolean;
}

export function proposedPlace(c: CorrectionRow): { x?: number; y?: number } {
  const x = c.edited?.x ?? c.proposal.x;
  const y = c.edited?.y ?? c.proposal.y;
  return { ...(x !== undefined ? { x } : {}), ...(y !== undefined ? { y } : {}) };
}

export function proposedTime(c: CorrectionRow): number {
  return c.edited?.t ?? c.proposal.trackingTime;
}

export function queueItem(correction: CorrectionRow, event: EventRow): QueueItem {
  const loggedT = correction.proposal.predictedTime;
  const proposedT = proposedTime(correction);
  const p = proposedPlace(correction);
  const lx = event.logged.x, ly = event.logged.y;
  const placeShiftM = p.x !== undefined && p.y !== undefined && lx !== undefined && ly !== undefined ? Math.hypot(p.x - lx, p.y - ly) : 0;
  const shiftS = proposedT - loggedT;
  const size = Math.abs(shiftS) + placeShiftM / METRES_PER_SECOND;
  const confidence = correction.proposal.confidence;
  return {
    correction, event, kind: event.kind, ...(event.logged.team ? { team: event.logged.team } : {}), period: event.period,
    loggedT, proposedT, shiftS, placeShiftM, size, confidence, weight: size * confidence,
    restart: isRestartKind(event.kind) || event.kind === 'period_start', open: correction.status === 'proposed',
  };
}

/** Joins corrections with their events (corrections whose event is gone are left out). */
export function buildQueue(corrections: CorrectionRow[], events: EventRow[]): QueueItem[] {
  const byKey = new Map(events.map((e) => [`${e.sourceId}/${e.eventId}`, e]));
  const out: QueueItem[] = [];
  for (const c of corrections) {
    const e = byKey.get(`${c.sourceId}/${c.eventId}`);
    if (e) out.push(queueItem(c, e));
  }
  return out;
}

/** Restarts first, then by weight (heaviest first); ties in match order. */
export function orderQueue(items: QueueItem[]): QueueItem[] {
  return [...items].sort(
    (a, b) => Number(b.restart) - Number(a.restart) || b.weight - a.weight || a.period - b.period || a.loggedT - b.loggedT || a.event.row - b.event.row,
  );
}

export interface QueueFilter {
  /** Empty: every kind. */
  kinds: EventKind[];
  team: 'all' | TeamSide | 'none';
  period: 'all' | PeriodId;
  /** Only changes at least this big (seconds-equivalent, see METRES_PER_SECOND). */
  minSize: number;
  status: 'all' | 'open' | 'decided';
}

export const NO_FILTER: QueueFilter = { kinds: [], team: 'all', period: 'all', minSize: 0, status: 'all' };

export function matchesFilter(item: QueueItem, f: QueueFilter): boolean {
  if (f.kinds.length && !f.kinds.includes(item.kind)) return false;
  if (f.team === 'none' ? item.team !== undefined : f.team !== 'all' && item.team !== f.team) return false;
  if (f.period !== 'all' && item.period !== f.period) return false;
  if (item.size < f.minSize) return false;
  if (f.status === 'open' && !item.open) return false;
  if (f.status === 'decided' && item.open) return false;
  return true;
}

export function filterQueue(items: QueueItem[], f: QueueFilter): QueueItem[] {
  return items.filter((i) => matchesFilter(i, f));
}

export interface QueueCounts {
  done: number;
  left: number;
  accepted: number;
  rejected: number;
  edited: number;
}

export function countQueue(items: QueueItem[]): QueueCounts {
  const c: QueueCounts = { done: 0, left: 0, accepted: 0, rejected: 0, edited: 0 };
  for (const i of items) {
    const s = i.correction.status;
    if (s === 'proposed') c.left++;
    else {
      c.done++;
      c[s]++;
    }
  }
  return c;
}

/** Open items in the filter whose confidence is at least `min` (what "accept all above" takes). */
export function openAbove(items: QueueItem[], min: number): QueueItem[] {
  return items.filter((i) => i.open && i.confidence >= min);
}

/** Index of the next open item after `from` (wrapping), or -1 when none is open. */
export function nextOpen(items: QueueItem[], from: number): number {
  for (let k = 1; k <= items.length; k++) {
    const i = (from + k + items.length) % items.length;
    if (items[i].open) return i;
  }
  return -1;
}
