/// <reference lib="webworker" />
/**
 * The import worker: parses one file off the UI thread and stores it in the project
 * database (IndexedDB is available in workers), so the page only sees progress and the
 * outcome. One job per worker; the page terminates it afterwards.
 */
import { getDb } from '../db/database.ts';
import { engineImporters } from './engine-importers.ts';
import type { FromWorker, ToWorker } from './protocol.ts';
import { runImport } from './run-import.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const abort = new AbortController();
const post = (m: FromWorker) => scope.postMessage(m);

scope.onmessage = async (ev: MessageEvent<ToWorker>) => {
  const msg = ev.data;
  if (msg.type === 'cancel') {
    abort.abort();
    return;
  }
  let lastPost = 0;
  const outcome = await runImport(msg.job, {
    db: getDb(),
    importers: engineImporters,
    fetch: (url, init) => fetch(url, init),
    signal: abort.signal,
    onProgress: (progress) => {
      // Throttle: a progress bar needs a few updates a second, not one per chunk.
      const now = performance.now();
      if (progress.phase === 'reading' && now - lastPost < 80) return;
      lastPost = now;
      post({ type: 'progress', progress });
    },
  });
  post({ type: 'outcome', outcome });
};
