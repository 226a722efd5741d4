/**
 * Footage seconds <-> frame index through the file's real PTS table (footage time of each
 * frame in presentation order, ascending), never `n / nominal fps`: recordings may be
 * variable-rate.
 *
 * Example: `frameAtOrBefore([0, 0.04, 0.08], 0.05)` → 1
 */

/** A tolerance for times that should equal a PTS but went through float arithmetic. */
const EPS = 1e-6;

/**
 * Index of the frame on screen at time t: the last frame with pts <= t (binary search).
 * Returns -1 before the first frame. The last frame stays on screen after its PTS.
 */
export function frameAtOrBefore(pts: ArrayLike<number>, t: number): number {
  if (Number.isNaN(t)) throw new RangeError('frameAtOrBefore: time is NaN');
  let lo = 0;
  let hi = pts.length - 1;
  if (hi < 0 || t + EPS < pts[0]) return -1;
  // Invariant: pts[lo] <= t + EPS; answer in [lo, hi].
  while (lo < hi) {
    const mid = (lo + hi + 1) >>> 1;
    if (pts[mid] <= t + EPS) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Footage time of a frame index. Throws outside the table. */
export function frameTime(pts: ArrayLike<number>, frame: number): number {
  if (!Number.isInteger(frame) || frame < 0 || frame >= pts.length) {
    throw new RangeError(`frame ${frame}: the footage has frames 0..${pts.length - 1}`);
  }
  return pts[frame];
}

/** Checks a PTS table is usable (finite, strictly ascending); returns the first problem. */
export function ptsTableProblem(pts: ArrayLike<number>): string | undefined {
  for (let i = 0; i < pts.length; i++) {
    if (!Number.isFinite(pts[i])) return `frame ${i}: PTS is not a finite number`;
    if (i > 0 && pts[i] <= pts[i - 1]) return `frame ${i}: PTS ${pts[i]} is not after frame ${i - 1}'s ${pts[i - 1]}`;
  }
  return undefined;
}
