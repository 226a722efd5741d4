import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { RealFft } from '../../../engine/audio/fft.ts';

// Outside references: fft.js 4.0.4 (npm) realTransform, and the DFT definition itself.
function mulberry32(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('RealFft power spectrum', () => {
  for (const n of [8, 64, 512, 1024]) {
    it(`n=${n}: equals fft.js realTransform |X|² on random frames`, () => {
      const rnd = mulberry32(n);
      const ours = new RealFft(n);
      const ref = new FFT(n);
      const frame = Array.from({ length: n }, () => rnd() * 2 - 1);
      const out = ref.createComplexArray() as number[];
      ref.realTransform(out, frame);
      ref.completeSpectrum(out);
      const power = new Float64Array(n / 2 + 1);
      ours.power(frame, power);
      let worst = 0;
      for (let k = 0; k <= n / 2; k++) {
        const p = out[2 * k] ** 2 + out[2 * k + 1] ** 2;
        worst = Math.max(worst, Math.abs(p - power[k]) / (1 + p));
      }
      expect(worst).toBeLessThan(1e-9);
    });
  }
  it('n=32: complex bins equal a direct DFT (definition)', () => {
    const n = 32;
    const rnd = mulberry32(3);
    const frame = Array.from({ length: n }, () => rnd() - 0.5);
    const re = new Float64Array(n / 2 + 1);
    const im = new Float64Array(n / 2 + 1);
    new RealFft(n).spectrum(frame, re, im);
    for (let k = 0; k <= n / 2; k++) {
      let dr = 0;
      let di = 0;
      for (let t = 0; t < n; t++) {
        dr += frame[t] * Math.cos((2 * Math.PI * k * t) / n);
        di -= frame[t] * Math.sin((2 * Math.PI * k * t) / n);
      }
      expect(re[k]).toBeCloseTo(dr, 10);
      expect(im[k]).toBeCloseTo(di, 10);
    }
  });
  it('a bin-centred cosine of amplitude A puts (nA/2)² into its bin and nothing beside it (DFT definition)', () => {
    const n = 256;
    const k0 = 37;
    const frame = Array.from({ length: n }, (_, t) => 0.5 * Math.cos((2 * Math.PI * k0 * t) / n));
    const power = new Float64Array(n / 2 + 1);
    new RealFft(n).power(frame, power);
    expect(power[k0]).toBeCloseTo(((n * 0.5) / 2) ** 2, 6);
    expect(power[k0 + 1]).toBeLessThan(1e-12);
  });
  it('refuses sizes that are not powers of two and frames of the wrong length', () => {
    expect(() => new RealFft(500)).toThrow(/power of two/);
    expect(() => new RealFft(8).power([1, 2, 3], new Float64Array(5))).toThrow(/expected 8/);
  });
});
