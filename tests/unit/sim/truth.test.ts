import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { sourceToTrue, trueToSource, trueToTrackingFrame, type Truth } from '../../../fixtures/sim/truth.ts';

// Internal consistency of the committed truth: every clock map inverts, the footage map
// skips replays, and the tracking map reproduces the frame numbers in tracking.csv.
const demo = new URL('../../../fixtures/demo/', import.meta.url).pathname;
const truth = JSON.parse(readFileSync(demo + 'truth.json', 'utf8')) as Truth;

describe('truth helpers on the demo truth', () => {
  it('sourceToTrue inverts trueToSource for every source', () => {
    for (const src of ['tracking', 'events', 'footage'] as const)
      for (const e of truth.events.filter((_, i) => i % 7 === 0)) {
        const s = trueToSource(truth, src, e.trueT);
        if (!s) continue; // footage cut or replaced by a replay
        expect(sourceToTrue(truth, src, s.t, s.period)).toBeCloseTo(e.trueT, 6);
      }
  });

  it('whistle footage times agree with the footage clock map', () => {
    for (const w of truth.whistles!) expect(trueToSource(truth, 'footage', w.trueT)!.t).toBeCloseTo(w.footageT, 4);
  });

  it('replays map footage time onto earlier true time and are listed as non-live', () => {
    const replays = truth.clocks.footage!.segments.filter((s) => s.kind === 'replay');
    expect(replays.length).toBeGreaterThan(0);
    for (const r of replays) {
      const shown = sourceToTrue(truth, 'footage', (r.fromT + r.toT) / 2);
      const before = truth.clocks.footage!.segments.find((s) => s.kind === 'live' && Math.abs(s.toT - r.fromT) < 1e-3)!;
      expect(shown).toBeLessThan(before.offset + before.rate * before.toT);
      expect(truth.nonLive!.some((n) => n.kind === 'replay' && Math.abs(n.fromT - r.fromT) < 1e-3)).toBe(true);
    }
  });

  it('trueToTrackingFrame matches the frame column of tracking.csv at the first kick-off', () => {
    const lines = readFileSync(demo + 'tracking.csv', 'utf8').split('\n');
    const ko = truth.periods[0].trueStart;
    const f = trueToTrackingFrame(truth, ko)!;
    const row = lines.find((l) => l.startsWith(`1,${f},`));
    expect(row).toBeDefined();
    const t = Number(row!.split(',')[2]);
    expect(sourceToTrue(truth, 'tracking', t, 1)).toBeCloseTo(ko, 1);
  });

  it('the first logged kick-off is within the jitter bound of its true time (Law 8 restart, event clock)', () => {
    const e = truth.events.find((x) => x.kind === 'kick_off')!;
    expect(Math.abs(e.timeErrorS)).toBeLessThan(1.6); // 3 sd of 0.5 s jitter, 0.1 s rounding
  });
});
