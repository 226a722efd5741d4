/**
 * engine/overlay-frames: run encoding round-trips any picture exactly and refuses damaged
 * input; the I420 blend matches a plain floating-point blend of the same formulas, and the
 * colour conversion gives the limited-range values of ITU-R BT.709 / BT.601 (from memory:
 * 709 white 235/128/128, black 16/128/128, red 63/102/240; 601 red 81/90/240).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { blendRunsI420, decodeRuns, encodeRuns, fillBlackI420, i420Size, OverlayFrameError, packBatch, rgbToYuv, unpackBatch, wordsOf, type YuvMatrix } from '../../../engine/overlay-frames/index.ts';

/** Back to a full RGBA picture (the inverse the host never needs, for checking). */
function toRgba(words: Uint32Array): Uint8Array {
  const f = decodeRuns(words);
  const out = new Uint32Array(f.width * f.height);
  let p = 0;
  for (let r = 0; r < f.runs.length; r += 2) for (let i = 0; i < f.runs[r + 1]; i++) out[f.runs[r] + i] = f.pixels[p++];
  return new Uint8Array(out.buffer);
}

const sparsePicture = (w: number, h: number) =>
  fc.array(fc.tuple(fc.nat(w * h - 1), fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 0xffffffff })), { maxLength: 60 }).map((spots) => {
    const px = new Uint32Array(w * h);
    for (const [at, len, v] of spots) px.fill(v >>> 0, at, Math.min(w * h, at + len));
    return new Uint8Array(px.buffer);
  });

describe('run encoding', () => {
  it('round-trips any sparse picture exactly and never carries more than its visible pixels plus short gaps', () => {
    fc.assert(
      fc.property(sparsePicture(37, 21), (rgba) => {
        const words = encodeRuns(rgba, 37, 21);
        expect(toRgba(words)).toEqual(rgba);
        const visible = new Uint32Array(rgba.buffer).filter((v) => v !== 0).length;
        const f = decodeRuns(words);
        expect(f.pixels.length).toBeGreaterThanOrEqual(visible);
        expect(f.pixels.length).toBeLessThanOrEqual(visible + 2 * (f.runs.length / 2 + 60));
      }),
      { numRuns: 120 },
    );
  });

  it('an empty picture is one header; a full one is one run', () => {
    expect(encodeRuns(new Uint8Array(8 * 4 * 4), 8, 4)).toHaveLength(4);
    const full = encodeRuns(new Uint8Array(8 * 4 * 4).fill(255), 8, 4);
    expect(decodeRuns(full).runs).toEqual(new Uint32Array([0, 32]));
  });

  it('batches hold frames in order; damaged batches and frames are refused with a reason', () => {
    const a = encodeRuns(new Uint8Array(16 * 4).fill(7), 4, 4);
    const b = encodeRuns(new Uint8Array(16 * 4), 4, 4);
    const batch = packBatch([a, b]);
    expect(unpackBatch(batch).map((f) => [...f])).toEqual([[...a], [...b]]);
    expect(() => unpackBatch(batch.subarray(0, batch.length - 1))).toThrow(/cut short/);
    expect(() => unpackBatch(new Uint32Array([1, 2, 3]))).toThrow(OverlayFrameError);
    const bad = a.slice();
    bad[4] = 15; // a run starting at pixel 15 of length 16 leaves the picture
    expect(() => decodeRuns(bad)).toThrow(/outside the 4×4 picture/);
    expect(() => wordsOf(new Uint8Array(7))).toThrow(/not whole 32-bit words/);
    const odd = new Uint8Array(new ArrayBuffer(batch.byteLength + 1), 1, batch.byteLength);
    odd.set(new Uint8Array(batch.buffer));
    expect([...wordsOf(odd)]).toEqual([...batch]);
  });
});

