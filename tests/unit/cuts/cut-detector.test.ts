import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CutDetector, FrameSplitter, frameScore, histogramDistance, lumaHistogram, meanAbsDifference, ptsTimer, scanCuts } from '../../../engine/cuts/index.ts';
import { H, rng, texture, view, W } from './frames.ts';

/** Shots of `lengths` frames, each a different texture; `panPx` columns of camera move a frame. */
function shots(lengths: number[], panPx = 0.5, seed = 1): Uint8Array[] {
  const noise = rng(seed * 977);
  const out: Uint8Array[] = [];
  lengths.forEach((n, k) => {
    const tw = 400;
    const tex = texture(seed * 31 + k, tw, 70 + ((k * 53) % 110), 60);
    for (let i = 0; i < n; i++) out.push(view(tex, tw, i * panPx, noise));
  });
  return out;
}

function detect(frames: Uint8Array[], opts: Partial<ConstructorParameters<typeof CutDetector>[0]> = {}) {
  const d = new CutDetector({ width: W, height: H, ...opts });
  const cuts = frames.flatMap((f, i) => d.push(f, i / 25));
  return [...cuts, ...d.finish()];
}

describe('frame difference measures', () => {
  it('histogram distance is 0 for equal frames and 1 for disjoint ones; MAD is the mean grey-level gap', () => {
    const a = new Uint8Array(W * H).fill(20);
    const b = new Uint8Array(W * H).fill(220);
    expect(histogramDistance(lumaHistogram(a, 32), lumaHistogram(a, 32))).toBe(0);
    expect(histogramDistance(lumaHistogram(a, 32), lumaHistogram(b, 32))).toBeCloseTo(1, 12);
    expect(meanAbsDifference(a, b)).toBe(200);
    expect(frameScore(1, 200)).toBe(1);
    expect(frameScore(1, 8)).toBeCloseTo(0.25, 12); // a fade step: the pixel gap is small
  });
});

describe('cut detector (sliding-window peak rule, Yeo & Liu 1995)', () => {
  it('finds every hard cut at the first frame of the new shot', () => {
    const cuts = detect(shots([40, 30, 55, 25]));
    expect(cuts.map((c) => c.frame)).toEqual([40, 70, 125]);
    expect(cuts[0].t).toBeCloseTo(40 / 25, 12);
    for (const c of cuts) expect(c.ratio).toBeGreaterThanOrEqual(3);
  });

  it('reports nothing inside a fast pan (8 px a frame of a 64 px view)', () => {
    expect(detect(shots([120], 8))).toEqual([]);
  });

  it('still finds a cut between two fast pans', () => {
    expect(detect(shots([60, 60], 6)).map((c) => c.frame)).toEqual([60]);
  });

  it('refuses a one-frame flash (two equal peaks: in and out)', () => {
    const frames = shots([80]);
    frames[40] = new Uint8Array(W * H).fill(250);
    expect(detect(frames)).toEqual([]);
  });

  it('refuses a fade to black, then cuts where the next shot starts', () => {
    const frames = shots([40, 40]);
    for (let i = 20; i < 40; i++) {
      const k = (40 - i) / 20;
      frames[i] = frames[i].map((v) => Math.round(v * k));
    }
    expect(detect(frames).map((c) => c.frame)).toEqual([40]);
  });

  it('is silent on a still shot with sensor noise', () => {
    expect(detect(shots([200], 0))).toEqual([]);
  });

  it('gives the same cuts however the byte stream is split (FrameSplitter), and scanCuts agrees', async () => {
    const frames = shots([35, 45, 30]);
    const whole = detect(frames);
    const bytes = new Uint8Array(frames.length * W * H);
    frames.forEach((f, i) => bytes.set(f, i * W * H));
    await fc.assert(
      fc.asyncProperty(fc.array(fc.integer({ min: 1, max: 9000 }), { minLength: 1, maxLength: 40 }), async (sizes) => {
        const d = new CutDetector({ width: W, height: H });
        const got: ReturnType<typeof detect> = [];
        const split = new FrameSplitter(W * H, (i) => i / 25, (luma, t) => got.push(...d.push(luma, t)));
        let at = 0;
        for (let k = 0; at < bytes.length; k++) {
          const n = sizes[k % sizes.length];
          split.push(bytes.subarray(at, at + n));
          at += n;
        }
        got.push(...d.finish());
        expect(split.frames).toBe(frames.length);
        expect(split.partialBytes).toBe(0);
        expect(got).toEqual(whole);
      }),
      { numRuns: 25 },
    );
    const scanned = await scanCuts(frames.map((luma, i) => ({ luma, t: i / 25 })), { width: W, height: H });
    expect(scanned).toEqual(whole);
  });

  it('scanCuts stops on cancel', async () => {
    const ctl = new AbortController();
    ctl.abort(new Error('stop'));
    await expect(scanCuts([], { width: W, height: H, signal: ctl.signal })).rejects.toThrow('stop');
  });

  it('says what is wrong with a frame of the wrong size or bad options', () => {
    const d = new CutDetector({ width: W, height: H });
    expect(() => d.push(new Uint8Array(10), 0)).toThrow(/frame 0 has 10 bytes, expected 2304 \(64×36 luma\)/);
    expect(() => new CutDetector({ width: 0, height: 36 })).toThrow(/frame size/);
    expect(() => new CutDetector({ width: W, height: H, halfWindow: 1 })).toThrow(/halfWindow/);
  });

  it('ptsTimer follows the presentation table and extends it at the nominal rate', () => {
    const t = ptsTimer([0, 0.04, 0.1], 25);
    expect([t(0), t(2), t(3), t(4)].map((x) => +x.toFixed(6))).toEqual([0, 0.1, 0.14, 0.18]);
  });
});
