/**
 * Overlay frames as runs of visible pixels, for handing the renderer's drawn overlay to the
 * native encoder. An overlay frame is mostly transparent (about 12% of the pixels carry
 * something with every layer on, bench/export.bench.ts), so sending only the runs of
 * non-transparent pixels moves about an eighth of the bytes of raw RGBA, and the host blends
 * only those pixels.
 *
 * One frame, all little-endian 32-bit words (so a Uint32Array views it without copying):
 *   [MAGIC, width, height, runCount, (start, length) × runCount, RGBA pixels of every run]
 * `start` is the pixel index (y × width + x); pixels are straight (not premultiplied) RGBA as
 * canvas getImageData returns them. A batch is [BATCH_MAGIC, frameCount, (words, frame) × frameCount].
 *
 *   const words = encodeRuns(imageData.data, 1280, 720);        // renderer
 *   const batch = packBatch([words, ...]);  unpackBatch(batch)   // transport
 *   const frame = decodeRuns(words);  frame.runs, frame.pixels   // host
 */

export const RUNS_MAGIC = 0x574d4f31; // "WMO1"
export const BATCH_MAGIC = 0x574d4f42; // "WMOB"
const HEADER = 4;

/** Gaps of transparent pixels shorter than this are folded into the run: fewer runs to walk. */
const MERGE_GAP = 3;

export interface RunFrame {
  width: number;
  height: number;
  /** (start, length) pairs, pixel units, ascending and non-overlapping. */
  runs: Uint32Array;
  /** RGBA words of every run, in order (one word per pixel). */
  pixels: Uint32Array;
}

export class OverlayFrameError extends Error {}

let scratch = new Uint32Array(0);

/** Encodes straight-alpha RGBA (width × height × 4 bytes) into one run frame. */
export function encodeRuns(rgba: Uint8Array | Uint8ClampedArray, width: number, height: number): Uint32Array {
  const n = width * height;
  if (rgba.length < n * 4) throw new OverlayFrameError(`overlay frame holds ${rgba.length} bytes; ${width}×${height} RGBA needs ${n * 4}`);
  const px = new Uint32Array(rgba.buffer, rgba.byteOffset, n);
  // Pass 1: the runs (into scratch), so the output can be sized exactly.
  if (scratch.length < 2 * 1024) scratch = new Uint32Array(2 * 1024);
  let runs = 0;
  let visible = 0;
  let i = 0;
  while (i < n) {
    while (i < n && px[i] === 0) i++;
    if (i >= n) break;
    const start = i;
    let end = i + 1;
    for (;;) {
      while (end < n && px[end] !== 0) end++;
      let gap = end;
      while (gap < n && gap - end < MERGE_GAP && px[gap] === 0) gap++;
      if (gap < n && gap - end < MERGE_GAP && px[gap] !== 0) end = gap;
      else break;
    }
    if (2 * runs + 2 > scratch.length) {
      const grown = new Uint32Array(scratch.length * 2);
      grown.set(scratch);
      scratch = grown;
    }
    scratch[2 * runs] = start;
    scratch[2 * runs + 1] = end - start;
    runs++;
    visible += end - start;
    i = end;
  }
  const out = new Uint32Array(HEADER + 2 * runs + visible);
  out[0] = RUNS_MAGIC;
  out[1] = width;
  out[2] = height;
  out[3] = runs;
  out.set(scratch.subarray(0, 2 * runs), HEADER);
  let at = HEADER + 2 * runs;
  for (let r = 0; r < runs; r++) {
    const s = scratch[2 * r];
    const len = scratch[2 * r + 1];
    out.set(px.subarray(s, s + len), at);
    at += len;
  }
  return out;
}

/** Reads one run frame, checking it is whole and its runs stay inside the picture. */
export function decodeRuns(words: Uint32Array): RunFrame {
  if (words.length < HEADER || words[0] !== RUNS_MAGIC) throw new OverlayFrameError('not an overlay frame (bad header); the renderer and host disagree on the frame format');
  const width = words[1];
  const height = words[2];
  const count = words[3];
  const runs = words.subarray(HEADER, HEADER + 2 * count);
  if (runs.length !== 2 * count) throw new OverlayFrameError(`overlay frame is cut short: ${count} runs announced, ${runs.length >> 1} present`);
  let total = 0;
  let last = 0;
  const n = width * height;
  for (let r = 0; r < count; r++) {
    const s = runs[2 * r];
    const len = runs[2 * r + 1];
    if (s < last || s + len > n || len === 0) throw new OverlayFrameError(`overlay frame run ${r + 1} (pixels ${s}..${s + len}) is out of order or outside the ${width}×${height} picture`);
    last = s + len;
    total += len;
  }
  const pixels = words.subarray(HEADER + 2 * count);
  if (pixels.length !== total) throw new OverlayFrameError(`overlay frame holds ${pixels.length} pixels; its runs need ${total}`);
  return { width, height, runs, pixels };
}

/** One buffer holding several frames, for one transfer. */
export function packBatch(frames: Uint32Array[]): Uint32Array {
  const size = 2 + frames.reduce((s, f) => s + 1 + f.length, 0);
  const out = new Uint32Array(size);
  out[0] = BATCH_MAGIC;
  out[1] = frames.length;
  let at = 2;
  for (const f of frames) {
    out[at++] = f.length;
    out.set(f, at);
    at += f.length;
  }
  return out;
}

/** The frames of a batch (views into it, not copies). */
export function unpackBatch(batch: Uint32Array): Uint32Array[] {
  if (batch.length < 2 || batch[0] !== BATCH_MAGIC) throw new OverlayFrameError('not a batch of overlay frames (bad header)');
  const frames: Uint32Array[] = [];
  let at = 2;
  for (let k = 0; k < batch[1]; k++) {
    const len = batch[at++];
    if (len === undefined || at + len > batch.length) throw new OverlayFrameError(`overlay batch is cut short at frame ${k + 1} of ${batch[1]}`);
    frames.push(batch.subarray(at, at + len));
    at += len;
  }
  if (at !== batch.length) throw new OverlayFrameError(`overlay batch has ${batch.length - at} words after its last frame`);
  return frames;
}

/** A Uint32Array over bytes received from the transport (copied only when misaligned). */
export function wordsOf(bytes: Uint8Array): Uint32Array {
  if (bytes.byteLength % 4 !== 0) throw new OverlayFrameError(`overlay batch of ${bytes.byteLength} bytes is not whole 32-bit words`);
  if (bytes.byteOffset % 4 === 0) return new Uint32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength / 4);
  return new Uint32Array(bytes.slice().buffer);
}
