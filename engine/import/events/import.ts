/**
 * importEvents: event log rows -> MatchEvent list (period + seconds since the period's
 * start as logged, canonical kind, side, centre-origin metres). Rows are small, so they are
 * kept until the end, where ISO wall-clock times get their period starts.
 */
import type { EventKind, EventLog, MatchEvent, TeamSide } from '../../../shared-types/domain.ts';
import type { EventMapping, ImportOptions, ImportResult } from '../../../shared-types/import.ts';
import { makeConverter } from '../coordinates.ts';
import { makeKindLookup } from '../kind-names.ts';
import { throwIfAborted } from '../text/abort.ts';
import { isMissingToken, parseNumber } from '../text/numbers.ts';
import { MAX_REJECTED_SHARE, ProblemLog } from '../text/problems.ts';
import { ProgressCounter } from '../text/progress.ts';
import { parsePeriodLabel } from '../tracking/fields.ts';
import { CONTINUING_STARTS_S, parseIsoMs, parseMatchClock } from './clock.ts';
import { csvRows, jsonRows, type RowSink } from './rows.ts';

interface Pending {
  line: number;
  row: number;
  period: number;
  /** Clock value: seconds, or ms since the epoch for ISO. */
  clock: number;
  kind: EventKind;
  rawKind: string;
  raw: Record<string, string>;
  team?: TeamSide;
  player?: string;
  xy: (number | undefined)[];
}

const OFF_PITCH_MARGIN_M = 15;

