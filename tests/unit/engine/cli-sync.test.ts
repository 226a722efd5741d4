/**
 * `whistlemark sync` end to end on files written by the simulator (fixtures/sim) in a
 * naming and clock style the engine was not tuned on, checked against the simulator's
 * truth; and clear failures on bad input with nothing written.
 */
import { mkdtempSync, readFileSync, readdirSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildTruth, simulateMatch, writeEvents, writeTracking, type Truth } from '../../../fixtures/sim/index.ts';
import { command } from '../../../electron/cli/sync.ts';
import { csvParse } from 'd3-dsv';

let dir: string;
let truth: Truth;
const ALT_KINDS = { HalfStart: 'period_start', KickOff: 'kick_off', Pass: 'pass', Shot: 'shot', Goal: 'goal', GoalKick: 'goal_kick',
  Corner: 'corner', ThrowIn: 'throw_in', FreeKick: 'free_kick', PenaltyKick: 'penalty', HalfEnd: 'period_end' };

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'wm-sync-'));
  const world = simulateMatch({ seed: 41, periodSeconds: [240, 240] });
  const trk = writeTracking(world, { rate: 10, layout: 'long', driftPpm: -60 });
  // Other header names, ';' between fields, other kind names, wall-clock times.
  const evt = writeEvents(world, { variant: 'alt', clock: 'iso8601', offsetS: [-65.2, -14.8] });
  truth = buildTruth(world, { tracking: trk.meta, events: evt.meta });
  writeFileSync(join(dir, 'tracking.csv'), trk.text);
  writeFileSync(join(dir, 'events.csv'), evt.text);
  // The analyst's mapping for the log (the shape `whistlemark inspect --json` prints).
  writeFileSync(join(dir, 'map.json'), JSON.stringify({
    events: {
      kind: 'events', format: 'csv', delimiter: ';',
      columns: { period: 'half', time: 'match_time', kind: 'action', team: 'side', player: 'shirt_no', x: 'pos_x', y: 'pos_y', endX: 'to_x', endY: 'to_y' },
      clock: 'iso8601', kindNames: ALT_KINDS, teamNames: { [evt.meta.teamNames.home]: 'home', [evt.meta.teamNames.away]: 'away' },
      coordinates: { unit: 'm', origin: 'bottom_left', yDown: false, pitch: { length: 105, width: 68 } },
    },
  }));
});

const out = { log: [] as string[], err: [] as string[] };
function capture() {
  out.log = [];
  out.err = [];
  vi.spyOn(console, 'log').mockImplementation((...a) => void out.log.push(a.join(' ')));
  vi.spyOn(console, 'error').mockImplementation((...a) => void out.err.push(a.join(' ')));
}
afterEach(() => vi.restoreAllMocks());

describe('whistlemark sync', () => {
  it('aligns an alt-named, wall-clock log (mapping file) to 10 Hz long-layout tracking (auto-detected); reference: simulator truth', async () => {
    capture();
    const target = join(dir, 'out');
    const code = await command.run(['--events', join(dir, 'events.csv'), '--tracking', join(dir, 'tracking.csv'), '--map', join(dir, 'map.json'), '--out', target]);
    expect(out.err).toEqual([]);
    expect(code).toBe(0);
    expect(out.log.join('\n')).toMatch(/offset_s/);
    // fit.json: per period offset close to the true clocks.
    const fit = JSON.parse(readFileSync(join(target, 'fit.json'), 'utf8'));
    expect(fit.periods.length).toBe(2);
    for (const p of fit.periods) {
      const E = truth.clocks.events!.segments.find((s) => s.period === p.period)!;
      const T = truth.clocks.tracking!.segments.find((s) => s.period === p.period)!;
      expect(Math.abs(p.segments[0].offset_s - (E.offset - T.offset) / T.rate)).toBeLessThan(0.4);
      expect(p.segments[0].anchors_used).toBeGreaterThan(10);
    }
    // events.corrected.csv: every row, original columns first, in input order (RFC 4180 parse by d3-dsv).
    const rows = csvParse(readFileSync(join(target, 'events.corrected.csv'), 'utf8'));
    const input = readFileSync(join(dir, 'events.csv'), 'utf8').trim().split('\n');
    expect(rows.length).toBe(input.length - 1);
    expect(rows.columns.slice(0, 10)).toEqual(input[0].split(';'));
    expect(rows.columns.slice(10)).toEqual(['tracking_period', 'tracking_frame', 'tracking_time_s', 'corrected_x', 'corrected_y', 'change', 'confidence', 'reason']);
    rows.forEach((r, i) => expect(r.uid).toBe(input[i + 1].split(';')[0]));
    // Corrected times of passes agree with the true kick frames (within 0.3 s for >= 75%).
    let ok = 0, n = 0;
    for (const r of rows) {
      if (r.action !== 'Pass') continue;
      const te = truth.events.find((e) => e.id === r.uid)!;
      const T = truth.clocks.tracking!.segments.find((s) => s.period === te.period)!;
      n++;
      if (Math.abs(Number(r.tracking_time_s) - (te.trueT - T.offset) / T.rate) <= 0.3) ok++;
    }
    expect(ok / n).toBeGreaterThanOrEqual(0.75);
    for (const r of rows) expect(['none', 'time', 'location', 'time+location']).toContain(r.change);
    expect(readdirSync(target).sort()).toEqual(['events.corrected.csv', 'fit.json']);
  });

  it('fails clearly on a garbled event file and writes nothing', async () => {
    capture();
    writeFileSync(join(dir, 'garbled.csv'), 'x\u0000\u0001;;;\n%%%% not a log\n\u00ff\u00fe\n');
    const target = join(dir, 'out-bad');
    const code = await command.run(['--events', join(dir, 'garbled.csv'), '--tracking', join(dir, 'tracking.csv'), '--out', target]);
    expect(code).toBe(1);
    expect(out.err.join('\n')).toMatch(/garbled\.csv/);
    expect(out.err.join('\n')).toMatch(/mapping file|--map/);
    expect(existsSync(join(target, 'fit.json'))).toBe(false);
    expect(existsSync(join(target, 'events.corrected.csv'))).toBe(false);
  });

  it('names line and column of a broken mapping file', async () => {
    capture();
    writeFileSync(join(dir, 'broken.json'), '{\n  "events": {\n    "kind": "events",,\n  }\n}\n');
    const code = await command.run(['--events', join(dir, 'events.csv'), '--tracking', join(dir, 'tracking.csv'), '--map', join(dir, 'broken.json'), '--out', join(dir, 'o3')]);
    expect(code).toBe(1);
    expect(out.err.join('\n')).toMatch(/broken\.json, line 3, column \d+/);
  });

  it('refuses missing arguments with the usage', async () => {
    capture();
    expect(await command.run(['--events', 'a.csv'])).toBe(2);
    expect(out.err.join('\n')).toMatch(/--tracking is required/);
  });
});
