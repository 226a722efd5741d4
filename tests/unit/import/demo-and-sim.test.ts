import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { TrackingData } from '../../../shared-types/domain.ts';
import type { EventMapping, TrackingMapping } from '../../../shared-types/import.ts';
import { detectSource, importEvents, importTracking } from '../../../engine/import/index.ts';
import { simulateMatch, writeEvents, writeTracking, type TrackingWriteOptions } from '../../../fixtures/sim/index.ts';
import { chunked } from './helpers/synthetic.ts';

// The simulator (fixtures/sim, another engineer's code) writes what a provider would; its
// truth tables are the reference the importer's output is checked against.
const demoDir = new URL('../../../fixtures/demo/', import.meta.url);
const hasDemo = existsSync(new URL('tracking.csv', demoDir)) && existsSync(new URL('events.csv', demoDir)) && existsSync(new URL('truth.json', demoDir));

describe.runIf(hasDemo)('the demo match (fixtures/demo) imports cleanly', () => {
  const read = (f: string) => readFileSync(new URL(f, demoDir), 'utf8');
  const truth = hasDemo ? JSON.parse(read('truth.json')) : null;

  it('tracking.csv: wide, metres, centre, 25 Hz, periods and missing frames as in truth.json', async () => {
    const text = read('tracking.csv');
    const d = detectSource('tracking.csv', text.slice(0, 65536));
    const m = d.mapping as TrackingMapping;
    expect(m).toMatchObject({ layout: 'wide', rate: truth.tracking.rate, coordinates: { unit: truth.tracking.unit, origin: truth.tracking.origin } });
    const r = await importTracking(chunked(text, 65536), { fileName: 'tracking.csv', mapping: m });
    expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
    expect(r.ok).toBe(true);
    expect(r.rejectedRows).toEqual([]);
    const data = r.data!;
    for (const tp of truth.tracking.periods) {
      const p = data.periods.find((q) => q.period === tp.period)!;
      expect(p.firstFrame).toBe(tp.firstFrame);
      expect(p.firstFrame + p.frameCount - 1).toBe(tp.lastFrame);
      expect(p.frameCount - p.present.reduce((a, b) => a + b, 0)).toBe(tp.missingFrames);
    }
    expect(data.periods.map((p) => p.homeAttacks)).toEqual(truth.periods.map((p: { homeAttacks: string }) => p.homeAttacks));
    expect(data.objects[data.ballIndex].id).toBe('ball');
  });

  it('events.csv: every row, sides by team name, logged times as in truth.json', async () => {
    const text = read('events.csv');
    const d = detectSource('events.csv', text);
    const m = d.mapping as EventMapping;
    expect(m).toMatchObject({ clock: 'match_clock_continuing', coordinates: { unit: 'm', origin: 'bottom_left', yDown: false } });
    const r = await importEvents(chunked(text), { fileName: 'events.csv', mapping: m });
    expect(r.ok).toBe(true);
    expect(r.data!.teams).toEqual({ home: truth.teams.home.name, away: truth.teams.away.name });
    expect(r.data!.events).toHaveLength(truth.events.length);
    for (const te of truth.events) {
      const e = r.data!.events.find((x) => x.row === te.row)!;
      expect(e.kind).toBe(te.kind);
      expect(e.period).toBe(te.period);
      expect(e.team).toBe(te.team);
      expect(e.t).toBeCloseTo(te.loggedT, 6);
    }
  });
});

describe('simulator writers in every layout, unit and clock style (fixtures/sim as reference)', () => {
  const world = simulateMatch({ seed: 5, periodSeconds: [40, 40], preRollS: [5, 5], postRollS: 2, intervalS: 120 });
  let reference: TrackingData | undefined;

  const trackingCases = [
    { layout: 'wide', unit: 'm', origin: 'centre', rate: 25 },
    { layout: 'long', unit: 'cm', origin: 'bottom_left', rate: 25 },
    { layout: 'wide', unit: 'normalised', origin: 'bottom_left', rate: 10 },
    { layout: 'long', unit: 'm', origin: 'top_left', yDown: true, rate: 10 },
    { layout: 'wide', unit: 'm', origin: 'centre', rate: 25, ballAbsent: true },
  ] as const;
  for (const tc of trackingCases) {
    it(`tracking ${JSON.stringify(tc)}: periods, frames, directions and positions`, async () => {
      const out = writeTracking(world, { ...(tc as TrackingWriteOptions), seed: 1, noiseM: 0, missingFrameRate: 0.01, missingObjectRate: 0.01 });
      const d = detectSource('t.csv', out.text.slice(0, 65536));
      const m = d.mapping as TrackingMapping;
      expect(m.layout).toBe(tc.layout);
      expect(m.rate).toBe(tc.rate);
      expect(m.coordinates.unit).toBe(tc.unit);
      // A corner grid's y direction cannot be told from values: the analyst sets it (as here).
      if (tc.origin === 'top_left') m.coordinates = { ...m.coordinates, origin: 'top_left', yDown: true };
      else expect(m.coordinates.origin).toBe(tc.origin);
      const r = await importTracking(chunked(out.text, 4093), { fileName: 't.csv', mapping: m });
      expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
      const data = r.data!;
      expect(data.rate).toBe(out.meta.rate);
      expect(data.ballIndex >= 0).toBe(out.meta.ball);
      for (const mp of out.meta.periods) {
        const p = data.periods.find((q) => q.period === mp.period)!;
        expect([p.firstFrame, p.firstFrame + p.frameCount - 1]).toEqual([mp.firstFrame, mp.lastFrame]);
        expect(p.frameCount - p.present.reduce((a, b) => a + b, 0)).toBe(mp.missingFrames);
      }
      expect(data.periods.map((p) => p.homeAttacks)).toEqual(world.periods.map((p) => p.homeAttacks));
      if (tc.rate === 25 && !('ballAbsent' in tc)) {
        // Same match in two grids: the same centre-metre positions within the files' rounding.
        if (!reference) reference = data;
        else {
          let worst = 0;
          for (const [pi, p] of data.periods.entries()) {
            const q = reference.periods[pi];
            for (let k = 0; k < p.x.length; k++) if (p.x[k] === p.x[k] && q.x[k] === q.x[k]) worst = Math.max(worst, Math.abs(p.x[k] - q.x[k]), Math.abs(p.y[k] - q.y[k]));
          }
          expect(worst).toBeLessThan(0.02);
        }
      }
    });
  }

  const eventCases = [
    { clock: 'mmss', format: 'csv', variant: 'standard' },
    { clock: 'seconds', format: 'csv', variant: 'alt' },
    { clock: 'iso8601', format: 'json', variant: 'standard' },
    { clock: 'mmss', format: 'json', variant: 'alt' },
  ] as const;
  for (const ec of eventCases) {
    it(`events ${JSON.stringify(ec)}: kinds, periods, sides and logged times`, async () => {
      const out = writeEvents(world, { ...ec, seed: 2 });
      const d = detectSource(ec.format === 'json' ? 'e.json' : 'e.csv', out.text);
      expect(d.kind).toBe('events');
      const r = await importEvents(chunked(out.text, 511), { fileName: 'e', mapping: d.mapping as EventMapping });
      expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
      expect(r.ok).toBe(true);
      const events = r.data!.events;
      expect(events).toHaveLength(out.meta.events.length);
      for (const [i, te] of out.meta.events.entries()) {
        const e = events[i];
        expect([e.kind, e.period, e.team]).toEqual([te.kind, te.period, te.team]);
        expect(e.t).toBeCloseTo(te.loggedT, 3);
      }
    });
  }
});
