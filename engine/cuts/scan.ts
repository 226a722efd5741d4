/**
 * Whole-recording cut scan: drives a CutDetector over a stream of small luma frames with
 * progress and cancellation, yielding to the event loop now and then so "cancel" can arrive.
 *
 * Example:
 *   const cuts = await scanCuts(frames, { width: 64, height: 36, signal, onProgress: (n, t) => ... });
 */
import { CutDetector } from './cut-detector.ts';
import type { CutCandidate, CutDetectorOptions } from './cut-types.ts';

export interface LumaFrame {
  /** Footage seconds of the frame. */
  t: number;
  luma: Uint8Array;
}

export interface CutScanOptions extends CutDetectorOptions {
  signal?: AbortSignal;
  /** Frames scanned so far and the footage time reached. */
  onProgress?: (frames: number, t: number) => void;
}

const YIELD_EVERY_FRAMES = 750;

export async function scanCuts(frames: AsyncIterable<LumaFrame> | Iterable<LumaFrame>, options: CutScanOptions): Promise<CutCandidate[]> {
  const { signal, onProgress } = options;
  const detector = new CutDetector(options);
  const found: CutCandidate[] = [];
  signal?.throwIfAborted();
  let n = 0;
  for await (const f of frames) {
    signal?.throwIfAborted();
    found.push(...detector.push(f.luma, f.t));
    n++;
    if (n % YIELD_EVERY_FRAMES === 0) {
      onProgress?.(n, f.t);
      await new Promise((resolve) => setTimeout(resolve, 0));
    }
  }
  signal?.throwIfAborted();
  found.push(...detector.finish());
  return found;
}

/**
 * Splits a byte stream of packed frames (as ffmpeg's rawvideo output arrives, in pieces of
 * any size) into whole frames, timed by the footage's presentation table.
 */
export class FrameSplitter {
  private readonly buf: Uint8Array;
  private fill = 0;
  private index = 0;

  constructor(
    private readonly frameBytes: number,
    private readonly timeOf: (index: number) => number,
    private readonly onFrame: (luma: Uint8Array, t: number, index: number) => void,
  ) {
    this.buf = new Uint8Array(frameBytes);
  }

  get frames(): number {
    return this.index;
  }

  /** Bytes left over that do not make a whole frame (should be 0 at the end). */
  get partialBytes(): number {
    return this.fill;
  }

  push(bytes: Uint8Array): void {
    let at = 0;
    while (at < bytes.length) {
      const take = Math.min(this.frameBytes - this.fill, bytes.length - at);
      // A whole frame in place: hand it on without a copy.
      if (this.fill === 0 && take === this.frameBytes) {
        this.emit(bytes.subarray(at, at + take));
      } else {
        this.buf.set(bytes.subarray(at, at + take), this.fill);
        this.fill += take;
        if (this.fill === this.frameBytes) {
          this.fill = 0;
          this.emit(this.buf);
        }
      }
      at += take;
    }
  }

  private emit(frame: Uint8Array): void {
    const i = this.index++;
    this.onFrame(frame, this.timeOf(i), i);
  }
}

/**
 * Time of frame i from a presentation table (footage seconds), extended at the nominal
 * rate when the decoder gives more frames than the table lists.
 */
export function ptsTimer(pts: readonly number[], fps: number): (i: number) => number {
  const step = 1 / (fps > 0 ? fps : 25);
  return (i) => (i < pts.length ? pts[i] : (pts.length ? pts[pts.length - 1] : -step) + (i - pts.length + 1) * step);
}
