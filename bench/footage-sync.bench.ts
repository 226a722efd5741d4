/**
 * Footage clock refresh: fitFootageClock + proposePairings, as the Sync screen redoes them
 * on every change, on a full-length case (2 × 48 min of footage, a mark at every restart
 * of the first period, 60 whistles, 120 tracking restarts). Prints figures and ratios;
 * never fails on a timing. Reference: simple-statistics linearRegression (npm) on the same
 * points (an unweighted, non-robust line: the floor any fit of these points costs).
 *   npx tsx bench/footage-sync.bench.ts
 */
import { linearRegression } from 'simple-statistics';
import { fitFootageClock, proposePairings, type FootagePair, type TrackingAnchorInput, type FootageAnchorInput } from '../engine/footage-sync/index.ts';

let seed = 9;
const rand = () => ((seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32);
const trk: TrackingAnchorInput[] = [], pairs: FootagePair[] = [], whistles: FootageAnchorInput[] = [];
for (const period of [1, 2]) {
  const base = period === 1 ? 60 : 3060;
  for (let i = 0; i < 60; i++) {
    const tf = base + 45 * i + 20 * rand();
    const kind = (['throw_in', 'free_kick', 'kick_off', 'penalty', 'corner'] as const)[i % 5];
    const a: TrackingAnchorInput = { id: `t${period}-${i}`, kind, period, t: tf - base + 3 + 1e-4 * tf, stillFromT: tf - base + 1, confidence: 1 };
    trk.push(a);
    if (period === 1 && i % 2 === 0) pairs.push({ footageAnchorId: `m${period}-${i}`, trackingAnchorId: a.id, period, footageKind: kind, tFootage: Math.ceil(tf * 25) / 25, tracking: a });
    if (kind === 'free_kick' || kind === 'kick_off' || kind === 'penalty') {
      whistles.push({ id: `w${period}-${i}`, kind: 'whistle', t: tf - 0.7 + 0.2 * (rand() - 0.5), confidence: 0.8 });
      if (period === 2 && i < 3) pairs.push({ footageAnchorId: `w${period}-${i}`, trackingAnchorId: a.id, period, footageKind: 'whistle', tFootage: tf - 0.7, tracking: a });
    }
  }
}
const periods = [{ period: 1, start: 0, end: 2880 }, { period: 2, start: 0, end: 2880 }];

function time(label: string, n: number, f: () => void): number {
  for (let i = 0; i < 5; i++) f();
  const t0 = performance.now();
  for (let i = 0; i < n; i++) f();
  const ms = (performance.now() - t0) / n;
  console.log(`${label}: ${ms.toFixed(3)} ms`);
  return ms;
}

const fitMs = time(`fitFootageClock (${pairs.length} pairs)`, 200, () => void fitFootageClock(pairs, { trackingPeriods: periods }));
const fit = fitFootageClock(pairs, { trackingPeriods: periods });
const propMs = time(`proposePairings (${whistles.length} whistles × ${trk.length} restarts)`, 200, () => void proposePairings(fit, whistles, trk));
const pts = pairs.map((p) => [p.tFootage, p.tracking.t]);
const refMs = time('simple-statistics linearRegression, same points', 2000, () => void linearRegression(pts));
console.log(`refresh (fit + proposals) ${(fitMs + propMs).toFixed(2)} ms = ${((fitMs + propMs) / refMs).toFixed(0)}× a plain least-squares line over the same points (robust, weighted, guarded, two periods, proposals)`);
