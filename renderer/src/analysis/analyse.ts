/**
 * The analysis itself, wherever it runs (the analysis worker in the app, Node in tests):
 * load tracking and the logged event log from the database, run the engine's syncMatch.
 * Writes nothing: storing is storeAnalysis's job, in one transaction, after the run.
 */
import type { WhistlemarkDb } from '../db/database.ts';
import { loadTracking } from '../db/store.ts';
import { syncMatch } from '../../../engine/sync.ts';
import { loadLoggedEventLog, type AnalysisSources } from './inputs.ts';
import type { AnalysisOutput, AnalysisProgress } from './protocol.ts';

export class AnalysisCancelledError extends Error {
  constructor() {
    super('The analysis was cancelled; nothing was stored.');
  }
}

export async function analyse(
  db: WhistlemarkDb,
  sources: AnalysisSources,
  onProgress: (p: AnalysisProgress) => void = () => {},
  signal?: AbortSignal,
): Promise<AnalysisOutput> {
  const check = () => {
    if (signal?.aborted) throw new AnalysisCancelledError();
  };
  onProgress({ phase: 'loading', fraction: 0.02, message: 'Reading tracking from the project…' });
  const tracking = await loadTracking(db, sources.trackingSourceId);
  check();
  onProgress({ phase: 'loading', fraction: 0.2, message: 'Reading the event log…' });
  const log = await loadLoggedEventLog(db, sources.eventSourceId);
  check();
  if (!log.events.length) throw new Error('The event log has no events to align. Import an event log with rows on the Sources screen (Alt+1).');
  onProgress({ phase: 'aligning', fraction: 0.3, message: `Finding restarts and aligning ${log.events.length} events with ${tracking.periods.length} tracking periods…` });
  const result = syncMatch(tracking, log);
  check();
  onProgress({ phase: 'aligning', fraction: 0.9, message: 'Alignment done.' });
  return {
    ...sources,
    rate: tracking.rate,
    // stillFromT (the ball at rest) is kept: the footage sync pairs a free kick's whistle with it.
    trackingAnchors: result.trackingAnchors.map(({ id, source, kind, period, t, x, y, confidence, note, eventId, stillFromT }) => ({
      id, source, kind, period, t, confidence,
      ...(x !== undefined ? { x } : {}), ...(y !== undefined ? { y } : {}), ...(note ? { note } : {}), ...(eventId ? { eventId } : {}),
      ...(stillFromT !== undefined ? { stillFromT } : {}),
    })),
    eventAnchors: result.eventAnchors,
    fit: result.fit,
    corrections: result.corrections,
  };
}
