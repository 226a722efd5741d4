/**
 * Host service: the whistle candidates of one footage file — decode its sound (native
 * ffmpeg or the embedded core) straight into the streaming detector, so memory stays flat
 * over a 90-minute file. The CLI uses it; an IPC handler can too.
 *
 * Example: `const { candidates } = await scanFootageWhistles('match.mp4', { signal })`
 */
import { WhistleDetector, type WhistleCandidate, type WhistleDetectorOptions } from '../../../engine/audio/index.ts';
import { decodeAudio, type DecodeEngine } from './decode.ts';

export interface FootageScanOptions extends Omit<WhistleDetectorOptions, 'sampleRate'> {
  engine?: DecodeEngine | 'auto';
  signal?: AbortSignal;
  /** Seconds of sound scanned so far, and the candidates found so far. */
  onProgress?: (seconds: number, found: number) => void;
}

export interface FootageScan {
  engine: DecodeEngine;
  sampleRate: number;
  /** Seconds of sound scanned (the audio track's length). */
  seconds: number;
  candidates: WhistleCandidate[];
}

/** 16 kHz keeps the 2–4.5 kHz band and most harmonics below Nyquist, at a third of 48 kHz's work. */
export const SCAN_SAMPLE_RATE = 16000;

export async function scanFootageWhistles(file: string, opts: FootageScanOptions = {}): Promise<FootageScan> {
  const { engine, signal, onProgress, ...detectorOptions } = opts;
  const detector = new WhistleDetector({ ...detectorOptions, sampleRate: SCAN_SAMPLE_RATE });
  const candidates: WhistleCandidate[] = [];
  const r = await decodeAudio(file, {
    engine,
    signal,
    sampleRate: SCAN_SAMPLE_RATE,
    onChunk: (pcm) => candidates.push(...detector.push(pcm)),
    onProgress: (s) => onProgress?.(s, candidates.length),
  });
  candidates.push(...detector.finish());
  return { engine: r.engine, sampleRate: SCAN_SAMPLE_RATE, seconds: r.seconds, candidates };
}
