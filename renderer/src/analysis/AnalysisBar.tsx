/**
 * The analysis status strip any screen can show: progress with Cancel while it runs, the
 * last run's summary, and the "Re-run analysis" action.
 */
import { useAnalysis } from './use-analysis.ts';
import './analysis.css';

export function AnalysisBar({ projectId }: { projectId: number }) {
  const a = useAnalysis(projectId);
  const pct = Math.round(100 * (a.progress?.fraction ?? 0));
  return (
    <div className="analysis-bar" role="group" aria-label="Analysis">
      {a.state === 'running' ? (
        <>
          <div className="analysis-progress" role="progressbar" aria-label="Analysis progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
            <div className="analysis-progress-fill" style={{ width: `${pct}%` }} />
          </div>
          <span className="small" aria-live="polite">{a.progress?.message ?? 'Analysing…'}</span>
          <button type="button" className="quiet" onClick={a.cancel} disabled={a.progress?.phase === 'storing'}>
            Cancel analysis
          </button>
        </>
      ) : (
        <>
          <span className="small" aria-live="polite">
            {a.state === 'failed' || a.state === 'cancelled' ? (
              <span className={a.state === 'failed' ? 'error-text' : 'muted'}>{a.message}</span>
            ) : a.lastRun ? (
              <>
                Analysed {new Date(a.lastRun.at).toLocaleString('en-GB')} ({a.lastRun.trigger}): {a.lastRun.proposals} open proposals, {a.lastRun.trackingAnchors} restarts in
                tracking, {a.lastRun.eventAnchors} in the log
                {a.lastRun.keptDecided ? `; ${a.lastRun.keptDecided} decided kept` : ''}.
              </>
            ) : a.ready ? (
              'Not analysed yet.'
            ) : (
              'The analysis needs tracking and an event log (Sources, Alt+1).'
            )}
          </span>
          <button type="button" className="quiet" onClick={() => void a.rerun()} disabled={!a.ready}>
            Re-run analysis
          </button>
        </>
      )}
    </div>
  );
}

/** Renders nothing; mounting it starts the automatic first analysis of the project. */
export function AnalysisAutoRun({ projectId }: { projectId: number }) {
  useAnalysis(projectId);
  return null;
}