describe('I420 blend', () => {
  it('converts colours to the limited-range values of BT.709 and BT.601 (from memory)', () => {
    expect(rgbToYuv(255, 255, 255, 'bt709')).toEqual([235, 128, 128]);
    expect(rgbToYuv(0, 0, 0, 'bt709')).toEqual([16, 128, 128]);
    expect(rgbToYuv(255, 0, 0, 'bt709')).toEqual([63, 102, 240]);
    expect(rgbToYuv(255, 0, 0, 'bt601')).toEqual([81, 90, 240]);
  });

  /** The same blend in floating point, straight from the definitions. */
  function referenceBlend(pic: Uint8Array, w: number, h: number, rgba: Uint8Array, m: YuvMatrix): Uint8Array {
    const out = pic.slice();
    const [kr, kb] = m === 'bt709' ? [0.2126, 0.0722] : [0.299, 0.114];
    const kg = 1 - kr - kb;
    const yuv = (r: number, g: number, b: number) => {
      const y = (kr * r + kg * g + kb * b) / 255;
      return [16 + 219 * y, 128 + 224 * ((b / 255 - y) / (2 * (1 - kb))), 128 + 224 * ((r / 255 - y) / (2 * (1 - kr)))];
    };
    const cw = w / 2;
    for (let y = 0; y < h; y++)
      for (let x = 0; x < w; x++) {
        const o = (y * w + x) * 4;
        const a = rgba[o + 3] / 255;
        out[y * w + x] = Math.round(pic[y * w + x] * (1 - a) + yuv(rgba[o], rgba[o + 1], rgba[o + 2])[0] * a);
      }
    for (let cy = 0; cy < h / 2; cy++)
      for (let cx = 0; cx < cw; cx++)
        for (const plane of [1, 2]) {
          const at = w * h + (plane - 1) * cw * (h / 2) + cy * cw + cx;
          let v = 0;
          for (const [dx, dy] of [[0, 0], [1, 0], [0, 1], [1, 1]]) {
            const o = ((2 * cy + dy) * w + 2 * cx + dx) * 4;
            const a = rgba[o + 3] / 255;
            v += (pic[at] * (1 - a) + yuv(rgba[o], rgba[o + 1], rgba[o + 2])[plane] * a) / 4;
          }
          out[at] = Math.round(v);
        }
    return out;
  }

  it('matches the floating-point blend within one level, and leaves transparent pixels alone', () => {
    const w = 24;
    const h = 14;
    fc.assert(
      fc.property(sparsePicture(w, h), fc.uint8Array({ minLength: i420Size(w, h), maxLength: i420Size(w, h) }), fc.constantFrom<YuvMatrix>('bt709', 'bt601'), (rgba, base, m) => {
        const pic = base.slice();
        blendRunsI420(pic, w, h, decodeRuns(encodeRuns(rgba, w, h)), m);
        const ref = referenceBlend(base, w, h, rgba, m);
        let worst = 0;
        for (let i = 0; i < pic.length; i++) worst = Math.max(worst, Math.abs(pic[i] - ref[i]));
        expect(worst).toBeLessThanOrEqual(1);
        const alpha = (x: number, y: number) => rgba[(y * w + x) * 4 + 3];
        for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) if (alpha(x, y) === 0) expect(pic[y * w + x]).toBe(base[y * w + x]);
      }),
      { numRuns: 200 },
    );
  });

  it('an opaque frame over black is exactly the colour conversion (the title card)', () => {
    const w = 4;
    const h = 2;
    const pic = new Uint8Array(i420Size(w, h));
    fillBlackI420(pic, w, h);
    const rgba = new Uint8Array(w * h * 4);
    for (let i = 0; i < w * h; i++) rgba.set([16, 22, 27, 255], i * 4);
    blendRunsI420(pic, w, h, decodeRuns(encodeRuns(rgba, w, h)), 'bt709');
    const [y, u, v] = rgbToYuv(16, 22, 27, 'bt709');
    expect([...pic]).toEqual([...new Array(8).fill(y), u, u, v, v]);
  });
});
