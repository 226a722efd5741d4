/**
 * What registration needs from the geometry engine (engine/geometry/, another module):
 * the pitch model's named landmarks and markings, and the homography solve with per-point
 * reprojection errors. Kept in one adapter so the screen reads plainly.
 */
import type { PitchSize } from '../../../../shared-types/index.ts';
import type { LandmarkPair } from '../../overlay/contract.ts';
import { GeometryError } from '../../../../engine/geometry/homography.ts';
import { fitHomography } from '../../../../engine/geometry/ransac.ts';
import { pitchModel } from '../../../../engine/geometry/pitch-model.ts';

export interface Landmark {
  id: string;
  label: string;
  x: number;
  y: number;
}

export type Solved = { homography: number[]; errors: number[]; inliers: boolean[] } | { error: string };

const models = new Map<string, ReturnType<typeof pitchModel>>();
function modelOf(pitch: PitchSize) {
  const key = `${pitch.length}x${pitch.width}`;
  let m = models.get(key);
  if (!m) models.set(key, (m = pitchModel(pitch)));
  return m;
}

export function landmarksOf(pitch: PitchSize): Landmark[] {
  return modelOf(pitch).landmarks.map((l) => ({ id: l.id, label: l.label, x: l.at[0], y: l.at[1] }));
}

const markingCache = new Map<string, Float32Array[]>();
/** Law 1 markings as flat polylines (closed ones repeat their first point). */
export function markingsOf(pitch: PitchSize): Float32Array[] {
  const key = `${pitch.length}x${pitch.width}`;
  let m = markingCache.get(key);
  if (!m) {
    const r = 0.25; // a spot is drawn as a small square round it
    m = modelOf(pitch).markings.map((k) => {
      const pts: (readonly [number, number])[] = k.kind === 'spot' ? [[-r, -r], [r, -r], [r, r], [-r, r], [-r, -r]].map(([dx, dy]) => [k.points[0][0] + dx, k.points[0][1] + dy] as const) : [...k.points, ...(k.closed && k.points.length ? [k.points[0]] : [])];
      return Float32Array.from(pts.flatMap((p) => [p[0], p[1]]));
    });
    markingCache.set(key, m);
  }
  return m;
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

