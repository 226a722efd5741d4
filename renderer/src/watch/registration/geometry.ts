/**
 * What registration needs from the geometry engine (engine/geometry/, another module):
 * the pitch model's named landmarks and markings, and the homography solve with per-point
 * reprojection errors. Kept in one adapter so the screen reads plainly.
 */
import type { PitchSize } from '../../../../shared-types/index.ts';
import type { LandmarkPair } from '../../overlay/contract.ts';

export interface Landmark {
  id: string;
  label: string;
  x: number;
  y: number;
}

export type Solved = { homography: number[]; errors: number[]; inliers: boolean[] } | { error: string };

export function landmarksOf(_pitch: PitchSize): Landmark[] {
  return [];
}

export function markingsOf(_pitch: PitchSize): Float32Array[] {
  return [];
}

export function solvePairs(_pairs: LandmarkPair[]): Solved {
  return { error: 'The homography solver (engine/geometry) is not in this build yet.' };
}
