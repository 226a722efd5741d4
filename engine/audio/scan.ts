/**
 * Whole-recording scan: drives a WhistleDetector over a stream of PCM chunks with progress
 * and cancellation, yielding to the event loop now and then so a worker can hear "cancel".
 *
 * Example:
 *   const found = await scanWhistles(chunks, { sampleRate: 16000, signal, onProgress: (s) => ... });
 */
import { WhistleDetector } from './whistle-detector.ts';
import type { WhistleCandidate, WhistleDetectorOptions } from './whistle-types.ts';

export interface ScanOptions extends WhistleDetectorOptions {
  signal?: AbortSignal;
  /** Called after each chunk with seconds of audio scanned so far. */
  onProgress?: (secondsScanned: number) => void;
  /** Called as each candidate is completed, before the scan ends. */
  onCandidate?: (c: WhistleCandidate) => void;
}

/** Yield to the event loop after about this much audio, so an abort can arrive. */
const YIELD_EVERY_S = 30;

export async function scanWhistles(
  chunks: AsyncIterable<Float32Array> | Iterable<Float32Array>,
  options: ScanOptions,
): Promise<WhistleCandidate[]> {
  const { signal, onProgress, onCandidate } = options;
  const detector = new WhistleDetector(options);
  const found: WhistleCandidate[] = [];
  const keep = (cs: WhistleCandidate[]) => {
    for (const c of cs) {
      found.push(c);
      onCandidate?.(c);
    }
  };
  let sinceYield = 0;
  signal?.throwIfAborted();
  for await (const chunk of chunks) {
    signal?.throwIfAborted();
    keep(detector.push(chunk));
    onProgress?.(detector.secondsSeen);
    sinceYield += chunk.length / detector.sampleRate;
    if (sinceYield >= YIELD_EVERY_S) {
      sinceYield = 0;
      await new Promise((resolve) => setTimeout(resolve, 0));
    }
  }
  signal?.throwIfAborted();
  keep(detector.finish());
  return found;
}
