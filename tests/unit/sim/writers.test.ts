import { parseISO } from 'date-fns';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { buildTruth } from '../../../fixtures/sim/build-truth.ts';
import { writeEvents } from '../../../fixtures/sim/events-writer.ts';
import { sampleAt } from '../../../fixtures/sim/sample.ts';
import { simulateMatch } from '../../../fixtures/sim/simulate.ts';
import { writeTracking } from '../../../fixtures/sim/tracking-writer.ts';
import { sourceToTrue, trueToSource } from '../../../fixtures/sim/truth.ts';

// A short match keeps these fast; papaparse and date-fns (npm) read what we wrote.
const w = simulateMatch({ seed: 5, periodSeconds: [60, 60], preRollS: [6, 6] });
const parse = (text: string, delimiter = ',') => Papa.parse<Record<string, string>>(text.trim(), { header: true, delimiter });

describe('tracking writer', () => {
  it('wide layout has the agreed columns, and exact values map back through the truth clock', () => {
    const out = writeTracking(w, { noiseM: 0, missingFrameRate: 0, missingObjectRate: 0, driftPpm: 250 });
    const rows = parse(out.text);
    expect(rows.meta.fields!.slice(0, 8)).toEqual(['period', 'frame', 'time_s', 'ball_x', 'ball_y', 'ball_z', 'home_1_x', 'home_1_y']);
    expect(rows.meta.fields![rows.meta.fields!.length - 1]).toBe('away_11_y');
    const truth = buildTruth(w, { tracking: out.meta });
    const buf = new Float64Array(47);
    for (const r of rows.data.filter((_, i) => i % 97 === 0)) {
      const tTrue = sourceToTrue(truth, 'tracking', Number(r.time_s), Number(r.period));
      expect(sampleAt(w, tTrue, buf)).toBe(true);
      expect(Number(r.home_7_x)).toBeCloseTo(buf[2 * 6], 1);
      expect(Number(r.away_4_y)).toBeCloseTo(buf[2 * 14 + 1], 1);
      expect(Number(r.ball_x)).toBeCloseTo(buf[2 * 22], 1);
    }
  });

  it('frame numbers continue across periods with a jump, time_s restarts per period at the nominal rate', () => {
    const out = writeTracking(w, { rate: 10, missingFrameRate: 0 });
    const rows = parse(out.text).data;
    const p1 = rows.filter((r) => r.period === '1'), p2 = rows.filter((r) => r.period === '2');
    expect(Number(p2[0].frame)).toBeGreaterThan(Number(p1[p1.length - 1].frame) + 1000);
    expect(Number(p1[1].time_s) - Number(p1[0].time_s)).toBeCloseTo(0.1, 9);
    expect(p2[0].time_s).toBe('0.00');
  });

  it('long layout in cm from the bottom-left corner with y down is the same data', () => {
    const base = { noiseM: 0, missingFrameRate: 0, missingObjectRate: 0 } as const;
    const wide = parse(writeTracking(w, base).text).data;
    // The first 3,000 lines are plenty (and keep papaparse quick).
    const longText = writeTracking(w, { ...base, layout: 'long', unit: 'cm', origin: 'bottom_left', yDown: true }).text;
    const long = parse(longText.split('\n').slice(0, 3000).join('\n'));
    expect(long.meta.fields).toEqual(['period', 'frame', 'time_s', 'object', 'team', 'shirt', 'x', 'y', 'z']);
    const row = long.data.find((r) => r.object === 'home_7' && r.frame === wide[50].frame)!;
    expect(row.team).toBe('home');
    expect(Number(row.x) / 100 - 52.5).toBeCloseTo(Number(wide[50].home_7_x), 1);
    expect(34 - Number(row.y) / 100).toBeCloseTo(Number(wide[50].home_7_y), 1);
    const norm = parse(writeTracking(w, { ...base, unit: 'normalised', origin: 'bottom_left' }).text).data;
    expect(Number(norm[50].home_7_x) * 105 - 52.5).toBeCloseTo(Number(wide[50].home_7_x), 1);
  });

  it('without the ball there are no ball columns; missing frames are counted in the truth', () => {
    const out = writeTracking(w, { ballAbsent: true, missingFrameRate: 0.05 });
    expect(out.text.split('\n')[0]).not.toContain('ball');
    const rows = parse(out.text).data;
    const p = out.meta.periods[0];
    expect(rows.filter((r) => r.period === '1').length).toBe(p.lastFrame - p.firstFrame + 1 - p.missingFrames);
    expect(p.missingFrames).toBeGreaterThan(0);
  });
});

