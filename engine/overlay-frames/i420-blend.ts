/**
 * Lays a run-encoded overlay frame (runs.ts) over a decoded I420 picture (planar Y'CbCr
 * 4:2:0, 8-bit, limited range — what ffmpeg's `-pix_fmt yuv420p` hands over), in place.
 * Only the visible pixels are touched: luma per pixel, chroma per 2×2 block as the mean of
 * the four pixels' blends (transparent pixels keep the picture's chroma), which is what a
 * 4:2:0 encode of an RGB composite would average to.
 *
 * RGB → Y'CbCr uses ITU-R BT.709 (Kr 0.2126, Kb 0.0722) or BT.601 (Kr 0.299, Kb 0.114) with
 * limited range (Y' 16–235, C 16–240); HD pictures are BT.709 and SD BT.601 (common practice
 * when a file does not say). Fixed point, 16 fractional bits.
 *
 *   const f = decodeRuns(words);
 *   blendRunsI420(i420Bytes, 1280, 720, f, 'bt709');
 */
import type { RunFrame } from './runs.ts';

export type YuvMatrix = 'bt709' | 'bt601';

interface Coeffs {
  yr: number; yg: number; yb: number;
  ur: number; ug: number; ub: number;
  vr: number; vg: number; vb: number;
}

function coefficients(kr: number, kb: number): Coeffs {
  const kg = 1 - kr - kb;
  const s = 65536;
  const ly = 219 / 255;
  const lc = 224 / 255;
  return {
    yr: Math.round(kr * ly * s), yg: Math.round(kg * ly * s), yb: Math.round(kb * ly * s),
    ur: Math.round((-kr / (2 * (1 - kb))) * lc * s), ug: Math.round((-kg / (2 * (1 - kb))) * lc * s), ub: Math.round(0.5 * lc * s),
    vr: Math.round(0.5 * lc * s), vg: Math.round((-kg / (2 * (1 - kr))) * lc * s), vb: Math.round((-kb / (2 * (1 - kr))) * lc * s),
  };
}

const MATRICES: Record<YuvMatrix, Coeffs> = { bt709: coefficients(0.2126, 0.0722), bt601: coefficients(0.299, 0.114) };

/** The matrix a picture of this height is taken to use when its file does not say (common practice). */
export function defaultMatrix(height: number): YuvMatrix {
  return height >= 720 ? 'bt709' : 'bt601';
}

/** One RGB colour as limited-range [Y', Cb, Cr] (for tests and the card's black). */
export function rgbToYuv(r: number, g: number, b: number, matrix: YuvMatrix): [number, number, number] {
  const c = MATRICES[matrix];
  return [(c.yr * r + c.yg * g + c.yb * b + (16 << 16) + 32768) >> 16, (c.ur * r + c.ug * g + c.ub * b + (128 << 16) + 32768) >> 16, (c.vr * r + c.vg * g + c.vb * b + (128 << 16) + 32768) >> 16];
}

/** Bytes of one I420 picture (even sizes; H.264 4:2:0 needs them). */
export function i420Size(width: number, height: number): number {
  return width * height + 2 * (width >> 1) * (height >> 1);
}

/** Fills an I420 picture with black (Y' 16, Cb = Cr = 128). */
export function fillBlackI420(pic: Uint8Array, width: number, height: number): void {
  pic.fill(16, 0, width * height);
  pic.fill(128, width * height, i420Size(width, height));
}

// Chroma accumulators, reused between frames (sized for the largest picture seen).
let accA = new Uint16Array(0);
let accU = new Uint32Array(0);
let accV = new Uint32Array(0);
let touched = new Int32Array(0);

export function blendRunsI420(pic: Uint8Array, width: number, height: number, frame: RunFrame, matrix: YuvMatrix): void {
  if (frame.width !== width || frame.height !== height) throw new Error(`overlay frame is ${frame.width}×${frame.height}, the picture ${width}×${height}`);
  if (pic.length < i420Size(width, height)) throw new Error(`I420 picture of ${pic.length} bytes is too small for ${width}×${height}`);
  const { yr, yg, yb, ur, ug, ub, vr, vg, vb } = MATRICES[matrix];
  const cw = width >> 1;
  const chromaCount = cw * (height >> 1);
  if (accA.length < chromaCount) {
    accA = new Uint16Array(chromaCount);
    accU = new Uint32Array(chromaCount);
    accV = new Uint32Array(chromaCount);
    touched = new Int32Array(chromaCount);
  }
  const A4 = accA;
  const AU = accU;
  const AV = accV;
  const T = touched;
  const uBase = width * height;
  const vBase = uBase + chromaCount;
  let nTouched = 0;
  const { runs, pixels } = frame;
  let p = 0;
  for (let r = 0; r < runs.length; r += 2) {
    const start = runs[r];
    const end = start + runs[r + 1];
    const y = (start / width) | 0;
    // Runs may wrap onto the next row: walk row by row.
    let rowStart = y * width;
    let i = start;
    let row = y;
    while (i < end) {
      const rowEnd = Math.min(end, rowStart + width);
      const cRow = (row >> 1) * cw - (rowStart >> 1); // width is even, so is rowStart
      for (; i < rowEnd; i++, p++) {
        const w = pixels[p];
        const a = w >>> 24;
        if (a === 0) continue;
        const R = w & 255;
        const G = (w >>> 8) & 255;
        const B = (w >>> 16) & 255;
        const yo = (yr * R + yg * G + yb * B + 1081344) >> 16; // 16.5 << 16
        // round(x / 255) as ((x + 127) × 257 + 257) >> 16, integer only.
        pic[i] = ((pic[i] * (255 - a) + yo * a + 127) * 257 + 257) >>> 16;
        const ci = cRow + (i >> 1);
        if (A4[ci] === 0) T[nTouched++] = ci;
        A4[ci] += a;
        AU[ci] += a * ((ur * R + ug * G + ub * B + 8421376) >> 16); // 128.5 << 16
        AV[ci] += a * ((vr * R + vg * G + vb * B + 8421376) >> 16);
      }
      rowStart += width;
      row++;
    }
  }
  // Each chroma sample covers four pixels: weight 255 × 4 = 1020 in all.
  for (let k = 0; k < nTouched; k++) {
    const ci = T[k];
    const A = A4[ci];
    pic[uBase + ci] = (pic[uBase + ci] * (1020 - A) + AU[ci] + 510) / 1020;
    pic[vBase + ci] = (pic[vBase + ci] * (1020 - A) + AV[ci] + 510) / 1020;
    A4[ci] = 0;
    AU[ci] = 0;
    AV[ci] = 0;
  }
}
