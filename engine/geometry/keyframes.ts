/**
 * Registrations for a panning and zooming camera: the analyst registers a few keyframes;
 * frames between two keyframes get a homography interpolated point-wise — four fixed pitch
 * points (those seen at an inner quad of the earlier keyframe's image) have their image
 * positions interpolated linearly and the homography is solved again from them, which stays
 * a valid homography (interpolating matrix entries does not). Outside the keyframes' range
 * the nearest keyframe holds.
 */
import { applyHomography, dlt, homogeneousW, invertHomography, type Homography, type Vec2 } from './homography.ts';

export interface RegistrationKey {
  /** Footage time in seconds (or any monotone clock the caller uses consistently). */
  t: number;
  /** Pitch metres -> image pixels. */
  h: Homography;
}

/** Image size the keys were registered on; the inner quad is taken from it. */
export interface FrameSize {
  width: number;
  height: number;
}

/** Inner quad, as fractions of the frame: lower-middle part, which is pitch in a broadcast view. */
const QUAD: Vec2[] = [
  [0.2, 0.45],
  [0.8, 0.45],
  [0.8, 0.9],
  [0.2, 0.9],
];

/**
 * Homography between two registrations at fraction s ∈ [0, 1] from a to b.
 * `interpolateHomography(hA, hB, 0.5, { width: 640, height: 360 }) -> [...]`
 */
export function interpolateHomography(a: Homography, b: Homography, s: number, frame: FrameSize): number[] {
  if (s <= 0) return a.slice();
  if (s >= 1) return b.slice();
  for (const from of [a, b]) {
    const inv = invertHomography(from);
    const pitch = QUAD.map(([fx, fy]) => applyHomography(inv, [fx * frame.width, fy * frame.height]));
    if (!pitch.every((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]))) continue;
    // Both registrations must see these pitch points in front of the camera.
    if (!pitch.every((p) => homogeneousW(a, p) > 0 === homogeneousW(a, pitch[0]) > 0 && homogeneousW(b, p) > 0 === homogeneousW(b, pitch[0]) > 0)) continue;
    const image = pitch.map((p): Vec2 => {
      const qa = applyHomography(a, p);
      const qb = applyHomography(b, p);
      return [qa[0] + s * (qb[0] - qa[0]), qa[1] + s * (qb[1] - qa[1])];
    });
    if (!image.every((q) => Number.isFinite(q[0]) && Number.isFinite(q[1]))) continue;
    return dlt(pitch, image);
  }
  // The two views share no pitch quad (a cut, not a pan): hold the nearer one.
  return (s < 0.5 ? a : b).slice();
}

/**
 * The registration in force at time t: interpolated between the keys around t, the
 * nearest key's outside their range, null with no keys. Keys need not be sorted.
 * `homographyAt([{ t: 0, h: hA }, { t: 4, h: hB }], 1, { width: 640, height: 360 }) -> [...]`
 */
export function homographyAt(keys: readonly RegistrationKey[], t: number, frame: FrameSize): number[] | null {
  if (keys.length === 0) return null;
  const sorted = [...keys].sort((x, y) => x.t - y.t);
  if (t <= sorted[0].t) return sorted[0].h.slice();
  const last = sorted[sorted.length - 1];
  if (t >= last.t) return last.h.slice();
  let i = 0;
  while (sorted[i + 1].t < t) i++;
  const a = sorted[i];
  const b = sorted[i + 1];
  if (b.t === t) return b.h.slice();
  return interpolateHomography(a.h, b.h, (t - a.t) / (b.t - a.t), frame);
}
