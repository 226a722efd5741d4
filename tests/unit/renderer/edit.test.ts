import { describe, expect, it } from 'vitest';
import { blankMapping, kindNameRows, mappingGaps, previewValues, setColumn } from '../../../renderer/src/mapping/edit.ts';
import { rejectedRowsCsv } from '../../../renderer/src/import/rejected-rows.ts';
import { percentOf } from '../../../renderer/src/app/ProgressBar.tsx';
import type { EventMapping } from '../../../shared-types/index.ts';
import { DEFAULT_PITCH } from '../../../shared-types/index.ts';
import { parse } from 'papaparse';

const header = ['half', 'clock', 'what', 'side'];
const preview = [
  ['1', '00:01', 'Pass', 'Blue'],
  ['1', '00:03', 'GK', 'Red'],
  ['1', '00:04', 'Pass', 'Blue'],
];
const m: EventMapping = {
  kind: 'events',
  format: 'csv',
  columns: { time: 'clock', kind: 'what', team: 'side' },
  clock: 'match_clock_restarting',
  kindNames: { Pass: 'pass' },
  teamNames: {},
  coordinates: { unit: 'm', origin: 'centre', yDown: false, pitch: DEFAULT_PITCH },
};

describe('mapping edits', () => {
  it('lists new kind names from the preview after the known ones', () => {
    expect(previewValues(header, preview, 'side')).toEqual(['Blue', 'Red']);
    expect(kindNameRows(m, header, preview)).toEqual(['Pass', 'GK']);
  });

  it('sets and clears a column role', () => {
    const a = setColumn(m, 'period', 'half');
    expect(a.columns.period).toBe('half');
    expect('period' in setColumn(a, 'period', undefined).columns).toBe(false);
  });

  it('says what is missing before an import can run', () => {
    expect(mappingGaps(m, header)).toEqual([]);
    expect(mappingGaps(setColumn(m, 'kind', undefined), header)).toEqual(['Choose the event kind column.']);
    expect(mappingGaps(setColumn(m, 'x', 'pos_x'), header)).toEqual(['Column “pos_x” (x) is not in this file.']);
  });

  it('builds a hand mapping from x/y column pairs when detection gave none', () => {
    const t = blankMapping('tracking', ['frame', 'period', 'home_7_x', 'home_7_y', 'ball_x', 'ball_y']);
    expect(t.kind).toBe('tracking');
    if (t.kind !== 'tracking') return;
    expect(t.layout).toBe('wide');
    expect(t.columns.objects?.map((o) => o.id)).toEqual(['home_7', 'ball']);
    expect(mappingGaps(t, ['frame', 'period', 'home_7_x', 'home_7_y', 'ball_x', 'ball_y'])).toEqual([]);
  });
});

describe('rejected rows file', () => {
  it('writes CSV that a reference parser reads back unchanged (RFC 4180, papaparse)', () => {
    const rows = [
      { line: 5, text: '1,"9:9,x",Pass', reason: 'bad "time"' },
      { line: 9, text: 'a\tb', reason: 'too few columns' },
    ];
    const csv = rejectedRowsCsv(rows, [{ severity: 'error', file: 'f.csv', line: 2, message: 'bad header, really' }]);
    const back = parse<string[]>(csv.trim(), { newline: '\r\n' }).data;
    expect(back).toEqual([
      ['line', 'reason', 'text'],
      ['5', 'bad "time"', '1,"9:9,x",Pass'],
      ['9', 'too few columns', 'a\tb'],
      ['2', 'bad header, really', ''],
    ]);
  });
});

describe('progress percent', () => {
  it('is bytes read over total, 100 when done', () => {
    expect(percentOf({ bytesRead: 50, bytesTotal: 200, rows: 1, phase: 'reading' })).toBe(25);
    expect(percentOf({ bytesRead: 0, bytesTotal: 0, rows: 0, phase: 'reading' })).toBe(0);
    expect(percentOf({ bytesRead: 10, bytesTotal: 200, rows: 1, phase: 'done' })).toBe(100);
  });
});
