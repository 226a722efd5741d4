/** Synthetic registrations for the geometry tests: a broadcast-like camera over a 105 × 68 m pitch. */
import { applyHomography, type Vec2 } from '../../../engine/geometry/homography.ts';
import { seededRandom } from '../../../engine/geometry/prng.ts';

/** Frame 0 of fixtures/demo/truth-homography.json (a wide centre view, 640 × 360). */
export const DEMO_H0 = [12.6383, 4.60975, 320, 0, -1.04973, 164.701, 0, 0.0144055, 1];

/** A random camera near the demo's: pan, zoom and tilt jitter of the demo's frame 0. */
export function randomCamera(rnd: () => number): number[] {
  const zoom = 0.7 + 0.8 * rnd();
  const pan = (rnd() - 0.5) * 200;
  const h = DEMO_H0.slice();
  for (let i = 0; i < 6; i++) h[i] *= zoom;
  h[2] += pan;
  h[6] = (rnd() - 0.5) * 0.004;
  h[7] *= 0.7 + 0.6 * rnd();
  h[1] += (rnd() - 0.5) * 3;
  return h;
}

/** n pitch points drawn over the pitch that fall inside a 640 × 360 frame, and their images plus noise. */
export function scene(seed: number, n: number, noisePx: number, h = randomCamera(seededRandom(seed ^ 0x55))): { h: number[]; pitch: Vec2[]; image: Vec2[]; clean: Vec2[] } {
  const rnd = seededRandom(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  const pitch: Vec2[] = [];
  const clean: Vec2[] = [];
  const image: Vec2[] = [];
  for (let tries = 0; pitch.length < n && tries < 100_000; tries++) {
    const p: Vec2 = [(rnd() - 0.5) * 105, (rnd() - 0.5) * 68];
    const q = applyHomography(h, p);
    if (!(q[0] >= 0 && q[0] <= 640 && q[1] >= 0 && q[1] <= 360)) continue;
    pitch.push(p);
    clean.push(q);
    image.push([q[0] + noisePx * gauss(), q[1] + noisePx * gauss()]);
  }
  return { h, pitch, image, clean };
}

/** Largest image distance between two homographies over a grid of pitch points that both see in frame. */
export function maxGridDisagreement(a: readonly number[], b: readonly number[], pitchPoints: readonly Vec2[]): number {
  let worst = 0;
  for (const p of pitchPoints) {
    const qa = applyHomography(a, p);
    const qb = applyHomography(b, p);
    worst = Math.max(worst, Math.hypot(qa[0] - qb[0], qa[1] - qb[1]));
  }
  return worst;
}

/**
 * A 1.5 m grid over the pitch restricted to what camera h shows in a 640 × 360 frame and,
 * when landmarks are given, to their bounding box (a fit is only pinned down between its
 * landmarks; beyond them any two fits part ways by extrapolation).
 */
export function visibleGrid(h: readonly number[], within?: readonly Vec2[]): Vec2[] {
  const box = within ? [Math.min(...within.map((p) => p[0])), Math.max(...within.map((p) => p[0])), Math.min(...within.map((p) => p[1])), Math.max(...within.map((p) => p[1]))] : [-Infinity, Infinity, -Infinity, Infinity];
  const out: Vec2[] = [];
  for (let x = -52.5; x <= 52.5; x += 1.5) {
    for (let y = -34; y <= 34; y += 1.5) {
      const q = applyHomography(h, [x, y]);
      if (q[0] >= 0 && q[0] <= 640 && q[1] >= 0 && q[1] <= 360 && x >= box[0] && x <= box[1] && y >= box[2] && y <= box[3]) out.push([x, y]);
    }
  }
  return out;
}
