import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { proposeNonLive } from '../../../engine/cuts/index.ts';
import { scanFootageWhistles } from '../../../electron/host/audio/scan-footage.ts';
import { scanFootageCuts } from '../../../electron/host/footage/frames-scan.ts';

// The invented demo match (fixtures/demo, made by the simulator): its truth.json gives the
// footage clock's segments (live, replay) and the non-live stretches.
const demo = new URL('../../../fixtures/demo/', import.meta.url).pathname;
const truth = JSON.parse(readFileSync(demo + 'truth.json', 'utf8')) as {
  footage: { fps: number; file: string };
  clocks: { footage: { segments: { fromT: number; toT: number; kind: string; period: number }[] } };
  nonLive: { fromT: number; toT: number; kind: string }[];
};
const fps = truth.footage.fps;
const footage = demo + truth.footage.file;

/** Every picture change the truth knows: a segment boundary that switches kind or period. */
function truthCuts(): number[] {
  const s = truth.clocks.footage.segments;
  return s.slice(1).filter((x, i) => x.kind !== s[i].kind || x.period !== s[i].period).map((x) => x.fromT);
}

describe('cuts of the demo match footage', () => {
  it('finds the half-time cut and both replays’ boundaries within one frame, and nothing else', async () => {
    const r = await scanFootageCuts(footage, { engine: 'native' });
    const expected = truthCuts();
    expect(expected).toHaveLength(5);
    expect(r.cuts).toHaveLength(expected.length);
    r.cuts.forEach((c, i) => expect(Math.abs(c.t - expected[i]), `cut ${i + 1} at ${c.t} vs truth ${expected[i]}`).toBeLessThanOrEqual(1 / fps + 1e-6));

    const { candidates } = await scanFootageWhistles(footage, { engine: 'native' });
    const proposals = proposeNonLive(r.cuts, candidates);
    const replays = truth.nonLive.filter((n) => n.kind === 'replay');
    for (const t of replays) {
      const p = proposals.find((x) => x.kind === 'replay' && x.fromT < t.toT && x.toT > t.fromT);
      expect(p, `a replay proposal overlapping truth ${t.fromT}–${t.toT}`).toBeDefined();
      expect(Math.abs(p!.fromT - t.fromT)).toBeLessThanOrEqual(1 / fps + 1e-6);
      expect(Math.abs(p!.toT - t.toT)).toBeLessThanOrEqual(1 / fps + 1e-6);
    }
    const half = truth.nonLive.find((n) => n.kind === 'half_time')!;
    const h = proposals.filter((x) => x.kind === 'half_time');
    expect(h).toHaveLength(1);
    // Overlap of the proposal with the truth stretch, as a share of the truth stretch.
    const overlap = Math.min(h[0].toT, half.toT) - Math.max(h[0].fromT, half.fromT);
    expect(overlap / (half.toT - half.fromT)).toBeGreaterThan(0.8);
    // Nothing proposed over live play beyond the truth's non-live stretches (one second of slack).
    for (const p of proposals) {
      expect(truth.nonLive.some((n) => p.fromT >= n.fromT - 1 && p.toT <= n.toT + 1), `${p.kind} ${p.fromT}–${p.toT} lies inside a truth non-live stretch`).toBe(true);
    }
  });
});
