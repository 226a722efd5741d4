/**
 * Page side of the analysis: one run at a time per project, shared by every screen.
 * `runAnalysis` starts the worker, forwards progress, stores the result (one transaction)
 * and records the audit entry; `cancelAnalysis` stops it (nothing is stored). Screens
 * read the state through `useAnalysis` (use-analysis.ts).
 *
 *   await runAnalysis(db, projectId, 'ana', 'on request');   // -> { state: 'done', run: {...} }
 */
import type { WhistlemarkDb } from '../db/database.ts';
import { analysisSources, hasAnalysis } from './inputs.ts';
import type { AnalysisProgress, FromAnalysisWorker, ToAnalysisWorker } from './protocol.ts';
import { storeAnalysis, type AnalysisRun } from './store-analysis.ts';

export interface AnalysisState {
  state: 'idle' | 'running' | 'done' | 'failed' | 'cancelled';
  progress?: AnalysisProgress;
  message?: string;
  run?: AnalysisRun;
}

interface Slot {
  state: AnalysisState;
  listeners: Set<(s: AnalysisState) => void>;
  cancel?: () => void;
  running?: Promise<AnalysisState>;
  autoChecked?: boolean;
}

const slots = new Map<number, Slot>();

function slot(projectId: number): Slot {
  let s = slots.get(projectId);
  if (!s) slots.set(projectId, (s = { state: { state: 'idle' }, listeners: new Set() }));
  return s;
}

function set(projectId: number, next: AnalysisState) {
  const s = slot(projectId);
  s.state = next;
  for (const l of s.listeners) l(next);
}

export function analysisState(projectId: number): AnalysisState {
  return slot(projectId).state;
}

export function subscribeAnalysis(projectId: number, listener: (s: AnalysisState) => void): () => void {
  const s = slot(projectId);
  s.listeners.add(listener);
  return () => s.listeners.delete(listener);
}

/** Runs the analysis of a project (or joins the run already going). */
export function runAnalysis(db: WhistlemarkDb, projectId: number, user: string, trigger: AnalysisRun['trigger'] = 'on request'): Promise<AnalysisState> {
  const s = slot(projectId);
  if (s.running) return s.running;
  s.running = (async (): Promise<AnalysisState> => {
    const sources = await analysisSources(db, projectId);
    if (!sources) {
      const st: AnalysisState = { state: 'failed', message: 'The analysis needs tracking and an event log in this match project. Add them on the Sources screen (Alt+1).' };
      set(projectId, st);
      return st;
    }
    set(projectId, { state: 'running', progress: { phase: 'loading', fraction: 0, message: 'Starting the analysis…' } });
    const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module', name: 'analysis' });
    const send = (m: ToAnalysisWorker) => worker.postMessage(m);
    let storing = false;
    const outcome = await new Promise<FromAnalysisWorker & { type: 'done' | 'failed' }>((resolve) => {
      s.cancel = () => {
        if (storing) return;
        send({ type: 'cancel' });
        // The engine runs in one piece: stop the worker rather than wait for it.
        worker.terminate();
        resolve({ type: 'failed', message: 'The analysis was cancelled; nothing was stored.', cancelled: true });
      };
      worker.onmessage = (ev: MessageEvent<FromAnalysisWorker>) => {
        const m = ev.data;
        if (m.type === 'progress') set(projectId, { state: 'running', progress: m.progress });
        else resolve(m);
      };
      worker.onerror = (ev) => resolve({ type: 'failed', message: `The analysis worker stopped: ${ev.message || 'unknown error'}. Nothing was stored; try “Re-run analysis”.`, cancelled: false });
      send({ type: 'start', sources });
    });
    worker.terminate();
    if (outcome.type === 'failed') {
      const st: AnalysisState = { state: outcome.cancelled ? 'cancelled' : 'failed', message: outcome.message };
      set(projectId, st);
      return st;
    }
    storing = true;
    set(projectId, { state: 'running', progress: { phase: 'storing', fraction: 0.95, message: 'Storing anchors, the clock fit and the proposed corrections…' } });
    try {
      const run = await storeAnalysis(db, { projectId, output: outcome.output, user, trigger });
      const st: AnalysisState = { state: 'done', run };
      set(projectId, st);
      return st;
    } catch (e) {
      const st: AnalysisState = { state: 'failed', message: `The analysis result could not be stored: ${(e as Error).message}` };
      set(projectId, st);
      return st;
    }
  })().finally(() => {
    s.running = undefined;
    s.cancel = undefined;
  });
  return s.running;
}

/** Stops a running analysis before it stores anything (a no-op while it is storing). */
export function cancelAnalysis(projectId: number): void {
  slot(projectId).cancel?.();
}

/** Runs once per page and project when it has tracking and an event log but no analysis yet. */
export async function autoAnalyse(db: WhistlemarkDb, projectId: number, user: string): Promise<void> {
  const s = slot(projectId);
  if (s.autoChecked || s.running) return;
  const sources = await analysisSources(db, projectId);
  if (!sources) return; // checked again when sources arrive
  s.autoChecked = true;
  if (await hasAnalysis(db, projectId, sources.eventSourceId)) return;
  await runAnalysis(db, projectId, user, 'automatic');
}
