import { describe, expect, it } from 'vitest';
import { savgolSeries, savgolWeights } from '../../../engine/kinematics/savgol.ts';

const close = (got: ArrayLike<number>, want: number[]) => {
  expect(got.length).toBe(want.length);
  for (let i = 0; i < want.length; i++) expect(got[i]).toBeCloseTo(want[i], 12);
};

describe('Savitzky–Golay weights', () => {
  // Source: Savitzky & Golay (1964) convolution tables, via /work/shared/REFERENCES.md (from memory).
  it('quadratic smoothing, 5 points = (-3, 12, 17, 12, -3)/35 (Savitzky & Golay 1964, from memory)', () => {
    close(savgolWeights(-2, 2, 2, 0), [-3, 12, 17, 12, -3].map((v) => v / 35));
  });
  it('quadratic smoothing, 7 points = (-2, 3, 6, 7, 6, 3, -2)/21 (Savitzky & Golay 1964, from memory)', () => {
    close(savgolWeights(-3, 3, 2, 0), [-2, 3, 6, 7, 6, 3, -2].map((v) => v / 21));
  });
  it('quadratic first derivative, 5 points = (-2..2)/10 (Savitzky & Golay 1964, from memory)', () => {
    close(savgolWeights(-2, 2, 2, 1), [-2, -1, 0, 1, 2].map((v) => v / 10));
  });
  it('quadratic first derivative, 7 points = (-3..3)/28 (Savitzky & Golay 1964, from memory)', () => {
    close(savgolWeights(-3, 3, 2, 1), [-3, -2, -1, 0, 1, 2, 3].map((v) => v / 28));
  });
  it('cubic smoothing equals quadratic smoothing for a symmetric window (property of the method, Savitzky & Golay 1964)', () => {
    close(savgolWeights(-3, 3, 3, 0), Array.from(savgolWeights(-3, 3, 2, 0)));
  });
  it('lopsided edge windows reproduce polynomials exactly (least-squares property: a degree-p fit of a degree-p polynomial is exact)', () => {
    const poly = (t: number) => 2 - 3 * t + 0.5 * t * t;
    for (const [from, to] of [[0, 4], [-4, 0], [-1, 5]]) {
      const w0 = savgolWeights(from, to, 2, 0);
      const w1 = savgolWeights(from, to, 2, 1);
      const w2 = savgolWeights(from, to, 2, 2);
      let s0 = 0, s1 = 0, s2 = 0;
      for (let k = from; k <= to; k++) {
        s0 += w0[k - from] * poly(k);
        s1 += w1[k - from] * poly(k);
        s2 += w2[k - from] * poly(k);
      }
      expect(s0).toBeCloseTo(2, 10);
      expect(s1).toBeCloseTo(-3, 10);
      expect(s2).toBeCloseTo(1, 10);
    }
  });
});

describe('savgolSeries on data with gaps', () => {
  it('differentiates a ramp exactly per second and never across a gap', () => {
    const v = [0, 1, 2, 3, 4, 5, NaN, NaN, 100, 101, 102, 103, 104];
    const d = savgolSeries(v, { half: 2, order: 2, deriv: 1, dt: 0.5 });
    for (const i of [0, 1, 2, 3, 4, 5, 8, 9, 10, 11, 12]) expect(d[i]).toBeCloseTo(2, 10);
    expect(Number.isNaN(d[6]) && Number.isNaN(d[7])).toBe(true);
  });
  it('leaves runs too short to fit as NaN', () => {
    const d = savgolSeries([1, 2, NaN, 5, NaN], { half: 2, order: 2 });
    expect(Array.from(d).every(Number.isNaN)).toBe(true);
  });
  it('reads a strided frame-major column', () => {
    // two objects interleaved: object 1 is a parabola 0.5 t^2 (second derivative 1).
    const frames = 12;
    const arr = new Float32Array(frames * 2);
    for (let f = 0; f < frames; f++) {
      arr[f * 2] = 7;
      arr[f * 2 + 1] = 0.5 * f * f;
    }
    const a = savgolSeries(arr, { half: 3, order: 2, deriv: 2 }, 2, 1, frames);
    for (const v of a) expect(v).toBeCloseTo(1, 3);
  });
});
