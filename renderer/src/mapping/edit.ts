/** Pure helpers for editing mappings (no React), unit-tested. */
import { wideObjectsFromHeader } from '../../../engine/import/tracking/detect.ts';
import type { EventMapping, SourceMapping, TrackingMapping } from '../../../shared-types/index.ts';

/** Set or clear one column role; clearing deletes the key (exactOptionalPropertyTypes-safe). */
export function setColumn<M extends SourceMapping>(m: M, role: string, column: string | undefined): M {
  const columns = { ...(m.columns as Record<string, unknown>) };
  if (column === undefined) delete columns[role];
  else columns[role] = column;
  return { ...m, columns } as M;
}

/** Distinct values of one column in the preview rows, in first-seen order. */
export function previewValues(header: string[], preview: string[][], column: string | undefined): string[] {
  if (!column) return [];
  const i = header.indexOf(column);
  if (i < 0) return [];
  const seen = new Set<string>();
  for (const row of preview) {
    const v = (row[i] ?? '').trim();
    if (v) seen.add(v);
  }
  return [...seen];
}

/** The raw kind names to show: those the mapping knows plus any new ones in the preview. */
export function kindNameRows(m: EventMapping, header: string[], preview: string[][]): string[] {
  const names = Object.keys(m.kindNames);
  for (const v of previewValues(header, preview, m.columns.kind)) if (!names.includes(v)) names.push(v);
  return names;
}

export function teamNameRows(m: EventMapping, header: string[], preview: string[][]): string[] {
  const names = Object.keys(m.teamNames);
  for (const v of previewValues(header, preview, m.columns.team)) if (!names.includes(v)) names.push(v);
  return names;
}

/** What must be set before an import can start; empty when ready. */
export function mappingGaps(m: SourceMapping, header: string[]): string[] {
  const gaps: string[] = [];
  const missing = (c: string | undefined) => c !== undefined && c !== '' && !header.includes(c);
  const jsonl = m.kind === 'tracking' && m.layout === 'jsonl';
  for (const [role, c] of jsonl ? [] : Object.entries(m.columns)) {
    if (typeof c === 'string' && missing(c)) gaps.push(`Column “${c}” (${role}) is not in this file.`);
  }
  if (m.kind === 'events') {
    if (!m.columns.time) gaps.push('Choose the time column.');
    if (!m.columns.kind) gaps.push('Choose the event kind column.');
  } else {
    const t: TrackingMapping = m;
    if (!t.columns.frame && !t.columns.time) gaps.push('Choose a frame or time column.');
    if (t.layout === 'long' && (!t.columns.objectId || !t.columns.x || !t.columns.y)) gaps.push('Choose object id, x and y columns.');
    if (t.layout === 'wide' && !(t.columns.objects?.length)) gaps.push('No object columns were found for the wide layout.');
    if (t.periods.from === 'column' && !t.columns.period) gaps.push('Choose the period column, or find periods from a gap in frames.');
  }
  return gaps;
}

const DEFAULT_COORDS = { unit: 'm', origin: 'centre', yDown: false, pitch: { length: 105, width: 68 } } as const;

/**
 * A mapping to start from when detection could not tell (kind 'unknown') and the analyst
 * says what the file is. Wide tracking objects come from x/y column pairs.
 */
export function blankMapping(kind: 'tracking' | 'events', header: string[]): SourceMapping {
  const find = (re: RegExp) => header.find((h) => re.test(h.trim()));
  if (kind === 'events') {
    const m: EventMapping = {
      kind: 'events',
      format: 'csv',
      columns: { time: find(/^(time|clock|t)$/i) ?? '', kind: find(/^(type|kind|event)$/i) ?? '' },
      clock: 'match_clock_continuing',
      kindNames: {},
      teamNames: {},
      coordinates: { ...DEFAULT_COORDS, pitch: { ...DEFAULT_COORDS.pitch } },
    };
    const period = find(/^(period|half)$/i);
    if (period) m.columns.period = period;
    return m;
  }
  // The importer's own x/y pair finder, so hand mapping and detection agree.
  const objects = wideObjectsFromHeader(header);
  const m: TrackingMapping = {
    kind: 'tracking',
    layout: objects.length ? 'wide' : 'long',
    columns: objects.length ? { objects } : {},
    periods: find(/^(period|half)$/i) ? { from: 'column' } : { from: 'gap', minGapS: 60 },
    coordinates: { ...DEFAULT_COORDS, pitch: { ...DEFAULT_COORDS.pitch } },
  };
  const frame = find(/^frame/i);
  if (frame) m.columns.frame = frame;
  const period = find(/^(period|half)$/i);
  if (period) m.columns.period = period;
  return m;
}
