/**
 * Power spectrum of a real frame: an n/2-point complex radix-2 FFT on the frame packed as
 * complex pairs, then the standard split into the n/2+1 real-input bins.
 *
 * Written here rather than taking `fft.js`: the detector needs only |X[k]|² of real
 * frames, and doing the real-input split ourselves halves the work. bench/whistle.bench.ts
 * measures it against fft.js's realTransform on the same frames; tests check the values
 * against fft.js and a direct DFT.
 *
 * Example: `new RealFft(512).power(frame, out)` fills out[0..256] with |X[k]|².
 */
export class RealFft {
  readonly size: number;
  private readonly half: number;
  private readonly bitReverse: Uint32Array;
  /** Twiddles of the n/2-point complex FFT: cos/sin(2πk/(n/2)). */
  private readonly cosHalf: Float64Array;
  private readonly sinHalf: Float64Array;
  /** Twiddles of the real split: cos/sin(2πk/n). */
  private readonly cosFull: Float64Array;
  private readonly sinFull: Float64Array;
  private readonly re: Float64Array;
  private readonly im: Float64Array;

  constructor(size: number) {
    if (!Number.isInteger(Math.log2(size)) || size < 4) throw new RangeError(`RealFft: size ${size} must be a power of two >= 4`);
    this.size = size;
    const half = size / 2;
    this.half = half;
    const bits = Math.log2(half);
    this.bitReverse = new Uint32Array(half);
    for (let i = 0; i < half; i++) {
      let r = 0;
      for (let b = 0; b < bits; b++) r |= ((i >>> b) & 1) << (bits - 1 - b);
      this.bitReverse[i] = r;
    }
    this.cosHalf = new Float64Array(half / 2);
    this.sinHalf = new Float64Array(half / 2);
    for (let k = 0; k < half / 2; k++) {
      this.cosHalf[k] = Math.cos((2 * Math.PI * k) / half);
      this.sinHalf[k] = Math.sin((2 * Math.PI * k) / half);
    }
    this.cosFull = new Float64Array(half + 1);
    this.sinFull = new Float64Array(half + 1);
    for (let k = 0; k <= half; k++) {
      this.cosFull[k] = Math.cos((2 * Math.PI * k) / size);
      this.sinFull[k] = Math.sin((2 * Math.PI * k) / size);
    }
    this.re = new Float64Array(half);
    this.im = new Float64Array(half);
  }

  /** Complex spectrum X[0..n/2] of a real frame into re/im arrays of length n/2+1. */
  spectrum(frame: ArrayLike<number>, outRe: Float64Array, outIm: Float64Array): void {
    this.packedTransform(frame);
    const { half, re, im, cosFull, sinFull } = this;
    for (let k = 0; k <= half; k++) {
      const a = re[k % half];
      const b = im[k % half];
      const c = re[(half - k) % half];
      const d = im[(half - k) % half];
      // Even and odd parts of the packed sequence: Fe = (Z[k] + conj Z[m-k]) / 2,
      // Fo = (Z[k] - conj Z[m-k]) / 2i; X[k] = Fe + e^{-2πik/n} Fo.
      const feRe = (a + c) / 2;
      const feIm = (b - d) / 2;
      const foRe = (b + d) / 2;
      const foIm = -(a - c) / 2;
      const wr = cosFull[k];
      const wi = -sinFull[k];
      outRe[k] = feRe + wr * foRe - wi * foIm;
      outIm[k] = feIm + wr * foIm + wi * foRe;
    }
  }

  /** |X[k]|² for k = 0..n/2 into out (length n/2+1). */
  power(frame: ArrayLike<number>, out: Float32Array | Float64Array): void {
    this.packedTransform(frame);
    const { half, re, im, cosFull, sinFull } = this;
    for (let k = 0; k <= half; k++) {
      const i = k === half ? 0 : k;
      const j = k === 0 ? 0 : half - k;
      const a = re[i];
      const b = im[i];
      const c = re[j];
      const d = im[j];
      const feRe = (a + c) / 2;
      const feIm = (b - d) / 2;
      const foRe = (b + d) / 2;
      const foIm = -(a - c) / 2;
      const wr = cosFull[k];
      const wi = -sinFull[k];
      const xr = feRe + wr * foRe - wi * foIm;
      const xi = feIm + wr * foIm + wi * foRe;
      out[k] = xr * xr + xi * xi;
    }
  }

  /** In-place iterative radix-2 FFT of z[k] = frame[2k] + i·frame[2k+1] into re/im. */
  private packedTransform(frame: ArrayLike<number>): void {
    const { half, re, im, bitReverse, cosHalf, sinHalf } = this;
    if (frame.length !== this.size) throw new RangeError(`RealFft: frame has ${frame.length} samples, expected ${this.size}`);
    for (let i = 0; i < half; i++) {
      const r = bitReverse[i];
      re[r] = frame[2 * i];
      im[r] = frame[2 * i + 1];
    }
    for (let len = 2; len <= half; len <<= 1) {
      const step = half / len;
      const halfLen = len >>> 1;
      for (let start = 0; start < half; start += len) {
        for (let j = 0; j < halfLen; j++) {
          const wr = cosHalf[j * step];
          const wi = -sinHalf[j * step];
          const p = start + j;
          const q = p + halfLen;
          const tr = wr * re[q] - wi * im[q];
          const ti = wr * im[q] + wi * re[q];
          re[q] = re[p] - tr;
          im[q] = im[p] - ti;
          re[p] += tr;
          im[p] += ti;
        }
      }
    }
  }
}
