/** Event log detection: columns, clock style, kind names, team names and grid from the first rows. */
import type { EventKind, TeamSide } from '../../../shared-types/domain.ts';
import type { Detection, EventClockStyle, EventMapping, ImportProblem } from '../../../shared-types/import.ts';
import { COLUMN_NAMES, findColumn } from '../columns.ts';
import { makeKindLookup } from '../kind-names.ts';
import { parseNumber } from '../text/numbers.ts';
import { parsePeriodLabel } from '../tracking/fields.ts';
import { guessGrid } from '../units-guess.ts';
import { CONTINUING_STARTS_S, looksLikeIso, looksLikeMatchClock, parseMatchClock } from './clock.ts';

type Found = Omit<Detection, 'header' | 'preview'>;

/** Within a minute of 45:00 counts as "continuing" (first-half stoppage makes 45+ common in period 1 only). */
const CONTINUING_THRESHOLD_S = 2640;

export function detectEvents(fileName: string, header: string[], rows: Record<string, string>[], format: 'csv' | 'json', delimiter?: string): Found | null {
  const clues: string[] = [];
  const problems: ImportProblem[] = [];
  const col = (k: keyof typeof COLUMN_NAMES, exclude: string[] = []) => findColumn(header, COLUMN_NAMES[k], exclude);
  const kind = col('kind');
  if (!kind) return null;
  const kindValues = rows.map((r) => (r[kind] ?? '').trim()).filter(Boolean);
  if (!kindValues.length || kindValues.filter((v) => Number.isFinite(parseNumber(v))).length > kindValues.length / 2) return null;
  const period = col('period');
  const time = findTimeColumn(header, rows, [kind, ...(period ? [period] : [])]);
  if (!time) return null;
  const team = col('team');
  const player = col('player', team ? [team] : []);
  const x = col('x');
  const y = col('y');
  const endX = col('endX');
  const endY = col('endY');
  const styleWord = { iso8601: 'ISO-8601 wall clock', seconds: 'seconds', match_clock_continuing: 'match clock MM:SS', match_clock_restarting: 'match clock MM:SS' }[time.style];
  clues.push(`event names in "${kind}", times in "${time.name}" (${styleWord})`);

  // Continuing or restarting match clock: look at period 2's values.
  let clock: EventClockStyle = time.style;
  let periodStartsS: Record<number, number> | undefined;
  if (period && (clock === 'match_clock_continuing' || clock === 'seconds')) {
    const p2 = rows
      .filter((r) => parsePeriodLabel(r[period] ?? '') === 2)
      .map((r) => (clock === 'seconds' ? parseNumber(r[time.name] ?? '') : parseMatchClock(r[time.name] ?? '')))
      .filter(Number.isFinite);
    if (p2.length) {
      const continuing = Math.min(...p2) >= CONTINUING_THRESHOLD_S;
      if (clock === 'match_clock_continuing' && !continuing) clock = 'match_clock_restarting';
      if (clock === 'seconds' && continuing) periodStartsS = { ...CONTINUING_STARTS_S };
      clues.push(continuing ? 'period 2 counts on from 45:00' : 'period 2 starts again from 0');
    } else if (clock === 'match_clock_continuing') {
      clues.push('no period-2 rows in the first part: assumed to count on from 45:00 (the import checks)');
    }
  }
  if (period) clues.push(`period column "${period}"`);
  else clues.push('no period column: period-start rows open each period');

  // Kind names.
  const lookup = makeKindLookup({});
  const kindNames: Record<string, EventKind> = {};
  const unknown: string[] = [];
  for (const v of new Set(kindValues)) {
    const k = lookup(v);
    kindNames[v] = k ?? 'other';
    if (!k) unknown.push(v);
  }
  if (unknown.length) {
    problems.push({
      severity: 'warning',
      file: fileName,
      column: kind,
      message: `Event names not recognised, taken as other: ${unknown.slice(0, 8).join(', ')}${unknown.length > 8 ? ', ...' : ''}.`,
      hint: 'Map them to a kind in the kind names.',
    });
  }

  // Team names: order of first appearance, home first.
  const teamNames: Record<string, TeamSide> = {};
  if (team) {
    const names = [...new Set(rows.map((r) => (r[team] ?? '').trim()).filter(Boolean))];
    const explicit = names.every((n) => ['home', 'away'].includes(n.toLowerCase()));
    names.forEach((n, i) => {
      if (explicit) teamNames[n] = n.toLowerCase() as TeamSide;
      else if (i < 2) teamNames[n] = i === 0 ? 'home' : 'away';
    });
    if (!explicit && names.length) clues.push(`teams by order of first appearance: home = "${names[0]}"${names[1] ? `, away = "${names[1]}"` : ''} (change it if wrong)`);
  }

  const xs = [x, endX].flatMap((cn) => (cn ? rows.map((r) => parseNumber(r[cn] ?? '')) : []));
  const ys = [y, endY].flatMap((cn) => (cn ? rows.map((r) => parseNumber(r[cn] ?? '')) : []));
  const grid = guessGrid(xs, ys, [x, y].join(' '));
  if (x && y) clues.push(...grid.clues);
  else clues.push('no coordinate columns');

  const mapping: EventMapping = {
    kind: 'events',
    format,
    delimiter,
    columns: { period, time: time.name, kind, team, player, x, y, endX, endY },
    clock,
    periodStartsS,
    kindNames,
    teamNames,
    coordinates: grid.coordinates,
  };
  if (!periodStartsS) delete mapping.periodStartsS;
  const confidence = 0.6 + (period ? 0.1 : 0) + (team ? 0.05 : 0) + (x && y ? 0.1 : 0) + (unknown.length < Object.keys(kindNames).length / 2 ? 0.1 : 0);
  return { kind: 'events', clues, mapping, confidence: Math.min(0.95, confidence), problems };
}

/** The time column and its style, judged by what most of its values look like. */
function findTimeColumn(header: string[], rows: Record<string, string>[], exclude: string[]): { name: string; style: EventClockStyle } | undefined {
  for (const name of COLUMN_NAMES.clock) {
    const col = findColumn(header, [name], exclude);
    if (!col) continue;
    const vals = rows.map((r) => (r[col] ?? '').trim()).filter(Boolean);
    if (!vals.length) continue;
    const share = (f: (v: string) => boolean) => vals.filter(f).length / vals.length;
    if (share(looksLikeIso) > 0.8) return { name: col, style: 'iso8601' };
    if (share(looksLikeMatchClock) > 0.8) return { name: col, style: 'match_clock_continuing' };
    if (share((v) => Number.isFinite(parseNumber(v))) > 0.8) return { name: col, style: 'seconds' };
  }
  return undefined;
}
