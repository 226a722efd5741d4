import { describe, expect, it } from 'vitest';
import { frameAtOrBefore, frameTime, ptsTableProblem } from '../../../engine/timecode/index.ts';

// Reference: a plain linear scan (the definition "last frame with pts <= t") — the binary
// search must agree with it everywhere, on a variable-rate table made with a seeded PRNG.
function linearAtOrBefore(pts: number[], t: number): number {
  let ans = -1;
  for (let i = 0; i < pts.length; i++) if (pts[i] <= t + 1e-6) ans = i;
  return ans;
}

function mulberry32(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('footage seconds -> frame through the PTS table', () => {
  it('constant 25 fps: frame n at n x 0.04 s maps to n (float-safe)', () => {
    const pts = Array.from({ length: 1000 }, (_, n) => n * 0.04);
    for (let n = 0; n < 1000; n++) expect(frameAtOrBefore(pts, n * 0.04)).toBe(n);
    expect(frameAtOrBefore(pts, 0.0799)).toBe(1);
    expect(frameAtOrBefore(pts, -0.01)).toBe(-1);
    expect(frameAtOrBefore(pts, 1e6)).toBe(999);
  });
  it('variable-rate table: agrees with a linear scan at 5,000 random times', () => {
    const rnd = mulberry32(7);
    const pts: number[] = [0];
    for (let i = 1; i < 3000; i++) pts.push(pts[i - 1] + 0.02 + rnd() * 0.05);
    for (let k = 0; k < 5000; k++) {
      const t = -0.1 + rnd() * (pts[pts.length - 1] + 0.2);
      expect(frameAtOrBefore(pts, t)).toBe(linearAtOrBefore(pts, t));
    }
  });
  it('empty table and bad input', () => {
    expect(frameAtOrBefore([], 1)).toBe(-1);
    expect(() => frameAtOrBefore([0], NaN)).toThrow(/NaN/);
    expect(() => frameTime([0, 0.04], 2)).toThrow(/frames 0..1/);
    expect(frameTime([0, 0.04], 1)).toBe(0.04);
  });
  it('names the first frame where a table goes wrong', () => {
    expect(ptsTableProblem([0, 0.04, 0.04])).toMatch(/frame 2/);
    expect(ptsTableProblem([0, NaN])).toMatch(/frame 1/);
    expect(ptsTableProblem([0, 0.04, 0.08])).toBeUndefined();
  });
});
