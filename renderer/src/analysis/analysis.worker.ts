/// <reference lib="webworker" />
/**
 * The analysis worker: reads tracking and the event log from the project database
 * (IndexedDB works in workers) and runs the engine off the UI thread. It stores nothing:
 * the page stores the result in one transaction, so cancelling (terminating this worker)
 * can never leave half a result behind.
 */
import { getDb } from '../db/database.ts';
import { analyse, AnalysisCancelledError } from './analyse.ts';
import type { FromAnalysisWorker, ToAnalysisWorker } from './protocol.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const abort = new AbortController();
const post = (m: FromAnalysisWorker) => scope.postMessage(m);

scope.onmessage = async (ev: MessageEvent<ToAnalysisWorker>) => {
  const msg = ev.data;
  if (msg.type === 'cancel') return abort.abort();
  try {
    const output = await analyse(getDb(), msg.sources, (progress) => post({ type: 'progress', progress }), abort.signal);
    post({ type: 'done', output });
  } catch (e) {
    post({ type: 'failed', message: (e as Error).message, cancelled: e instanceof AnalysisCancelledError });
  }
};
