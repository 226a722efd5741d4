/**
 * Drawing pitch geometry over the footage: polylines in pitch metres sent through a
 * registration into image pixels, cut where they pass behind the camera (homogeneous w ≤ 0),
 * since a straight projection of such a segment would wrap across the whole frame.
 */
import { applyHomography, homogeneousW, type Homography, type Vec2 } from './homography.ts';

const W_MIN = 1e-6;

/**
 * Image polylines (zero or more pieces) of a pitch polyline under h.
 * `projectPolyline([1, 0, 0, 0, 1, 0, 0, 0, 1], [[0, 0], [1, 1]]) -> [[[0, 0], [1, 1]]]`
 */
export function projectPolyline(h: Homography, points: readonly Vec2[], closed = false): [number, number][][] {
  const pts = closed && points.length > 2 ? [...points, points[0]] : points;
  const pieces: [number, number][][] = [];
  let current: [number, number][] = [];
  const flush = () => {
    if (current.length > 0) pieces.push(current);
    current = [];
  };
  for (let i = 0; i < pts.length; i++) {
    const p = pts[i];
    const w = homogeneousW(h, p);
    if (i > 0) {
      const q = pts[i - 1];
      const wq = homogeneousW(h, q);
      if ((wq > W_MIN) !== (w > W_MIN)) {
        // Cut the segment where w crosses W_MIN and keep the visible part.
        const t = (W_MIN - wq) / (w - wq);
        const cut = applyHomography(h, [q[0] + t * (p[0] - q[0]), q[1] + t * (p[1] - q[1])]);
        if (w > W_MIN) current.push(cut);
        else {
          current.push(cut);
          flush();
        }
      }
    }
    if (w > W_MIN) current.push(applyHomography(h, p));
  }
  flush();
  return pieces;
}
