/**
 * The sample arrays are sized once from the file size (bytesTotal) after the first 64 KB.
 * The size is only a hint: with it, without it, or with a wrong one, the import must give
 * the same data and problems (self-consistency; the data itself is checked against the
 * written positions in tracking.test.ts).
 */
import { describe, expect, it } from 'vitest';
import type { TrackingMapping } from '../../../shared-types/import.ts';
import { detectSource, importTracking } from '../../../engine/import/index.ts';
import { FrameStore } from '../../../engine/import/tracking/frame-store.ts';
import { chunked, coords, synthFrames, writeLong, writeWide } from './helpers/synthetic.ts';

const synth = synthFrames({ rate: 25, periodS: 8, periods: 2 });

describe('tracking import: sizing from the file size is only a hint', () => {
  for (const [layout, text] of [['wide', writeWide(synth, coords({}))], ['long', writeLong(synth, coords({}))]] as const) {
    it(`${layout}: same result with the true size, none, a too small and a too large one`, async () => {
      expect(text.length).toBeGreaterThan(65536 * 2);
      const mapping = detectSource(`s.${layout}.csv`, text.slice(0, 65536)).mapping as TrackingMapping;
      const run = (bytesTotal: number | undefined) => importTracking(chunked(text, 4096), { fileName: 's.csv', mapping, ...(bytesTotal !== undefined ? { bytesTotal } : {}) });
      const ref = await run(undefined);
      expect(ref.ok).toBe(true);
      for (const size of [text.length, 0, 70_000, text.length * 10]) {
        const r = await run(size);
        expect(r.problems).toEqual(ref.problems);
        expect(r.data!.periods.map((p) => [p.firstFrame, p.frameCount, Array.from(p.x), Array.from(p.y), Array.from(p.present)])).toEqual(
          ref.data!.periods.map((p) => [p.firstFrame, p.frameCount, Array.from(p.x), Array.from(p.y), Array.from(p.present)]),
        );
      }
    });
  }

  it('FrameStore.expectSamples keeps the samples already taken', () => {
    const s = new FrameStore();
    const e = s.entry(1, 0, 0, 2);
    for (let k = 0; k < 5000; k++) s.sample(e, k % 7, k, -k, k / 2);
    s.expectSamples(100_000);
    expect(s.sampleX.length).toBe(100_000);
    expect(s.sampleCount).toBe(5000);
    expect([s.sampleObject[4999], s.sampleX[4999], s.sampleY[4999], s.sampleZ[4999], s.sampleEntry[4999]]).toEqual([4999 % 7, 4999, -4999, 2499.5, e]);
    s.expectSamples(10); // smaller than now: nothing changes
    expect(s.sampleX.length).toBe(100_000);
  });
});
