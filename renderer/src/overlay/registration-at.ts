/**
 * The pitch -> image homography for any footage frame from the registration keyframes.
 * Until engine/geometry/keyframes.ts lands this holds the nearest keyframe.
 *
 *   registrationAt(data, 812) -> [h0..h8] | undefined
 */
import type { RegistrationData } from './contract.ts';

export function registrationAt(reg: RegistrationData, frame: number): number[] | undefined {
  const ks = reg.keyframes.filter((k) => k.homography.length === 9);
  if (!ks.length) return undefined;
  let best = ks[0];
  for (const k of ks) if (Math.abs(k.frame - frame) < Math.abs(best.frame - frame)) best = k;
  return best.homography;
}
