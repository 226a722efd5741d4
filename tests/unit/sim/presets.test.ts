import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { buildTruth, PRESETS, simulateMatch, sourceToTrue, writeEvents, writeTracking, type TrackingWriteOptions } from '../../../fixtures/sim/index.ts';

// Every preset writes files whose truth explains them (papaparse reads the CSV).
const w = simulateMatch({ seed: 21, periodSeconds: [45, 45], preRollS: [5, 5] });

describe('source presets', () => {
  for (const [name, p] of Object.entries(PRESETS)) {
    it(`${name}: tracking frames and event rows map back to true time`, () => {
      const trk = writeTracking(w, p.tracking);
      const evt = writeEvents(w, p.events);
      const truth = buildTruth(w, { tracking: trk.meta, events: evt.meta });
      const rows = Papa.parse<Record<string, string>>(trk.text.trim(), { header: true }).data;
      expect(rows.length).toBeGreaterThan(100);
      const rate = (p.tracking as TrackingWriteOptions).rate ?? 25;
      const first = truth.tracking!.periods[0];
      const r = rows[Math.floor(rows.length / 4)];
      expect(Number(r.time_s)).toBeCloseTo((Number(r.frame) - first.firstFrame) / rate, 6);
      const tTrue = sourceToTrue(truth, 'tracking', Number(r.time_s), 1);
      expect(tTrue).toBeGreaterThan(w.periods[0].t0);
      for (const e of truth.events) expect(Math.abs(sourceToTrue(truth, 'events', e.loggedT - e.timeErrorS, e.period) - e.trueT)).toBeLessThan(0.06);
    });
  }
});
