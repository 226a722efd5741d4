/** Synthetic 64×36 luma shots for the cut detector tests (seeded, so every run is the same). */
import { seededRandom } from '../../../engine/geometry/prng.ts';
export const W = 64;
export const H = 36;

/** A seeded PRNG: the engine's own (engine/geometry/prng.ts, mulberry32). */
export const rng = seededRandom;

/** A wide smooth random texture (width × H) a camera can pan across. */
export function texture(seed: number, width: number, mean: number, contrast: number): Float32Array {
  const r = rng(seed);
  const out = new Float32Array(width * H);
  // Sum of a few random sinusoids: smooth, like a pitch with stripes, stands and players.
  const waves = Array.from({ length: 6 }, () => ({ fx: r() * 0.4, fy: r() * 0.4, ph: r() * 6.28, a: r() }));
  for (let y = 0; y < H; y++) {
    for (let x = 0; x < width; x++) {
      let v = 0;
      for (const w of waves) v += w.a * Math.sin(w.fx * x + w.fy * y + w.ph);
      out[y * width + x] = mean + contrast * v / 3;
    }
  }
  return out;
}

/** One frame: a W-wide window of the texture at column `offset`, plus sensor noise. */
export function view(tex: Float32Array, texWidth: number, offset: number, noise: () => number, noiseAmp = 2): Uint8Array {
  const f = new Uint8Array(W * H);
  const o = Math.round(offset);
  for (let y = 0; y < H; y++) {
    for (let x = 0; x < W; x++) {
      const v = tex[y * texWidth + ((x + o) % texWidth)] + (noise() - 0.5) * 2 * noiseAmp;
      f[y * W + x] = Math.max(0, Math.min(255, Math.round(v)));
    }
  }
  return f;
}