describe('event-log writer', () => {
  it('one row per on-ball event with the agreed columns, team names and bottom-left metres', () => {
    const out = writeEvents(w);
    const rows = parse(out.text);
    expect(rows.meta.fields).toEqual(['id', 'period', 'clock', 'team', 'player', 'event', 'x', 'y', 'end_x', 'end_y']);
    expect(rows.data.length).toBe(w.events.length);
    expect(new Set(rows.data.map((r) => r.team).filter(Boolean))).toEqual(new Set([w.teams.home.name, w.teams.away.name]));
    for (const r of rows.data) {
      expect(Number(r.x)).toBeGreaterThanOrEqual(0);
      expect(Number(r.x)).toBeLessThanOrEqual(105);
      expect(Number(r.y)).toBeGreaterThanOrEqual(0);
      expect(Number(r.y)).toBeLessThanOrEqual(68);
    }
  });

  it('MM:SS.s clock: the second period counts on from 45:00 (common practice)', () => {
    const rows = parse(writeEvents(w).text).data;
    const p2 = rows.filter((r) => r.period === '2');
    expect(p2[0].clock).toBe('45:00.0');
    for (const r of p2) expect(r.clock >= '45:00.0').toBe(true);
  });

  it('truth explains every logged time: clock map + recorded error gives the true time', () => {
    const out = writeEvents(w, { driftPpm: 200 });
    const truth = buildTruth(w, { events: out.meta });
    for (const e of truth.events) {
      const back = sourceToTrue(truth, 'events', e.loggedT - e.timeErrorS, e.period);
      expect(Math.abs(back - e.trueT)).toBeLessThan(0.06); // logged times have 0.1 s resolution
    }
    const ko = truth.events.find((e) => e.kind === 'kick_off')!;
    expect(trueToSource(truth, 'events', ko.trueT)!.period).toBe(1);
  });

  it('about three quarters of goal kicks are seconds off and metres away (REFERENCES.md, common practice)', () => {
    // Goal kicks are rare in a short match: count over several taggers (writer seeds) of it.
    const long = simulateMatch({ seed: 11, periodSeconds: [360, 360] });
    const ev = Array.from({ length: 15 }, (_, k) => writeEvents(long, { seed: 100 + k }).meta.events.filter((e) => e.kind === 'goal_kick')).flat();
    expect(ev.length).toBeGreaterThanOrEqual(20);
    const bad = ev.filter((e) => e.fault);
    expect(bad.length / ev.length).toBeGreaterThan(0.6);
    expect(bad.length / ev.length).toBeLessThan(0.9);
    for (const e of bad) {
      expect(Math.abs(e.fault!.dtS)).toBeGreaterThanOrEqual(2.5);
      expect(Math.hypot(e.fault!.dxM, e.fault!.dyM)).toBeGreaterThanOrEqual(4);
      expect(Math.abs(e.timeErrorS)).toBeGreaterThan(1);
    }
  });

  it('ISO-8601 wall clock parses with date-fns and keeps the log order', () => {
    const rows = parse(writeEvents(w, { clock: 'iso8601' }).text).data;
    const ms = rows.map((r) => parseISO(r.clock).getTime());
    for (const m of ms) expect(Number.isNaN(m)).toBe(false);
    for (let i = 1; i < ms.length; i++) if (rows[i].period === rows[i - 1].period) expect(ms[i]).toBeGreaterThanOrEqual(ms[i - 1]);
  });

  it('the alternative variant has other names and a semicolon; JSON output carries the same rows', () => {
    const alt = parse(writeEvents(w, { variant: 'alt' }).text, ';');
    expect(alt.meta.fields).toEqual(['uid', 'half', 'match_time', 'side', 'shirt_no', 'action', 'pos_x', 'pos_y', 'to_x', 'to_y']);
    expect(alt.data.map((r) => r.action).slice(0, 2)).toEqual(['HalfStart', 'KickOff']);
    const json = JSON.parse(writeEvents(w, { format: 'json', clock: 'seconds' }).text) as { events: { event: string; x: number }[] };
    expect(json.events.length).toBe(w.events.length);
    expect(typeof json.events[0].x).toBe('number');
  });
});
