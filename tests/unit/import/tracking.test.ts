import { describe, expect, it } from 'vitest';
import type { TrackingData } from '../../../shared-types/domain.ts';
import type { CoordinateMapping, ImportProgress, TrackingMapping } from '../../../shared-types/import.ts';
import { detectSource, importTracking, isAbortError } from '../../../engine/import/index.ts';
import { chunked, coords, synthFrames, writeJsonl, writeLong, writeWide } from './helpers/synthetic.ts';

const synth = synthFrames({ rate: 25, periodS: 6, periods: 2, firstFrames: [1000, 90000] });

async function detectAndImport(name: string, text: string, tweak?: (m: TrackingMapping) => void) {
  const d = detectSource(name, text.slice(0, 65536));
  expect(d.kind).toBe('tracking');
  const mapping = d.mapping as TrackingMapping;
  tweak?.(mapping);
  return { d, r: await importTracking(chunked(text, 1009), { fileName: name, mapping }) };
}

/** Largest distance between imported and canonical positions (metres). */
function maxError(data: TrackingData, s = synth): number {
  let worst = 0;
  const ids = data.objects.map((o) => o.id);
  for (const f of s.frames) {
    const p = data.periods.find((q) => q.period === f.period)!;
    const fi = f.frame - p.firstFrame;
    s.objects.forEach((o, i) => {
      const k = ids.indexOf(o.id);
      const idx = fi * ids.length + k;
      worst = Math.max(worst, Math.hypot(p.x[idx] - f.x[i], p.y[idx] - f.y[i]));
    });
  }
  return worst;
}

// Each written file is checked against the canonical positions it was written from;
// tolerance = rounding to 3 decimals in file units (0.001 x 105 m for normalised grids).
const cases: { name: string; text: string; c: Partial<CoordinateMapping>; tol: number; layout: string }[] = [
  { name: 'wide.csv', text: writeWide(synth, coords({})), c: { unit: 'm', origin: 'centre' }, tol: 0.002, layout: 'wide' },
  { name: 'wide-cm-corner.csv', text: writeWide(synth, coords({ unit: 'cm', origin: 'bottom_left' }), { delimiter: ';', eol: '\r\n' }), c: { unit: 'cm', origin: 'bottom_left' }, tol: 0.002, layout: 'wide' },
  { name: 'wide.tsv', text: writeWide(synth, coords({ unit: 'normalised', origin: 'bottom_left' }), { delimiter: '\t' }), c: { unit: 'normalised', origin: 'bottom_left' }, tol: 0.08, layout: 'wide' },
  { name: 'long.csv', text: writeLong(synth, coords({ unit: 'cm' })), c: { unit: 'cm', origin: 'centre' }, tol: 0.002, layout: 'long' },
  { name: 'long-norm.csv', text: writeLong(synth, coords({ unit: 'normalised', origin: 'bottom_left' })), c: { unit: 'normalised', origin: 'bottom_left' }, tol: 0.08, layout: 'long' },
  { name: 'frames.jsonl', text: writeJsonl(synth, coords({ origin: 'bottom_left' })), c: { unit: 'm', origin: 'bottom_left' }, tol: 0.002, layout: 'jsonl' },
];

describe('tracking import: layouts, units and origins come back to the canonical positions', () => {
  for (const t of cases) {
    it(`${t.name}: detects ${t.layout}, ${t.c.unit}, ${t.c.origin} and imports within ${t.tol} m`, async () => {
      const { d, r } = await detectAndImport(t.name, t.text);
      const m = d.mapping as TrackingMapping;
      expect(m.layout).toBe(t.layout);
      expect(m.coordinates.unit).toBe(t.c.unit);
      expect(m.coordinates.origin).toBe(t.c.origin);
      expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
      expect(r.ok).toBe(true);
      const data = r.data!;
      expect(data.rate).toBe(25);
      expect(data.objects).toHaveLength(23);
      expect(data.objects[data.ballIndex].id).toBe('ball');
      expect(data.objects.find((o) => o.id === 'away_7')).toMatchObject({ role: 'player', team: 'away', shirt: 7 });
      expect(data.periods.map((p) => [p.period, p.firstFrame, p.frameCount])).toEqual([
        [1, 1000, 150],
        [2, 90000, 150],
      ]);
      expect(data.periods.every((p) => p.present.every((v) => v === 1))).toBe(true);
      // Law 8: at kick-off each team is in its own half; home starts on the negative side in period 1.
      expect(data.periods.map((p) => p.homeAttacks)).toEqual(['positive_x', 'negative_x']);
      expect(maxError(data)).toBeLessThan(t.tol);
    });
  }

  it('a y-down top-left grid, once chosen in the mapping, gives the same positions and directions', async () => {
    const c = coords({ origin: 'top_left', yDown: true });
    const { r } = await detectAndImport('img.csv', writeWide(synth, c), (m) => (m.coordinates = c));
    expect(r.ok).toBe(true);
    expect(maxError(r.data!)).toBeLessThan(0.002);
    expect(r.data!.periods[0].homeAttacks).toBe('positive_x');
  });

  it('ball height is kept in metres for the ball only', async () => {
    const { r } = await detectAndImport('wide.csv', cases[0].text);
    const p = r.data!.periods[0];
    expect(p.ballZ![10]).toBeCloseTo(synth.frames[10].ballZ, 3);
  });
});

