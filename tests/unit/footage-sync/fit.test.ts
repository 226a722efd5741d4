/**
 * Footage clock fit and proposed pairings. References: the simulator's ground truth of the
 * demo match (fixtures/demo/truth.json: footage clock segments, whistles with footageT and
 * trueT, restarts; fixtures/sim trueToSource for the tracking clock), invented clocks with
 * known offset and drift, and ml-matrix solving the weighted least-squares normal
 * equations (XᵀWX) β = XᵀWy for the weighted line.
 */
import { Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { fitFootageClock, pairResidual, proposePairings, type FootagePair, type TrackingAnchorInput } from '../../../engine/footage-sync/index.ts';
import { footageToTracking } from '../../../engine/fit/footage-map.ts';
import { huberFit } from '../../../engine/fit/robust.ts';
import { rng } from '../engine/helpers/rng.ts';
import { demoTruth, FPS, footageWhistles, markedKickOffs, trackingAnchors, truthAnchors } from './demo-case.ts';

const FRAME = 1 / FPS;
const trkPeriods = demoTruth.tracking!.periods.map((p) => ({ period: p.period, start: 0, end: (p.lastFrame - p.firstFrame) / demoTruth.tracking!.rate }));
const opts = { trackingPeriods: trkPeriods, footageDurationS: demoTruth.footage!.durationS };

/** Largest |fitted − true| tracking time over the truth anchors, with the worst one named. */
function worstError(fit: Parameters<typeof footageToTracking>[0]) {
  let worst = { what: '', e: 0 };
  const all: number[] = [];
  for (const a of truthAnchors()) {
    const m = footageToTracking(fit, a.tFootage);
    const e = m && m.period === a.period ? m.t - a.tTracking : Infinity;
    all.push(Math.abs(e));
    if (!(Math.abs(e) <= Math.abs(worst.e))) worst = { what: a.what, e };
  }
  return { ...worst, n: all.length, rms: Math.sqrt(all.reduce((s, e) => s + e * e, 0) / all.length) };
}

function accept(p: ReturnType<typeof proposePairings>[number], trk: TrackingAnchorInput[]): FootagePair {
  return { footageAnchorId: p.footageAnchorId, trackingAnchorId: p.trackingAnchorId, period: p.period, footageKind: 'whistle', tFootage: p.tFootage, tracking: trk.find((t) => t.id === p.trackingAnchorId)! };
}

describe('weighted Huber line (the fit under fitFootageClock)', () => {
  it('with no clipping equals weighted least squares (reference: ml-matrix solve of XᵀWX β = XᵀWy)', () => {
    const r = rng(3);
    const xs = Array.from({ length: 20 }, (_, i) => 10 * i + r());
    const ys = xs.map((x) => 4.2 + 1.0002 * x + 0.1 * r.normal());
    const w = xs.map((_, i) => (i % 3 === 0 ? 1 : 0.01 + 0.1 * r()));
    // minScale 10 s: k · scale exceeds every standardised residual, so Huber weights are all 1.
    const fit = huberFit(xs, ys, { weights: w, minScale: 10 });
    const X = new Matrix(xs.map((x) => [1, x]));
    const W = Matrix.diag(w);
    const beta = solve(X.transpose().mmul(W).mmul(X), X.transpose().mmul(W).mmul(Matrix.columnVector(ys)));
    expect(fit.intercept).toBeCloseTo(beta.get(0, 0), 9);
    expect(fit.slope).toBeCloseTo(beta.get(1, 0), 11);
  });

  it('weight 2 counts as the point twice (reference: the unweighted fit with the point duplicated)', () => {
    const xs = [0, 10, 20, 30, 40], ys = [1, 11.2, 20.9, 31.3, 41];
    const a = huberFit(xs, ys, { weights: [1, 1, 2, 1, 1], minScale: 5 });
    const b = huberFit([...xs, 20], [...ys, 20.9], { minScale: 5 });
    expect(a.slope).toBeCloseTo(b.slope, 10);
    expect(a.intercept).toBeCloseTo(b.intercept, 10);
  });
});

describe('footage fit on the demo match (reference: fixtures/demo/truth.json)', () => {
  const trk = trackingAnchors();
  const marks = markedKickOffs();

  it('the two marked kick-offs alone map footage to tracking within one footage frame (40 ms) at every truth anchor', () => {
    const fit = fitFootageClock(marks, opts);
    expect(fit.source).toBe('footage');
    expect(fit.segments.map((s) => s.period)).toEqual([1, 2]);
    const w = worstError(fit);
    console.log(`demo, two kick-offs marked: worst ${(w.e * 1000).toFixed(1)} ms (${w.what}), rms ${(w.rms * 1000).toFixed(1)} ms over ${w.n} truth anchors`);
    expect(Math.abs(w.e)).toBeLessThan(FRAME);
    // Segments cover each period's stretch of footage: the tracking period mapped through the fit.
    const p1 = fit.segments[0], p2 = fit.segments[1];
    expect(p1.fromT).toBeLessThan(30); // the kick-off at footage 30.0 s and the 3 s of tracking before it
    expect(p1.toT).toBeLessThanOrEqual(p2.fromT);
    expect(footageToTracking(fit, 10)).toBeUndefined(); // lead-in: before tracking starts
    expect(footageToTracking(fit, 246)).toBeUndefined(); // half-time, between the periods
  });

  it('proposes whistle pairings that are the true ones, no anchor twice, none in non-live footage', () => {
    const fit = fitFootageClock(marks, opts);
    const wh = footageWhistles();
    const props = proposePairings(fit, wh, trk, { nonLive: (demoTruth.nonLive ?? []), usedTracking: new Set(marks.map((m) => m.trackingAnchorId)) });
    expect(props.length).toBeGreaterThanOrEqual(5);
    const used = new Set<string>();
    for (const p of props) {
      const w = wh.find((x) => x.id === p.footageAnchorId)!;
      const r = demoTruth.restarts[Number(p.trackingAnchorId.slice(3))];
      // The whistle belongs to that restart: a take whistle (kick-off, penalty) within 1.5 s
      // before the kick, or the foul whistle before a free kick's ball comes to rest.
      if (r.kind === 'free_kick') expect(w.reason).toBe('foul');
      else expect(w.reason).toBe(r.kind);
      expect(r.playedT - w.trueT).toBeGreaterThan(0);
      expect(r.playedT - w.trueT).toBeLessThan(r.kind === 'free_kick' ? 6 : 1.5);
      expect(used.has(p.footageAnchorId) || used.has(p.trackingAnchorId)).toBe(false);
      used.add(p.footageAnchorId).add(p.trackingAnchorId);
      expect((demoTruth.nonLive ?? []).some((n) => p.tFootage >= n.fromT && p.tFootage < n.toT)).toBe(false);
      expect(p.label).toMatch(/^whistle at \d+:\d\d\.\d ↔ .+ at tracking \d+:\d\d\.\d$/);
      expect(p.score).toBeGreaterThan(0);
      expect(p.score).toBeLessThanOrEqual(1);
    }
    console.log(props.map((p) => `${p.label} (score ${p.score.toFixed(2)}, miss ${(p.missS * 1000).toFixed(0)} ms)`).join('\n'));
  });

  it('accepting every proposal keeps the fit within one frame of the truth, and the lags come out near the truth', () => {
    const fit0 = fitFootageClock(marks, opts);
    const props = proposePairings(fit0, footageWhistles(), trk, { nonLive: (demoTruth.nonLive ?? []), usedTracking: new Set(marks.map((m) => m.trackingAnchorId)) });
    const fit = fitFootageClock([...marks, ...props.map((p) => accept(p, trk))], opts);
    const w = worstError(fit);
    console.log(`demo, kick-offs + ${props.length} accepted whistles: worst ${(w.e * 1000).toFixed(1)} ms (${w.what}), rms ${(w.rms * 1000).toFixed(1)} ms; lags ${fit.model.lags.map((l) => `${l.kind} ${l.lagS.toFixed(2)}±${l.sdS.toFixed(2)} s (n ${l.n}, weight ${l.weight.toFixed(4)})`).join(', ')}`);
    expect(Math.abs(w.e)).toBeLessThan(FRAME);
    // Kick-off take whistles in the truth come 0.48–0.88 s before the kick (truth.json).
    const ko = fit.model.lags.find((l) => l.kind === 'kick_off')!;
    expect(ko.lagS).toBeGreaterThan(0.4);
    expect(ko.lagS).toBeLessThan(0.9);
    for (const l of fit.model.lags) expect(l.weight).toBeLessThan(0.01); // much lower than a marked frame (1)
    // A whistle pairing's residual is reported against its kind's lag: tenths of a second at most.
    for (const p of props) expect(Math.abs(pairResidual(fit, accept(p, trk)))).toBeLessThan(0.5);
  });

  it('an excluded pairing is not fitted', () => {
    const bad: FootagePair = { ...marks[0], footageAnchorId: 'wrong', tFootage: marks[0].tFootage + 2, excluded: true };
    const a = fitFootageClock(marks, opts), b = fitFootageClock([...marks, bad], opts);
    expect(b.segments[0].offset).toBe(a.segments[0].offset);
    expect(pairResidual(b, bad)).toBeCloseTo(-2, 1);
  });
});

describe('footage fit on invented clocks', () => {
  /** A period of footage 600 s long: t_trk = off + (1 + ppm) t_f; restarts every ~40 s. */
  function clockCase(seed: number, ppm: number, lagBias = 0) {
    const r = rng(seed);
    const off = -123.456, rate = 1 + ppm * 1e-6;
    const toTrk = (tf: number) => off + rate * tf;
    const trk: TrackingAnchorInput[] = [], marks: FootagePair[] = [], whistles: FootagePair[] = [];
    for (let i = 0; i < 15; i++) {
      const kickF = 140 + 40 * i + 10 * r(); // true footage moment of the kick
      const kind = i % 3 === 0 ? 'kick_off' : i % 3 === 1 ? 'penalty' : 'free_kick';
      const stillF = kickF - 2 - 3 * r();
      // Tracking sees the kick at its own 25 Hz frames (nearest frame).
      const a: TrackingAnchorInput = { id: `t${i}`, kind, period: 1, t: Math.round(toTrk(kickF) * 25) / 25, stillFromT: Math.round(toTrk(stillF) * 25) / 25, confidence: 1 };
      trk.push(a);
      marks.push({ footageAnchorId: `m${i}`, trackingAnchorId: a.id, period: 1, footageKind: kind, tFootage: Math.ceil(kickF * FPS) / FPS, tracking: a });
      // Whistle: before the kick (kick-off, penalty) or before the rest (free kick), lag varying ±0.25 s.
      const lag = (kind === 'free_kick' ? 1.0 : 0.7) + 0.25 * r.normal() + lagBias;
      const wf = (kind === 'free_kick' ? stillF : kickF) - lag;
      whistles.push({ footageAnchorId: `w${i}`, trackingAnchorId: a.id, period: 1, footageKind: 'whistle', tFootage: wf, tracking: a });
    }
    return { trk, marks, whistles, toTrk, off, ppm };
  }
  const copts = { trackingPeriods: [{ period: 1, start: 0, end: 600 }] };

  it('every restart marked: drift recovered within 4 SE and the map within half a frame (reference: the invented clock)', () => {
    for (const [seed, ppm] of [[1, 150], [2, -220], [3, 40]] as const) {
      const c = clockCase(seed, ppm);
      const fit = fitFootageClock(c.marks, copts);
      const s = fit.segments[0];
      expect(Math.abs(s.driftPpm - ppm)).toBeLessThan(4 * s.rateSe * 1e6 + 5);
      for (const tf of [150, 300, 450, 700]) expect(Math.abs(s.offset + s.rate * tf - c.toTrk(tf))).toBeLessThan(FRAME / 2);
    }
  });

  it('accepting whistle pairings whose lags are off by a second cannot pull the marked fit by a frame (guard)', () => {
    for (const bias of [-1, 0.6, 1.5]) {
      const c = clockCase(7, 90, bias);
      const base = fitFootageClock(c.marks.slice(0, 2), copts);
      const fit = fitFootageClock([...c.marks.slice(0, 2), ...c.whistles], copts);
      for (const m of c.marks.slice(0, 2)) {
        const t = m.tFootage - FRAME / 2;
        expect(Math.abs(footageToTracking(fit, t)!.t - footageToTracking(base, t)!.t)).toBeLessThanOrEqual(FRAME / 4 + 1e-9);
      }
      // And nowhere in the period does it move more than half a frame from the marks alone.
      for (const tf of [150, 300, 450, 600, 720]) expect(Math.abs(footageToTracking(fit, tf)!.t - footageToTracking(base, tf)!.t)).toBeLessThanOrEqual(FRAME / 2 + 1e-9);
    }
  });

  it('with whistles only (no mark) the fit still places the period, at the lag model’s accuracy', () => {
    const c = clockCase(11, 60);
    const fit = fitFootageClock(c.whistles, copts);
    for (const tf of [200, 400, 600]) expect(Math.abs(footageToTracking(fit, tf)!.t - c.toTrk(tf))).toBeLessThan(0.3);
  });

  it('proposals: nothing inside a non-live interval, cuts never paired, used anchors never proposed again', () => {
    const c = clockCase(5, 0);
    const fit = fitFootageClock(c.marks.slice(0, 3), copts);
    const fa = c.whistles.map((w) => ({ id: w.footageAnchorId, kind: 'whistle' as const, t: w.tFootage, confidence: 0.9 }));
    const all = proposePairings(fit, fa, c.trk, { usedTracking: new Set(['t0', 't1', 't2']) });
    expect(all.every((p) => !['t0', 't1', 't2'].includes(p.trackingAnchorId))).toBe(true);
    expect(all.length).toBeGreaterThanOrEqual(8);
    const right = all.filter((p) => p.footageAnchorId.slice(1) === p.trackingAnchorId.slice(1)).length;
    expect(right / all.length).toBeGreaterThan(0.9);
    const hidden = { fromT: fa[6].t - 1, toT: fa[6].t + 1 };
    const some = proposePairings(fit, fa, c.trk, { nonLive: [hidden] });
    expect(some.some((p) => p.tFootage >= hidden.fromT && p.tFootage < hidden.toT)).toBe(false);
    const cuts = proposePairings(fit, fa.map((a) => ({ ...a, kind: 'cut' as const })), c.trk);
    expect(cuts).toEqual([]);
    const again = proposePairings(fit, fa, c.trk, { usedFootage: new Set(fa.map((a) => a.id)) });
    expect(again).toEqual([]);
  });
});
