/**
 * The weak drift prior of the clock fit (penalised / MAP Huber IRLS). References: the
 * unpenalised fit of the same module (itself checked against simple-statistics in
 * fit.test.ts), and the closed-form ridge / Bayesian linear regression solution
 * β = (XᵀX + λD)⁻¹ (Xᵀy + λD β₀), Cov = σ² (XᵀX + λD)⁻¹, solved here with ml-matrix.
 */
import { Matrix, inverse, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DRIFT_PRIOR, fitClock, type ClockPair } from '../../../engine/fit/clock.ts';
import { huberFit } from '../../../engine/fit/robust.ts';
import { rng } from './helpers/rng.ts';

function pairs(offset: number, ppm: number, n: number, jitter: number, seed: number, span: number): ClockPair[] {
  const r = rng(seed);
  return Array.from({ length: n }, (_, i) => {
    const t = (span * (i + r())) / n;
    return { anchorId: `a${i}`, kind: 'throw_in', t, tRef: offset + (1 + ppm * 1e-6) * t + jitter * r.normal() };
  });
}

describe('drift prior: data dominate when plentiful', () => {
  it('500 clean anchors over 45 min: prior fit equals the unpenalised fit (reference: same fit with driftPrior null)', () => {
    const ps = pairs(-12.4, 180, 500, 0.05, 21, 2700);
    const free = fitClock(ps, 1, { driftPrior: null });
    const map = fitClock(ps, 1); // default prior, 0 ± 300 ppm
    // λ = (0.05 s / 300 ppm)² ≈ 2.8e4 s² against Σ(t - t̄)² ≈ 3e8 s²: a shift of ~1e-4 of the drift.
    expect(Math.abs(map.driftPpm - free.driftPpm)).toBeLessThan(0.2);
    expect(Math.abs(map.offset - free.offset)).toBeLessThan(1e-3);
    expect(Math.abs(map.rateSe - free.rateSe) / free.rateSe).toBeLessThan(1e-3);
    expect(map.points.filter((p) => !p.used).length).toBe(free.points.filter((p) => !p.used).length);
    // And both recover the invented clock (truth within 4 SE).
    expect(Math.abs(map.driftPpm - 180)).toBeLessThan(4 * map.rateSe * 1e6);
  });
});

describe('drift prior: few noisy points', () => {
  // 12 tags over 4 minutes with jitter of ±0.4 s at most: a large minScale (1 s) fixes the
  // robust scale, and k · scale = 1.345 s exceeds every residual, so every Huber weight is
  // 1 and the MAP fit must be exactly the ridge solution with λ = (1 s / 300 ppm)².
  const r = rng(5);
  const ts = Array.from({ length: 12 }, (_, i) => 20 * i + 5 * r());
  const noise = [0.31, -0.22, 0.4, -0.38, 0.05, 0.27, -0.33, 0.12, -0.09, 0.36, -0.4, 0.18];
  const ys = ts.map((t, i) => 57.3 + (1 + 90e-6) * t + noise[i]);
  const sd = DEFAULT_DRIFT_PRIOR.sdPpm * 1e-6;
  const fit = huberFit(ts, ys, { minScale: 1, slopePrior: { mean: 1, sd } });

  // Reference: augmented normal equations of Bayesian linear regression (ml-matrix).
  const lambda = (1 / sd) ** 2;
  const X = new Matrix(ts.map((t) => [1, t]));
  const y = Matrix.columnVector(ys);
  const A = X.transpose().mmul(X).add(new Matrix([[0, 0], [0, lambda]]));
  const rhs = X.transpose().mmul(y).add(Matrix.columnVector([0, lambda * 1]));
  const beta = solve(A, rhs);
  const resid = ys.map((v, i) => v - beta.get(0, 0) - beta.get(1, 0) * ts[i]);
  const sigma2 = resid.reduce((s, e) => s + e * e, 0) / (ts.length - 2);
  const cov = inverse(A).mul(sigma2);

  it('every Huber weight is 1 (precondition of the closed form)', () => {
    expect(Math.min(...fit.weights)).toBe(1);
    expect(fit.scale).toBe(1);
    expect(fit.priorWeight).toBeCloseTo(lambda, 6);
  });

  it('estimate equals the closed-form ridge solution (reference: ml-matrix solve of (XᵀX + λD) β = Xᵀy + λD β₀)', () => {
    expect((fit.slope - 1) * 1e6).toBeCloseTo((beta.get(1, 0) - 1) * 1e6, 3); // ppm, to 0.001
    expect(fit.intercept).toBeCloseTo(beta.get(0, 0), 7);
  });

  it('standard errors equal σ² (XᵀX + λD)⁻¹ of the penalised normal equations (reference: ml-matrix inverse)', () => {
    expect(fit.slopeSe / Math.sqrt(cov.get(1, 1))).toBeCloseTo(1, 9);
    expect(fit.interceptSe / Math.sqrt(cov.get(0, 0))).toBeCloseTo(1, 9);
  });

  it('shrinks the drift toward 0 compared with the unpenalised fit, with a smaller SE', () => {
    const free = huberFit(ts, ys, { minScale: 1 });
    expect(Math.abs(fit.slope - 1)).toBeLessThan(Math.abs(free.slope - 1));
    expect(fit.slopeSe).toBeLessThan(free.slopeSe);
    // Posterior SD below the prior SD (Bayesian linear regression; here σ̂ < the 1 s scale in λ).
    expect(fit.slopeSe).toBeLessThan(sd);
  });
});
