/**
 * PTS-table lookups of the player: time -> frame on screen, frame -> seek target, media
 * time -> frame, against the frame tables Debian's ffprobe wrote for the reference clips
 * (fixtures/reference/*.ffprobe.json, made by make-reference.sh), variable rate included.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clampFrame, frameLength, frameOfMediaTime, frameShownAt, mediaOffsetFrom, seekTargetOf } from '../../../renderer/src/player/frame-table.ts';

const REF = new URL('../../../fixtures/reference/', import.meta.url).pathname;

/** Video frame times of a clip as ffprobe -show_frames gives them, minus the first (footage time). */
function ffprobePts(file: string): { pts: number[]; start: number } {
  const j = JSON.parse(readFileSync(REF + file + '.ffprobe.json', 'utf8')) as { frames: { media_type: string; pts_time: string }[] };
  const raw = j.frames.filter((f) => f.media_type === 'video').map((f) => Number(f.pts_time));
  raw.sort((a, b) => a - b);
  // Round away the 1e-6 print precision of ffprobe before subtracting.
  return { pts: raw.map((p) => Math.round((p - raw[0]) * 1e6) / 1e6), start: raw[0] };
}

describe('frameShownAt (time -> frame on screen)', () => {
  const { pts } = ffprobePts('vfr.mp4');
  it('variable rate: every frame is found at its own PTS, and stays until the next one (ffprobe table)', () => {
    // make-reference.sh: source frame n at n*40 ms, +20 ms when n mod 3 = 2, frames n mod 10 = 9 dropped.
    const expected: number[] = [];
    for (let n = 0; expected.length < pts.length; n++) if (n % 10 !== 9) expected.push((n * 40 + (n % 3 === 2 ? 20 : 0)) / 1000);
    expect(pts).toEqual(expected.map((v) => expect.closeTo(v, 6)));
    for (let i = 0; i < pts.length; i++) {
      expect(frameShownAt(pts, pts[i])).toBe(i);
      const end = i + 1 < pts.length ? pts[i + 1] : pts[i] + 0.04;
      expect(frameShownAt(pts, (pts[i] + end) / 2)).toBe(i);
      expect(frameShownAt(pts, end - 1e-4)).toBe(i);
    }
  });
  it('before the first frame shows frame 0; after the last, the last', () => {
    expect(frameShownAt(pts, -1)).toBe(0);
    expect(frameShownAt(pts, 1e6)).toBe(pts.length - 1);
  });
  it('agrees with a linear scan on random tables and times (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 90 }), { minLength: 1, maxLength: 60 }), fc.double({ min: -0.5, max: 5, noNaN: true }), (gapsMs, t) => {
        const table = [0];
        for (const g of gapsMs) table.push(table[table.length - 1] + g / 1000);
        let expected = 0;
        for (let i = 0; i < table.length; i++) if (table[i] <= t + 1e-6) expected = i;
        expect(frameShownAt(table, t)).toBe(expected);
      }),
    );
  });
});

describe('seekTargetOf (frame -> time to ask the element for)', () => {
  it('is the middle of the display interval, so it maps back to the same frame (vfr and 29.97 tables)', () => {
    for (const file of ['vfr.mp4', 'ntsc.mov', 'cfr25.mp4']) {
      const { pts } = ffprobePts(file);
      for (let i = 0; i < pts.length; i++) {
        const t = seekTargetOf(pts, i, 25);
        expect(frameShownAt(pts, t)).toBe(i);
        expect(t).toBeCloseTo(pts[i] + frameLength(pts, i, 25) / 2, 9);
      }
    }
  });
  it('clamps frames outside the table and rounds fractions', () => {
    const pts = [0, 0.04, 0.08];
    expect(clampFrame(pts, -3)).toBe(0);
    expect(clampFrame(pts, 7)).toBe(2);
    expect(clampFrame(pts, 1.4)).toBe(1);
    expect(() => clampFrame([], 0)).toThrow(/no frames/);
    expect(seekTargetOf(pts, 2, 25)).toBeCloseTo(0.1, 9);
  });
});

describe('frameOfMediaTime (rVFC mediaTime -> frame)', () => {
  it('matches exactly with the offset of a file whose first frame is not at 0 (fragmented MP4: 80 ms B-frame delay, ffprobe)', () => {
    const { pts, start } = ffprobePts('fragmented.mp4');
    expect(start).toBeCloseTo(0.08, 6);
    for (let i = 0; i < pts.length; i++) {
      // Chromium reports whole microseconds.
      const media = Math.round((pts[i] + start) * 1e6) / 1e6;
      expect(frameOfMediaTime(pts, media, start)).toEqual({ index: i, exact: true, error: expect.closeTo(0, 5) });
    }
  });
  it('a time between frames is not exact and falls back to the frame at or before it', () => {
    const pts = [0, 0.04, 0.08];
    const m = frameOfMediaTime(pts, 0.062, 0);
    expect(m.index).toBe(1);
    expect(m.exact).toBe(false);
    expect(m.error).toBeCloseTo(0.022, 9);
    // Slightly early (decoder rounding): still the nearer frame, exact.
    expect(frameOfMediaTime(pts, 0.0799999, 0)).toMatchObject({ index: 2, exact: true });
  });
  it('learns the media offset from the first frame shown', () => {
    const pts = [0, 0.04, 0.08];
    expect(mediaOffsetFrom(pts, 0.08, 0.08)).toBe(0.08); // the probe was right (fragmented MP4)
    expect(mediaOffsetFrom(pts, 0, 11.4)).toBe(0); // a remuxed copy starting at 0 although the original started at 11.4 s
    expect(mediaOffsetFrom(pts, 1.25, 0)).toBe(1.25);
  });
});
