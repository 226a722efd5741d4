/** Messages between the candidates scan (scan-footage.ts) and its worker (scan.worker.ts). */
import type { CutCandidate } from '../../../engine/cuts/index.ts';
import type { WhistleCandidate } from '../../../engine/audio/index.ts';

export interface ScanRequest {
  type: 'scan';
  /** Absolute URL of the footage file (byte ranges supported). */
  url: string;
  name: string;
  size: number;
  /** The probe's presentation table: frame i is at pts[i] footage seconds. */
  pts: number[];
  fps: number;
  sound: boolean;
  picture: boolean;
}

export type ScanPhase = 'loading' | 'sound' | 'picture';

export type ScanMessage =
  | { type: 'progress'; phase: ScanPhase; /** seconds of sound or frames */ done: number; total: number; found: number }
  | { type: 'whistles'; candidates: WhistleCandidate[]; seconds: number; ms: number }
  | { type: 'cuts'; cuts: CutCandidate[]; frames: number; ms: number }
  | { type: 'done'; requests: number; bytesFetched: number }
  | { type: 'failed'; message: string };