describe('tracking import: gaps, periods, rate, missing values', () => {
  it('missing frames become present = 0 with NaN positions; missing values (empty, NaN, NA) are NaN', async () => {
    const lines = writeWide(synth, coords({})).split('\n');
    // Drop frames 1010..1014 (data lines 11..15) and blank some values.
    const kept = lines.filter((_, i) => i < 11 || i > 15);
    kept[2] = kept[2].replace(/^(([^,]*,){6})[^,]*,[^,]*/, '$1NaN,NA'); // home_1 x,y on frame 1001
    kept[3] = kept[3].replace(/^(([^,]*,){6})[^,]*,[^,]*/, '$1,'); // empty on frame 1002
    const { r } = await detectAndImport('gaps.csv', kept.join('\n'));
    expect(r.ok).toBe(true);
    const p = r.data!.periods[0];
    expect(p.frameCount).toBe(150);
    expect([...p.present.subarray(8, 16)]).toEqual([1, 1, 0, 0, 0, 0, 0, 1]);
    const n = r.data!.objects.length;
    expect(p.x[10 * n]).toBeNaN();
    const home1 = r.data!.objects.findIndex((o) => o.id === 'home_1');
    expect(p.x[1 * n + home1]).toBeNaN();
    expect(p.y[2 * n + home1]).toBeNaN();
    expect(p.x[3 * n + home1]).toBeCloseTo(synth.frames[3].x[home1], 2);
    expect(r.problems.some((q) => q.severity === 'warning' && /5 of 150 frames are missing/.test(q.message))).toBe(true);
  });

  it('periods found from a gap in time when there is no period column', async () => {
    const text = writeWide(synth, coords({}), { periodColumn: false }).replace(/^([^,]*),([^,]*),/gm, (all, f, t) => {
      // Make time run on across the break with a 15-minute gap (Law 7 half-time interval).
      if (f === 'frame') return all;
      const frame = Number(f);
      const sec = frame >= 90000 ? Number(t) + 6 + 900 : Number(t);
      return `${f},${sec.toFixed(2)},`;
    });
    const { d, r } = await detectAndImport('nogap.csv', text);
    expect((d.mapping as TrackingMapping).periods).toEqual({ from: 'gap', minGapS: 60 });
    expect(r.ok).toBe(true);
    expect(r.data!.periods.map((p) => [p.period, p.firstFrame])).toEqual([
      [1, 1000],
      [2, 90000],
    ]);
  });

  it('periods from frame ranges', async () => {
    const text = writeWide(synth, coords({}), { periodColumn: false });
    const { r } = await detectAndImport('ranges.csv', text, (m) => {
      m.periods = { from: 'frames', ranges: [[0, 50000], [50001, 200000]] };
    });
    expect(r.ok).toBe(true);
    expect(r.data!.periods.map((p) => p.frameCount)).toEqual([150, 150]);
  });

  it('rate measured from the time column: 10 Hz (a rate used by broadcast-derived tracking, from memory)', async () => {
    const s10 = synthFrames({ rate: 10, periodS: 5, periods: 1 });
    const { d, r } = await detectAndImport('ten.csv', writeWide(s10, coords({})));
    expect((d.mapping as TrackingMapping).rate).toBe(10);
    expect(r.data!.rate).toBe(10);
    expect(r.data!.periods[0].frameCount).toBe(50);
  });

  it('frames from time x rate when there is no frame column', async () => {
    const text = writeLong(synth, coords({})).replace(/^(\w+),(\w+),/gm, '$1,'); // drop the frame column
    const { d, r } = await detectAndImport('noframe.csv', text);
    expect((d.mapping as TrackingMapping).columns.frame).toBeUndefined();
    expect(r.ok).toBe(true);
    // Time restarts at 0 in period 2, so frames are time x 25 from 0 in each period.
    expect(r.data!.periods.map((p) => [p.firstFrame, p.frameCount])).toEqual([
      [0, 150],
      [0, 150],
    ]);
  });

  it('no ball: ballIndex -1', async () => {
    const s = synthFrames({ rate: 25, periodS: 2, periods: 1, withBall: false });
    const { r } = await detectAndImport('noball.jsonl', writeJsonl(s, coords({})));
    expect(r.ok).toBe(true);
    expect(r.data!.ballIndex).toBe(-1);
    expect(r.data!.objects).toHaveLength(22);
  });

  it('a byte-order mark and quoted header names are taken in stride', async () => {
    const text = '\ufeff' + writeWide(synth, coords({})).replace('period,frame,time_s', '"period","frame","time_s"');
    const { r } = await detectAndImport('bom.csv', text);
    expect(r.ok).toBe(true);
  });
});

