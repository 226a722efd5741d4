/** Messages between the page and the analysis worker, and the shapes they carry. */
import type { Anchor, ClockFit, ProposedCorrection } from '../../../shared-types/index.ts';
import type { AnalysisSources } from './inputs.ts';

export interface AnalysisProgress {
  phase: 'loading' | 'aligning' | 'storing';
  /** 0..1 */
  fraction: number;
  message: string;
}

/** What a run produced, before it is stored. */
export interface AnalysisOutput extends AnalysisSources {
  /** Tracking rate (Hz): one frame is 1 / rate seconds. */
  rate: number;
  trackingAnchors: Anchor[];
  eventAnchors: Anchor[];
  fit: ClockFit;
  corrections: ProposedCorrection[];
}

export type ToAnalysisWorker = { type: 'start'; sources: AnalysisSources } | { type: 'cancel' };

export type FromAnalysisWorker =
  | { type: 'progress'; progress: AnalysisProgress }
  | { type: 'done'; output: AnalysisOutput }
  | { type: 'failed'; message: string; cancelled: boolean };
