/**
 * What registration needs from the geometry engine (engine/geometry/, another module):
 * the pitch model's named landmarks and markings, and the homography solve with per-point
 * reprojection errors. Kept in one adapter so the screen reads plainly.
 */
import type { PitchSize } from '../../../../shared-types/index.ts';
import type { LandmarkPair } from '../../overlay/contract.ts';
import { GeometryError } from '../../../../engine/geometry/homography.ts';
import { fitHomography } from '../../../../engine/geometry/ransac.ts';

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

export function solvePairs(pairs: LandmarkPair[]): Solved {
  if (pairs.length < 4) return { error: `${pairs.length} of 4 landmarks placed: click at least four.` };
  try {
    const fit = fitHomography(
      pairs.map((p) => [p.x, p.y] as const),
      pairs.map((p) => [p.u, p.v] as const),
      { threshold: 4, seed: 1 },
    );
    return { homography: fit.h, errors: fit.errors, inliers: fit.inliers };
  } catch (e) {
    if (e instanceof GeometryError) {
      const which = e.points.map((i) => pairs[i]?.landmarkId).filter(Boolean).join(', ');
      return { error: `${e.message}${which ? ` (${which})` : ''} — place other landmarks or move these.` };
    }
    throw e;
  }
}