export async function importEvents(chunks: AsyncIterable<string>, opts: ImportOptions<EventMapping>): Promise<ImportResult<EventLog>> {
  const m = opts.mapping;
  const c = m.columns;
  const log = new ProblemLog(opts.fileName);
  const progress = new ProgressCounter(opts.bytesTotal ?? 0, opts.onProgress);
  const lookupKind = makeKindLookup(m.kindNames ?? {});
  const conv = makeConverter(m.coordinates);
  const teamNames = new Map(Object.entries(m.teamNames ?? {}));
  const unknownKinds = new Set<string>();
  const pending: Pending[] = [];
  let columns: string[] = [];
  let headerOk = true;
  let rows = 0;

  const reject = (line: number, text: string, reason: string): void => {
    log.reject(line, text.slice(0, 500), reason);
    log.warn('rejected-row', { line, message: `Row skipped: ${reason}.`, hint: 'Skipped rows are listed with the import; save them to check.' });
  };

  const sideOf = (name: string, line: number): TeamSide | undefined => {
    if (!name) return undefined;
    const known = teamNames.get(name);
    if (known) return known;
    const lower = name.trim().toLowerCase();
    if (lower === 'home' || lower === 'away') return lower;
    const used = new Set(teamNames.values());
    if (used.size >= 2) {
      log.warn('third-team', { line, column: c.team, message: `Team "${name}" is a third team name; the event keeps no side.`, hint: 'Map it to home or away in the team names.' });
      return undefined;
    }
    const side: TeamSide = used.has('home') ? 'away' : 'home';
    teamNames.set(name, side);
    log.warn('team-order', { line, column: c.team, message: `Team "${name}" taken as ${side} (order of first appearance, home first).`, hint: 'Change it in the team names if that is wrong.' });
    return side;
  };

  const coord = (raw: Record<string, string>, col: string | undefined, line: number, axis: 'x' | 'y'): number | undefined => {
    if (!col) return undefined;
    const s = raw[col] ?? '';
    if (isMissingToken(s)) return undefined;
    const v = parseNumber(s);
    if (!Number.isFinite(v)) {
      log.warn('bad-number', { line, column: col, message: `"${s.slice(0, 30)}" is not a number; the position is left empty.`, hint: 'Missing values may be empty, NaN or NA.' });
      return undefined;
    }
    return axis === 'x' ? conv.x(v) : conv.y(v);
  };

  const sink: RowSink = {
    header(cols) {
      columns = cols;
      for (const [what, name] of [['time', c.time], ['kind', c.kind]] as const) {
        if (!name) {
          log.error('missing-column', { line: 1, message: `No ${what} column is chosen in the mapping.`, hint: `Pick the column holding the event ${what}.` });
          headerOk = false;
        } else if (!cols.includes(name) && (m.format === 'csv' || cols.length > 0)) {
          log.error('missing-column', { line: 1, column: name, message: `Column "${name}" (${what}) is not in the file.`, hint: `The file has: ${cols.slice(0, 12).join(', ')}. Fix the mapping.` });
          headerOk = false;
        }
      }
      for (const name of [c.period, c.team, c.player, c.x, c.y, c.endX, c.endY]) {
        if (name && !cols.includes(name) && m.format === 'csv') {
          log.error('missing-column', { line: 1, column: name, message: `Column "${name}" is not in the file.`, hint: 'Clear it in the mapping or fix the header.' });
          headerOk = false;
        }
      }
    },
    bad(line, text, reason) {
      rows++;
      reject(line, text, reason);
    },
    row(raw, line, text) {
      rows++;
      if (!headerOk) return;
      let period = 0;
      if (c.period) {
        period = parsePeriodLabel(raw[c.period] ?? '');
        if (!period) return reject(line, text, `unknown period "${(raw[c.period] ?? '').slice(0, 20)}"`);
      }
      const timeText = (raw[c.time] ?? '').trim();
      const clock = m.clock === 'iso8601' ? parseIsoMs(timeText) : m.clock === 'seconds' ? parseNumber(timeText) : parseMatchClock(timeText);
      if (!Number.isFinite(clock) || (m.clock !== 'iso8601' && clock < 0)) return reject(line, text, `time "${timeText.slice(0, 30)}" is not a ${clockWord(m.clock)}`);
      const rawKind = (raw[c.kind] ?? '').trim();
      let kind = lookupKind(rawKind);
      if (!kind) {
        kind = 'other';
        if (!unknownKinds.has(rawKind)) {
          unknownKinds.add(rawKind);
          log.warn('unknown-kind', { line, column: c.kind, message: `Event name "${rawKind.slice(0, 40)}" is not in the kind names; taken as other.`, hint: 'Add it to the kind names to give it a kind.' });
        }
      }
      const team = c.team ? sideOf((raw[c.team] ?? '').trim(), line) : undefined;
      const player = c.player ? (raw[c.player] ?? '').trim() || undefined : undefined;
      pending.push({
        line,
        row: rows,
        period,
        clock,
        kind,
        rawKind,
        raw,
        team,
        player,
        xy: [coord(raw, c.x, line, 'x'), coord(raw, c.y, line, 'y'), coord(raw, c.endX, line, 'x'), coord(raw, c.endY, line, 'y')],
      });
    },
  };

  throwIfAborted(opts.signal);
  const source = m.format === 'json' ? jsonRows(sink) : csvRows(m.delimiter ?? ',', sink);
  let firstChunk = true;
  for await (let chunk of chunks) {
    throwIfAborted(opts.signal);
    if (firstChunk && chunk.charCodeAt(0) === 0xfeff) chunk = chunk.slice(1);
    firstChunk = false;
    source.push(chunk);
    progress.rows = rows;
    progress.chunk(chunk);
  }
  source.end();
  throwIfAborted(opts.signal);
  progress.report('normalising');

  if (!columns.length && !log.hasErrors()) log.error('empty', { message: 'The file has no rows.', hint: 'Choose the event log itself.' });
  if (headerOk && pending.length === 0 && !log.hasErrors()) log.error('no-events', { message: 'No event could be read.', hint: 'See the skipped rows; the mapping may not fit the file.' });
  if (log.rejectedCount > 0 && log.rejectedCount > rows * MAX_REJECTED_SHARE) {
    log.error('too-many-rejected', { message: `${log.rejectedCount} of ${rows} rows could not be read.`, hint: 'The mapping probably does not fit this file; see the skipped rows.' });
  }
  const events = log.hasErrors() ? [] : placeEvents(pending, m, log);
  throwIfAborted(opts.signal);
  const problems = log.finish();
  progress.report('done');
  if (log.hasErrors()) {
    return { ok: false, problems, rejectedRows: log.rejectedRows, rows };
  }
  const teams: EventLog['teams'] = {};
  for (const [name, side] of teamNames) if (!teams[side] && name.toLowerCase() !== side) teams[side] = name;
  return { ok: true, data: { pitch: m.coordinates.pitch, teams, columns, events }, problems, rejectedRows: log.rejectedRows, rows };
}

