/**
 * The pitch -> image homography for any footage frame from the registration keyframes:
 * interpolated between the keyframes around it (engine/geometry/keyframes.ts, point-wise,
 * so it stays a valid homography), the nearest keyframe's outside their range.
 *
 *   registrationAt(data, 812) -> [h0..h8] | undefined
 */
import { homographyAt } from '../../../engine/geometry/keyframes.ts';
import type { RegistrationData } from './contract.ts';

export function registrationAt(reg: RegistrationData, frame: number): number[] | undefined {
  const keys = reg.keyframes.filter((k) => k.homography.length === 9).map((k) => ({ t: k.frame, h: k.homography }));
  return homographyAt(keys, frame, { width: reg.imageWidth, height: reg.imageHeight }) ?? undefined;
}
