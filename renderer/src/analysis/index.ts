/** The analysis runner: the engine's syncMatch on a project's stored sources, in a worker. */
export { useAnalysis, type UseAnalysis } from './use-analysis.ts';
export { runAnalysis, cancelAnalysis, autoAnalyse, analysisState, subscribeAnalysis, type AnalysisState } from './run-analysis.ts';
export { storeAnalysis, isProposal, runKey, type AnalysisRun, type ChangedUnderDecision } from './store-analysis.ts';
export { analysisSources, hasAnalysis, loadLoggedEventLog } from './inputs.ts';
export type { AnalysisProgress, AnalysisOutput } from './protocol.ts';
