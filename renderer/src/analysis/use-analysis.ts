/**
 * `useAnalysis(projectId)` -> { state, progress, message, run, rerun, cancel }: the
 * project's analysis for any screen. It starts the automatic first run when the project
 * has tracking and an event log and nothing analysed yet (the demo after seeding), and
 * `rerun()` is the "Re-run analysis" action.
 */
import { useCallback, useEffect, useState } from 'react';
import { useServices } from '../app/context.ts';
import { useLive } from '../app/useLive.ts';
import { analysisSources } from './inputs.ts';
import { analysisState, autoAnalyse, cancelAnalysis, runAnalysis, subscribeAnalysis, type AnalysisState } from './run-analysis.ts';
import { runKey, type AnalysisRun } from './store-analysis.ts';

export interface UseAnalysis extends AnalysisState {
  /** The stored record of the last run (survives a reload), when there is one. */
  lastRun?: AnalysisRun;
  /** Tracking and an event log are both present. */
  ready: boolean;
  rerun: () => Promise<AnalysisState>;
  cancel: () => void;
}

export function useAnalysis(projectId: number): UseAnalysis {
  const { db, info } = useServices();
  const [state, setState] = useState<AnalysisState>(() => analysisState(projectId));
  useEffect(() => {
    setState(analysisState(projectId));
    return subscribeAnalysis(projectId, setState);
  }, [projectId]);
  const sources = useLive(() => analysisSources(db, projectId), [db, projectId]);
  const lastRun = useLive(() => db.settings.get(runKey(projectId)).then((r) => r?.value as AnalysisRun | undefined), [db, projectId]);
  useEffect(() => {
    if (sources) void autoAnalyse(db, projectId, info.userName);
  }, [db, projectId, info.userName, sources?.trackingSourceId, sources?.eventSourceId]);
  const rerun = useCallback(() => runAnalysis(db, projectId, info.userName, 'on request'), [db, projectId, info.userName]);
  const cancel = useCallback(() => cancelAnalysis(projectId), [projectId]);
  return { ...state, ...(lastRun ? { lastRun } : {}), ready: !!sources, rerun, cancel };
}
