/**
 * Pure edits of a pitch registration (keyframes of landmark pairs and homographies). The
 * screen turns each into one undoable commit of the registration row.
 *
 *   withKeyframe(data, kf)        -> data with kf added or replacing the one on its frame
 *   nudgePairs(pairs, [2], 1, 0)  -> pair 2 moved one image pixel right
 */
import type { LandmarkPair, RegistrationData, RegistrationKeyframe } from '../../overlay/contract.ts';

export function emptyRegistration(imageWidth: number, imageHeight: number): RegistrationData {
  return { schema: 'whistlemark-registration/1', imageWidth, imageHeight, keyframes: [] };
}

export function withKeyframe(data: RegistrationData, kf: RegistrationKeyframe): RegistrationData {
  const keyframes = data.keyframes.filter((k) => k.frame !== kf.frame);
  keyframes.push(kf);
  keyframes.sort((a, b) => a.frame - b.frame);
  return { ...data, keyframes };
}

export function withoutKeyframe(data: RegistrationData, frame: number): RegistrationData {
  return { ...data, keyframes: data.keyframes.filter((k) => k.frame !== frame) };
}

/** Adds a clicked pair; a landmark clicked again moves to the new place. */
export function withPair(pairs: LandmarkPair[], pair: LandmarkPair): LandmarkPair[] {
  const out = pairs.filter((p) => p.landmarkId !== pair.landmarkId);
  out.push(pair);
  return out;
}

export function nudgePairs(pairs: LandmarkPair[], which: number[] | 'all', du: number, dv: number): LandmarkPair[] {
  return pairs.map((p, i) => (which === 'all' || which.includes(i) ? { ...p, u: p.u + du, v: p.v + dv } : p));
}

/**
 * Starting pairs for a new keyframe: the landmarks of the nearest keyframe projected
 * through the homography shown now (so the analyst only nudges what the camera moved).
 */
export function suggestedPairs(from: LandmarkPair[], homography: readonly number[], imageWidth: number, imageHeight: number): LandmarkPair[] {
  const h = homography;
  const out: LandmarkPair[] = [];
  for (const p of from) {
    const w = h[6] * p.x + h[7] * p.y + h[8];
    if (!(w > 1e-9)) continue;
    const u = (h[0] * p.x + h[1] * p.y + h[2]) / w;
    const v = (h[3] * p.x + h[4] * p.y + h[5]) / w;
    if (u < 0 || v < 0 || u > imageWidth || v > imageHeight) continue;
    out.push({ ...p, u, v });
  }
  return out;
}

export function rms(errors: number[]): number {
  return errors.length ? Math.sqrt(errors.reduce((s, e) => s + e * e, 0) / errors.length) : NaN;
}
