/**
 * An analyst's decision on one correction -> the rows it changes, for ONE history commit:
 * the correction row (status, edited value) and the event row's `current` copy (time,
 * place) change together, so undo puts both back.
 *
 * Times: a correction's times are on the tracking clock (seconds from the period's first
 * frame); the event's `current` stays on the event clock like the logged copy, so the
 * corrected time goes back through the clock fit: current.t = logged.t + (tTrk − tLoggedTrk)
 * / rate, where tLoggedTrk is the logged time through the same fit (the proposal's
 * predictedTime) and rate the fit's rate there. Rejecting or reopening puts the logged
 * time and place back.
 *
 *   decisionChanges({ type: 'accept' }, correctionRow, eventRow, fit, 25)
 *   // -> [{ table: 'corrections', key, after: {..., status: 'accepted'} }, { table: 'events', key, after: {..., current} }]
 */
import type { ClockFit, MatchEvent } from '../../../shared-types/index.ts';
import { segmentAt } from '../../../engine/fit/clock.ts';
import type { CorrectionRow, EventRow } from '../db/rows.ts';
import type { ChangeInput } from '../history/history.ts';
import { proposedPlace, proposedTime } from './queue.ts';

export type Decision =
  | { type: 'accept' }
  | { type: 'reject' }
  /** Back to an open proposal (the edit, if any, is dropped). */
  | { type: 'reopen' }
  /** Move the proposed moment by whole tracking frames (from the edited moment if there is one). */
  | { type: 'nudge'; frames: number }
  /** Put the proposed place somewhere else (pitch metres, centre origin). */
  | { type: 'place'; x: number; y: number };

export interface DecisionRows {
  correction: CorrectionRow;
  event: EventRow;
}

/** The tracking frame of tracking time t for a proposal (frames as numbered in the file). */
export function frameOf(c: CorrectionRow, t: number, rate: number): number {
  // The file's frame of the period's first frame, then frames on the same grid as the engine's.
  return c.proposal.trackingFrame - Math.round(c.proposal.trackingTime * rate) + Math.round(t * rate);
}

/** The event-clock time of tracking time tTrk for this event (see the header). */
export function eventClockTime(c: CorrectionRow, e: EventRow, tTrk: number, fit: ClockFit | undefined): number {
  const rate = (fit && segmentAt(fit, e.logged.period, e.logged.t)?.rate) || 1;
  return e.logged.t + (tTrk - c.proposal.predictedTime) / rate;
}

function withPlace(m: MatchEvent, x: number | undefined, y: number | undefined): MatchEvent {
  const out = { ...m };
  if (x === undefined) delete out.x;
  else out.x = x;
  if (y === undefined) delete out.y;
  else out.y = y;
  return out;
}

/** The rows after the decision (pure: the inputs are not changed). */
export function decide(d: Decision, correction: CorrectionRow, event: EventRow, fit: ClockFit | undefined, rate: number, now = Date.now()): DecisionRows {
  const base = { ...correction, updatedAt: now };
  delete base.edited;
  const logged = event.logged;
  const loggedBack: MatchEvent = withPlace({ ...event.current, period: logged.period, t: logged.t }, logged.x, logged.y);
  const placed = (c: CorrectionRow): MatchEvent => {
    const t = proposedTime(c);
    const p = proposedPlace(c);
    return withPlace({ ...event.current, period: c.edited?.period ?? c.proposal.trackingPeriod, t: eventClockTime(c, event, t, fit) }, p.x ?? logged.x, p.y ?? logged.y);
  };
  switch (d.type) {
    case 'accept': {
      const c: CorrectionRow = { ...base, status: 'accepted' };
      return { correction: c, event: { ...event, current: placed(c) } };
    }
    case 'reject':
      return { correction: { ...base, status: 'rejected' }, event: { ...event, current: loggedBack } };
    case 'reopen':
      return { correction: { ...base, status: 'proposed' }, event: { ...event, current: loggedBack } };
    case 'nudge':
    case 'place': {
      const t0 = proposedTime(correction);
      const p0 = proposedPlace(correction);
      // Nudges land on the tracking frame grid (t = k / rate from the period's first frame).
      const t = d.type === 'nudge' ? Math.round(t0 * rate + d.frames) / rate : t0;
      const x = d.type === 'place' ? d.x : p0.x;
      const y = d.type === 'place' ? d.y : p0.y;
      const c: CorrectionRow = {
        ...base,
        status: 'edited',
        edited: { period: correction.edited?.period ?? correction.proposal.trackingPeriod, t, ...(x !== undefined ? { x } : {}), ...(y !== undefined ? { y } : {}) },
      };
      return { correction: c, event: { ...event, current: placed(c) } };
    }
  }
}

/** The history changes of a decision. */
export function decisionChanges(d: Decision, correction: CorrectionRow, event: EventRow, fit: ClockFit | undefined, rate: number, now = Date.now()): ChangeInput[] {
  const r = decide(d, correction, event, fit, rate, now);
  return [
    { table: 'corrections', key: correction.id!, after: r.correction },
    { table: 'events', key: event.id!, after: r.event },
  ];
}

/** What the audit trail says about a decision. */
export function decisionWhat(d: Decision, e: EventRow, count = 1): string {
  const ev = `${e.kind.replace('_', ' ')} ${e.eventId} (row ${e.row})`;
  switch (d.type) {
    case 'accept':
      return count > 1 ? `accept ${count} corrections` : `accept correction of ${ev}`;
    case 'reject':
      return `reject correction of ${ev}`;
    case 'reopen':
      return `reopen correction of ${ev}`;
    case 'nudge':
      return `edit correction of ${ev}: ${d.frames > 0 ? '+' : ''}${d.frames} frame${Math.abs(d.frames) === 1 ? '' : 's'}`;
    case 'place':
      return `edit correction of ${ev}: place (${d.x.toFixed(1)}, ${d.y.toFixed(1)})`;
  }
}
