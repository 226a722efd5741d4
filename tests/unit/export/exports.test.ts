import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { clockFitsJson, correctedEventRows, correctedEventsCsv, correctedEventsJson, DATA_PROTECTION_CAUTION, syncReportHtml, type CorrectedEventRow } from '../../../engine/export/index.ts';
import { syncMatch, type SyncResult } from '../../../engine/sync.ts';
import { shareWithinTruth } from './truth-share.ts';
import { DEMO, loadSources, type LoadedSources } from '../project-file/demo-project.ts';

let src: LoadedSources;
let sync: SyncResult;
const truth = JSON.parse(readFileSync(DEMO + 'truth.json', 'utf8'));
beforeAll(async () => {
  src = await loadSources();
  sync = syncMatch(src.tracking.data, src.events.data);
}, 60_000);

function rows(status: (i: number) => 'accepted' | 'rejected' | 'proposed' | 'edited'): CorrectedEventRow[] {
  return correctedEventRows(
    src.events.data.events.map((e, i) => ({ logged: e, correction: { status: status(i), proposal: sync.corrections[i], ...(status(i) === 'edited' ? { edited: { period: e.period, t: 100, x: 1, y: 2 } } : {}) } })),
    sync.fit,
  );
}

function shareWithin(rs: CorrectedEventRow[], pick: (r: CorrectedEventRow) => number | null, tol = 0.2) {
  return shareWithinTruth(truth, rs.map((r) => ({ row: r.row, period: r.corrected_period, t: pick(r) })), tol);
}

describe('corrected event log', () => {
  it('CSV is RFC 4180 (papaparse reads it back field for field), logged and corrected side by side', () => {
    const rs = rows((i) => (i % 3 === 0 ? 'accepted' : i % 3 === 1 ? 'rejected' : 'edited'));
    const csv = correctedEventsCsv(rs);
    // papaparse (npm), an RFC 4180 parser, as the reference reader.
    const parsed = Papa.parse<Record<string, string>>(csv.trimEnd(), { header: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(src.events.data.events.length);
    const first = parsed.data[0];
    expect(Object.keys(first)).toEqual(expect.arrayContaining(['logged_t_s', 'corrected_t_s', 'status', 'confidence', 'logged_x', 'corrected_x']));
    expect(first.status).toBe('accepted');
    expect(Number(first.corrected_t_s)).toBeCloseTo(sync.corrections[0].trackingTime, 3);
    expect(Number(first.logged_t_s)).toBeCloseTo(src.events.data.events[0].t, 3);
    expect(parsed.data[1].status).toBe('rejected');
    expect(Number(parsed.data[1].corrected_t_s)).toBeCloseTo(Number(parsed.data[1].fitted_t_s), 6);
    expect(parsed.data[2]).toMatchObject({ status: 'edited', corrected_t_s: '100', corrected_x: '1', corrected_y: '2' });
    // Reasons with commas and quotes survive.
    rs.forEach((r, i) => expect(parsed.data[i].reason).toBe(r.reason));
  });

  it('JSON carries the same rows', () => {
    const rs = rows(() => 'accepted');
    const j = JSON.parse(correctedEventsJson(rs, { title: 'x', generatedAt: 'now', clock: 'tracking' }));
    expect(j.format).toBe('whistlemark-corrected-events/1');
    expect(j.events).toEqual(JSON.parse(JSON.stringify(rs)));
  });

  it('accepting every proposal beats the raw log against the demo truth (share within 0.2 s)', () => {
    const accepted = rows(() => 'accepted');
    const raw = shareWithin(accepted, (r) => r.logged_t_s); // the log's own clock, as an analyst would read it
    const fitted = shareWithin(accepted, (r) => r.fitted_t_s);
    const corrected = shareWithin(accepted, (r) => r.corrected_t_s);
    console.log(`demo, share of events within 0.2 s of truth: raw log ${(raw * 100).toFixed(1)} %, log through the fit ${(fitted * 100).toFixed(1)} %, all proposals accepted ${(corrected * 100).toFixed(1)} %`);
    expect(corrected).toBeGreaterThan(raw);
    expect(corrected).toBeGreaterThan(fitted);
  });
});

describe('clock fits JSON and the sync report', () => {
  it('fits JSON lists every segment with its anchors, NaN as null', () => {
    const j = JSON.parse(clockFitsJson([{ label: 'events.csv', fit: sync.fit }], { title: 't', generatedAt: 'g' }));
    expect(j.fits[0].segments).toHaveLength(sync.fit.segments.length);
    expect(j.fits[0].segments[0].anchors).toHaveLength(sync.fit.segments[0].points.length);
    expect(j.fits[0].segments[0].drift_ppm).toBeCloseTo(sync.fit.segments[0].driftPpm, 1);
  });

  it('the report is self-contained HTML with a section and residual chart per period, counts, non-live intervals and the caution', () => {
    const events = rows((i) => (i < 10 ? 'accepted' : 'proposed'));
    const html = syncReportHtml({
      title: 'Ferncastle Lanterns v Dunmere Tide <demo>',
      generatedAt: '2026-12-02 06:00',
      user: 'analyst',
      fits: [{ label: 'events.csv', fit: sync.fit }],
      events,
      nonLive: [{ footage: 'footage.mp4', fromT: 0, toT: 30, kind: 'lead_in', status: 'confirmed' }],
    });
    expect(html.startsWith('<!doctype html>')).toBe(true);
    // Self-contained: no script, no linked style sheet, no image or font fetched, no address outside.
    expect(html).not.toMatch(/<script|<link|\ssrc=|url\(/i);
    expect(html).not.toMatch(/https?:\/\//);
    expect(html).toContain('&lt;demo&gt;');
    expect(html.match(/<svg class="chart"/g)).toHaveLength(sync.fit.segments.length);
    const points = sync.fit.segments.reduce((n, s) => n + s.points.filter((p) => p.used).length, 0);
    expect(html.match(/<circle [^>]*class="used"/g)).toHaveLength(points);
    expect(html).toContain('@media print');
    expect(html).toContain(DATA_PROTECTION_CAUTION);
    expect(html).toContain('lead in');
    expect(html).toMatch(/10 corrections decided/);
  });
});
