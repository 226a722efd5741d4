import { describe, expect, it } from 'vitest';
import { applyHomography } from '../../../engine/geometry/homography.ts';
import { homographyAt, interpolateHomography } from '../../../engine/geometry/keyframes.ts';
import { DEMO_H0 } from './points.ts';

const frame = { width: 640, height: 360 };
/** The same camera with the image moved du pixels right: row 0 += du · row 2. */
const shifted = (du: number) => DEMO_H0.map((v, i) => (i < 3 ? v + du * DEMO_H0[6 + i] : v));

describe('keyframe registrations', () => {
  it('holds the nearest key outside the range and returns null without keys', () => {
    const a = { t: 10, h: DEMO_H0 };
    const b = { t: 12, h: shifted(40) };
    expect(homographyAt([], 3, frame)).toBeNull();
    expect(homographyAt([b, a], 0, frame)).toEqual(DEMO_H0);
    expect(homographyAt([b, a], 99, frame)).toEqual(b.h);
    expect(homographyAt([a, b], 12, frame)).toEqual(b.h);
  });
  it('moves image points linearly for a camera that slides sideways (exact for an image shift)', () => {
    // Adding du to row 0 shifts every image point by du pixels: halfway is a shift of du / 2.
    const h = homographyAt([{ t: 0, h: DEMO_H0 }, { t: 2, h: shifted(40) }], 1, frame)!;
    for (const p of [[0, 0], [20, -10], [-15, 5]] as const) {
      const q0 = applyHomography(DEMO_H0, p);
      const q = applyHomography(h, p);
      expect(q[0] - q0[0]).toBeCloseTo(20, 6);
      expect(q[1] - q0[1]).toBeCloseTo(0, 6);
    }
  });
  it('gives the keys themselves at s = 0 and 1', () => {
    expect(interpolateHomography(DEMO_H0, shifted(9), 0, frame)).toEqual(DEMO_H0);
    expect(interpolateHomography(DEMO_H0, shifted(9), 1, frame)).toEqual(shifted(9));
  });
});