describe('tracking import: validation is located and all-or-nothing', () => {
  const wide = writeWide(synth, coords({}));

  it('frames going backwards: error with line and time, no data', async () => {
    const lines = wide.split('\n');
    [lines[20], lines[21]] = [lines[21], lines[20]];
    const { r } = await detectAndImport('back.csv', lines.join('\n'));
    expect(r.ok).toBe(false);
    expect(r.data).toBeUndefined();
    const e = r.problems.find((p) => p.severity === 'error')!;
    expect(e.line).toBe(22);
    expect(e.message).toMatch(/frames go backwards/);
    expect(e.time).toMatch(/^period 1 00:00\.76/);
    expect(e.file).toBe('back.csv');
  });

  it('a repeated frame: warning, first copy kept', async () => {
    const lines = wide.split('\n');
    lines.splice(5, 0, lines[4]);
    const { r } = await detectAndImport('dup.csv', lines.join('\n'));
    expect(r.ok).toBe(true);
    expect(r.problems.some((p) => p.severity === 'warning' && p.line === 6 && /appears twice/.test(p.message))).toBe(true);
  });

  it('a missing required column: error at line 1 naming the column', async () => {
    const { r } = await detectAndImport('col.csv', wide, (m) => (m.columns.period = 'half'));
    expect(r.ok).toBe(false);
    expect(r.problems[0]).toMatchObject({ severity: 'error', line: 1, column: 'half' });
  });

  it('wrong units (cm read as metres): most positions off the pitch -> error', async () => {
    const { r } = await detectAndImport('units.csv', writeWide(synth, coords({ unit: 'cm' })), (m) => (m.coordinates.unit = 'm'));
    expect(r.ok).toBe(false);
    expect(r.problems.some((p) => p.severity === 'error' && /off a 105 x 68 m pitch/.test(p.message))).toBe(true);
  });

  it('one unreadable row is rejected with its text and reason; the rest imports', async () => {
    const lines = wide.split('\n');
    lines[7] = '1,xyz,' + lines[7].split(',').slice(2).join(',');
    const { r } = await detectAndImport('bad.csv', lines.join('\n'));
    expect(r.ok).toBe(true);
    expect(r.rejectedRows).toEqual([{ line: 8, text: lines[7], reason: 'frame "xyz" is not a whole number' }]);
    expect(r.data!.periods[0].present[6]).toBe(0);
  });

  it('a value that is not a number: warning naming line and column, value taken as missing', async () => {
    const lines = wide.split('\n');
    const cells = lines[4].split(',');
    const col = lines[0].split(',').indexOf('home_1_x');
    cells[col] = 'abc';
    lines[4] = cells.join(',');
    const { r } = await detectAndImport('num.csv', lines.join('\n'));
    expect(r.ok).toBe(true);
    expect(r.problems).toContainEqual(expect.objectContaining({ severity: 'warning', line: 5, column: 'home_1_x' }));
    const n = r.data!.objects.length;
    const k = r.data!.objects.findIndex((o) => o.id === 'home_1');
    expect(r.data!.periods[0].x[3 * n + k]).toBeNaN();
  });

  it('many unreadable rows -> error, no data', async () => {
    const lines = wide.split('\n').map((l, i) => (i > 0 && i % 3 === 0 ? 'garbage;;;' : l));
    const { r } = await detectAndImport('many.csv', lines.join('\n'));
    expect(r.ok).toBe(false);
    expect(r.data).toBeUndefined();
    expect(r.rejectedRows.length).toBeGreaterThan(50);
  });
});

describe('tracking import: streaming, progress and abort', () => {
  const wide = writeWide(synth, coords({}));
  const mapping = detectSource('w.csv', wide).mapping as TrackingMapping;

  it('reports progress by bytes and rows up to the total', async () => {
    const seen: ImportProgress[] = [];
    const r = await importTracking(chunked(wide, 4096), { fileName: 'w.csv', mapping, bytesTotal: wide.length, onProgress: (p) => seen.push(p) });
    expect(r.ok).toBe(true);
    const reading = seen.filter((p) => p.phase === 'reading');
    expect(reading.length).toBeGreaterThan(5);
    expect(reading[reading.length - 1].bytesRead).toBe(wide.length);
    expect(seen[seen.length - 1].phase).toBe('done');
    expect(seen[seen.length - 1].rows).toBe(300);
    for (let i = 1; i < reading.length; i++) expect(reading[i].bytesRead).toBeGreaterThan(reading[i - 1].bytesRead);
  });

  it('abort mid-stream rejects with an AbortError and returns nothing', async () => {
    const ctl = new AbortController();
    let n = 0;
    async function* chunks() {
      for await (const c of chunked(wide, 2048)) {
        if (++n === 3) ctl.abort();
        yield c;
      }
    }
    const err = await importTracking(chunks(), { fileName: 'w.csv', mapping, signal: ctl.signal }).catch((e) => e);
    expect(isAbortError(err)).toBe(true);
  });

  it('the same result for any chunk size (chunk borders inside numbers and line ends)', async () => {
    const a = await importTracking(chunked(wide, 1), { fileName: 'w.csv', mapping });
    const b = await importTracking(chunked(wide, 65536), { fileName: 'w.csv', mapping });
    expect(a.ok && b.ok).toBe(true);
    expect(a.data!.periods[1].x).toEqual(b.data!.periods[1].x);
  });
});
