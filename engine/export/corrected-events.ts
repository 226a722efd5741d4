/**
 * The corrected event log: one row per logged event with the logged and the corrected
 * values side by side, the correction's status and confidence.
 *
 * Corrected = what the analyst decided: an accepted proposal's time and place, an edit's,
 * otherwise (proposed, rejected, no proposal) the logged time put on the tracking clock
 * through the clock fit and the logged place. All times of the corrected side are on the
 * tracking clock (seconds since the period's first frame); the logged side is as logged.
 *
 *   correctedEventRows([{ logged, current, correction }], fit) → [{ event_id: 'e1', logged_t_s: 12.4, corrected_t_s: 13.9, status: 'accepted', … }]
 */
import type { ChangeKind, ClockFit, CorrectionStatus, MatchEvent, PeriodId, ProposedCorrection } from '../../shared-types/domain.ts';
import { mapTime } from '../fit/clock.ts';

export interface EventWithCorrection {
  logged: MatchEvent;
  /** The event as currently corrected in its own clock (analyst edits of the event itself). */
  current?: MatchEvent;
  correction?: {
    status: CorrectionStatus;
    proposal: ProposedCorrection;
    edited?: { period: PeriodId; t: number; x?: number; y?: number };
  };
}

export interface CorrectedEventRow {
  event_id: string;
  row: number;
  kind: string;
  logged_kind: string;
  team: string;
  player: string;
  logged_period: PeriodId;
  logged_clock: string;
  /** Seconds since the period's start, event clock, as logged. */
  logged_t_s: number;
  logged_x: number | null;
  logged_y: number | null;
  /** The logged time through the clock fit (tracking clock), before any correction. */
  fitted_t_s: number | null;
  proposed_t_s: number | null;
  proposed_x: number | null;
  proposed_y: number | null;
  corrected_period: PeriodId;
  corrected_t_s: number | null;
  corrected_x: number | null;
  corrected_y: number | null;
  /** Shift of the corrected time from the fitted logged time, s. */
  shift_s: number | null;
  status: CorrectionStatus | 'none';
  change: ChangeKind | 'none';
  confidence: number | null;
  reason: string;
}

const fin = (v: number | undefined | null): number | null => (v === undefined || v === null || !Number.isFinite(v) ? null : v);

export function correctedEventRows(events: EventWithCorrection[], fit: ClockFit | undefined): CorrectedEventRow[] {
  return events.map(({ logged, current, correction }) => {
    const cur = current ?? logged;
    const fitted = fit ? fin(mapTime(fit, logged.period, logged.t)) : null;
    const p = correction?.proposal;
    let corrected = { period: cur.period, t: fit ? fin(mapTime(fit, cur.period, cur.t)) : null, x: fin(cur.x), y: fin(cur.y) };
    if (correction?.status === 'accepted' && p)
      corrected = { period: p.trackingPeriod, t: fin(p.trackingTime), x: fin(p.x ?? cur.x), y: fin(p.y ?? cur.y) };
    else if (correction?.status === 'edited' && correction.edited) {
      const e = correction.edited;
      corrected = { period: e.period, t: fin(e.t), x: fin(e.x ?? p?.x ?? cur.x), y: fin(e.y ?? p?.y ?? cur.y) };
    }
    return {
      event_id: logged.id,
      row: logged.row,
      kind: logged.kind,
      logged_kind: logged.rawKind,
      team: logged.team ?? '',
      player: logged.player ?? '',
      logged_period: logged.period,
      logged_clock: clockText(logged),
      logged_t_s: logged.t,
      logged_x: fin(logged.x),
      logged_y: fin(logged.y),
      fitted_t_s: fitted,
      proposed_t_s: p?.placed ? fin(p.trackingTime) : null,
      proposed_x: p?.placed ? fin(p.x) : null,
      proposed_y: p?.placed ? fin(p.y) : null,
      corrected_period: corrected.period,
      corrected_t_s: corrected.t,
      corrected_x: corrected.x,
      corrected_y: corrected.y,
      shift_s: corrected.t !== null && fitted !== null ? corrected.t - fitted : null,
      status: correction?.status ?? 'none',
      change: p?.change ?? 'none',
      confidence: p ? fin(p.confidence) : null,
      reason: p?.reason ?? '',
    };
  });
}

/** The clock text as the file had it, when the importer kept the raw columns. */
function clockText(e: MatchEvent): string {
  for (const k of ['clock', 'time', 'match_time', 'timestamp']) if (e.raw?.[k]) return e.raw[k];
  return '';
}

export const CORRECTED_COLUMNS: (keyof CorrectedEventRow)[] = [
  'event_id', 'row', 'kind', 'logged_kind', 'team', 'player',
  'logged_period', 'logged_clock', 'logged_t_s', 'logged_x', 'logged_y',
  'fitted_t_s', 'proposed_t_s', 'proposed_x', 'proposed_y',
  'corrected_period', 'corrected_t_s', 'corrected_x', 'corrected_y', 'shift_s',
  'status', 'change', 'confidence', 'reason',
];

/** Decimals per column: times to the millisecond, places to the centimetre. */
const DECIMALS: Partial<Record<keyof CorrectedEventRow, number>> = {
  logged_t_s: 3, fitted_t_s: 3, proposed_t_s: 3, corrected_t_s: 3, shift_s: 3,
  logged_x: 2, logged_y: 2, proposed_x: 2, proposed_y: 2, corrected_x: 2, corrected_y: 2, confidence: 3,
};

/** RFC 4180: comma separated, CRLF line ends, fields with comma, quote or line break quoted, quotes doubled. */
export function csvField(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function correctedEventsCsv(rows: CorrectedEventRow[]): string {
  const lines = [CORRECTED_COLUMNS.join(',')];
  for (const r of rows)
    lines.push(
      CORRECTED_COLUMNS.map((c) => {
        const v = r[c];
        if (v === null) return '';
        if (typeof v === 'number') return DECIMALS[c] !== undefined ? Number(v.toFixed(DECIMALS[c])).toString() : String(v);
        return csvField(String(v));
      }).join(','),
    );
  return lines.join('\r\n') + '\r\n';
}

export function correctedEventsJson(rows: CorrectedEventRow[], meta: { title: string; generatedAt: string; clock: string }): string {
  return JSON.stringify({ format: 'whistlemark-corrected-events/1', ...meta, events: rows }, null, 1) + '\n';
}
