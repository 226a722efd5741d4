import { linearRegression } from 'simple-statistics';
import { TheilSenRegression } from 'ml-regression-theil-sen';
import { describe, expect, it } from 'vitest';
import { fitClock, fitClocks, findBreaks, mapTime, type ClockPair } from '../../../engine/fit/clock.ts';
import { huberFit, mad, median, theilSen } from '../../../engine/fit/robust.ts';
import { rng } from './helpers/rng.ts';

/** Anchor pairings of a clock with a known offset and drift plus gaussian-ish jitter. */
function pairs(offset: number, ppm: number, n: number, jitter: number, seed: number, span = 2700): ClockPair[] {
  const r = rng(seed);
  return Array.from({ length: n }, (_, i) => {
    const t = (span * (i + r())) / n;
    return { anchorId: `a${i}`, kind: 'throw_in', t, tRef: offset + (1 + ppm * 1e-6) * t + jitter * r.normal() };
  });
}

describe('robust line fits against reference libraries', () => {
  const clean = pairs(83.25, 150, 60, 0.02, 1);
  const xs = clean.map((p) => p.t);
  const ys = clean.map((p) => p.tRef);

  it('Huber on clean data matches ordinary least squares of simple-statistics linearRegression', () => {
    // With small gaussian noise every Huber weight stays near 1, so the estimate is OLS.
    const ref = linearRegression(clean.map((p) => [p.t, p.tRef]));
    const fit = huberFit(xs, ys);
    expect(fit.slope).toBeCloseTo(ref.m, 5);
    expect(fit.intercept).toBeCloseTo(ref.b, 2);
  });

  it('Theil–Sen equals ml-regression-theil-sen on the same data (with outliers)', () => {
    // 59 points: an odd number of points and of pairs (1711), so both medians are the
    // single middle value whichever even-count convention the library uses.
    const x59 = xs.slice(0, 59);
    const dirty = ys.slice(0, 59).map((y, i) => (i % 9 === 0 ? y + 7 : y));
    const ref = new TheilSenRegression(x59, dirty);
    const ours = theilSen(x59, dirty);
    expect(ours.slope).toBeCloseTo(ref.slope, 12);
    expect(ours.intercept).toBeCloseTo(ref.intercept, 9);
  });

  it('median and MAD on a textbook list (definition of the median absolute deviation)', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(mad([1, 2, 3, 4, 100])).toBe(1);
  });
});

describe('fitClock', () => {
  it('recovers offset and drift and flags gross outliers by MAD (invented clock, Huber IRLS)', () => {
    const ps = pairs(-41.7, -220, 80, 0.05, 7);
    ps[10].tRef += 6; // a goal kick logged 6 s late
    ps[50].tRef -= 9;
    const seg = fitClock(ps, 1);
    expect(Math.abs(seg.offset - -41.7)).toBeLessThan(0.05);
    expect(Math.abs(seg.driftPpm - -220)).toBeLessThan(25);
    const rejected = seg.points.filter((p) => !p.used).map((p) => p.anchorId).sort();
    expect(rejected).toEqual(['a10', 'a50']);
    expect(seg.rmsResidual).toBeLessThan(0.08);
    // Standard errors describe the scatter: truth within ~4 SE.
    expect(Math.abs(seg.offset - -41.7)).toBeLessThan(4 * seg.offsetSe + 1e-3);
    expect(seg.leaveOneOutMax).toBeGreaterThan(0);
    expect(seg.leaveOneOutMax).toBeLessThan(0.05);
  });

  it('splits a period at a clock jump and fits each side', () => {
    const ps = pairs(10, 100, 60, 0.05, 3);
    for (const p of ps) if (p.t > 1500) p.tRef += 4; // the log's clock skipped 4 s
    const cuts = findBreaks(ps);
    expect(cuts.length).toBe(1);
    const fit = fitClocks(new Map([[2, ps]]), 'events');
    expect(fit.segments.length).toBe(2);
    expect(mapTime(fit, 2, 1000)).toBeCloseTo(10 + 1000 * (1 + 1e-4), 1);
    expect(mapTime(fit, 2, 2000)).toBeCloseTo(14 + 2000 * (1 + 1e-4), 1);
  });

  it('does not split a clean period', () => {
    expect(findBreaks(pairs(0, 0, 100, 0.1, 11))).toEqual([]);
  });
});
