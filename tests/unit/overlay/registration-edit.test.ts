import { describe, expect, it } from 'vitest';
import type { LandmarkPair, RegistrationKeyframe } from '../../../renderer/src/overlay/contract.ts';
import { emptyRegistration, nudgePairs, rms, suggestedPairs, withKeyframe, withoutKeyframe, withPair } from '../../../renderer/src/watch/registration/edit.ts';

const kf = (frame: number): RegistrationKeyframe => ({ frame, t: frame / 25, pairs: [], homography: [1, 0, 0, 0, 1, 0, 0, 0, 1], errors: [] });
const pair = (id: string, u: number, v: number, x = 0, y = 0): LandmarkPair => ({ landmarkId: id, x, y, u, v });

describe('registration edits', () => {
  it('keeps keyframes in frame order, one per frame', () => {
    let d = emptyRegistration(640, 360);
    d = withKeyframe(d, kf(50));
    d = withKeyframe(d, kf(10));
    d = withKeyframe(d, { ...kf(50), t: 99 });
    expect(d.keyframes.map((k) => [k.frame, k.t])).toEqual([[10, 0.4], [50, 99]]);
    expect(withoutKeyframe(d, 10).keyframes.map((k) => k.frame)).toEqual([50]);
  });

  it('moves a landmark clicked again instead of adding it twice', () => {
    const ps = withPair(withPair([pair('a', 1, 1)], pair('b', 2, 2)), pair('a', 5, 6));
    expect(ps.map((p) => [p.landmarkId, p.u, p.v])).toEqual([['b', 2, 2], ['a', 5, 6]]);
  });

  it('nudges the selected points only, or all', () => {
    const ps = [pair('a', 1, 1), pair('b', 2, 2)];
    expect(nudgePairs(ps, [1], 1, -0.25).map((p) => [p.u, p.v])).toEqual([[1, 1], [3, 1.75]]);
    expect(nudgePairs(ps, 'all', -1, 0).map((p) => p.u)).toEqual([0, 1]);
  });

  it('suggests the nearest keyframe landmarks where the current homography shows them, dropping the unseen', () => {
    const h = [10, 0, 320, 0, -10, 180, 0, 0, 1];
    const out = suggestedPairs([pair('c', 0, 0, 0, 0), pair('far', 0, 0, 50, 0)], h, 640, 360);
    expect(out).toEqual([{ landmarkId: 'c', x: 0, y: 0, u: 320, v: 180 }]);
    expect(rms([3, 4])).toBeCloseTo(Math.sqrt(12.5), 12);
  });
});