const clockWord = (s: EventMapping['clock']): string =>
  s === 'iso8601' ? 'ISO-8601 date-time' : s === 'seconds' ? 'number of seconds' : 'match clock (MM:SS)';

/** Periods (from column or period_start rows) and seconds since each period's start. */
function placeEvents(pending: Pending[], m: EventMapping, log: ProblemLog): MatchEvent[] {
  // Periods without a column: each period_start row opens the next period.
  if (!m.columns.period) {
    let p = 0;
    let sawStart = false;
    for (const e of pending) {
      if (e.kind === 'period_start') {
        p++;
        sawStart = true;
      }
      e.period = Math.max(1, Math.min(p, 5));
    }
    if (!sawStart) log.warn('no-periods', { message: 'No period column and no period-start rows: every event is taken as period 1.', hint: 'Choose the period column in the mapping.' });
  }
  const starts = new Map<number, number>();
  if (m.clock === 'iso8601') {
    for (const e of pending) if (e.kind === 'period_start' && !starts.has(e.period)) starts.set(e.period, e.clock);
    for (const e of pending) {
      if (!starts.has(e.period)) {
        starts.set(e.period, e.clock);
        log.warn('period-start', { line: e.line, message: `Period ${e.period} has no period-start row; its first row is taken as the start.`, hint: 'Add a period start row if the first event is not at the start.' });
      }
    }
  } else if (m.clock === 'match_clock_continuing' || m.periodStartsS) {
    const table = { ...CONTINUING_STARTS_S, ...(m.periodStartsS ?? {}) };
    for (const [p, s] of Object.entries(table)) starts.set(Number(p), s);
  }
  const out: MatchEvent[] = [];
  const lastT = new Map<number, number>();
  let restartWarned = false;
  for (const e of pending) {
    const start = starts.get(e.period) ?? 0;
    const t = m.clock === 'iso8601' ? (e.clock - start) / 1000 : e.clock - start;
    if (m.clock === 'match_clock_continuing' && t < -60 && !restartWarned) {
      restartWarned = true;
      log.error('clock-restarts', {
        line: e.line,
        column: m.columns.time,
        time: e.raw[m.columns.time],
        message: `Period ${e.period} shows ${e.raw[m.columns.time]}, before its start at ${start / 60}:00: the clock seems to restart in each period.`,
        hint: 'Choose the clock style "restarting at 0:00 each period".',
      });
    }
    const prev = lastT.get(e.period);
    if (prev !== undefined && t < prev - 5) log.warn('out-of-order', { line: e.line, time: e.raw[m.columns.time], message: `Event at ${t.toFixed(1)} s comes after one at ${prev.toFixed(1)} s in period ${e.period}.`, hint: 'Rows are kept in file order; sort the log if that is wrong.' });
    lastT.set(e.period, Math.max(prev ?? -Infinity, t));
    const [x, y, endX, endY] = e.xy;
    const halfL = m.coordinates.pitch.length / 2 + OFF_PITCH_MARGIN_M;
    const halfW = m.coordinates.pitch.width / 2 + OFF_PITCH_MARGIN_M;
    if ((x !== undefined && Math.abs(x) > halfL) || (y !== undefined && Math.abs(y) > halfW)) {
      log.warn('off-pitch', { line: e.line, message: `Position (${x?.toFixed(1)}, ${y?.toFixed(1)}) m is far off the pitch.`, hint: 'Check the coordinate grid in the mapping.' });
    }
    const ev: MatchEvent = { id: `e${e.row}`, row: e.row, period: e.period, t, kind: e.kind, rawKind: e.rawKind, raw: e.raw };
    if (e.team) ev.team = e.team;
    if (e.player) ev.player = e.player;
    if (x !== undefined) ev.x = x;
    if (y !== undefined) ev.y = y;
    if (endX !== undefined) ev.endX = endX;
    if (endY !== undefined) ev.endY = endY;
    out.push(ev);
  }
  return out;
}
