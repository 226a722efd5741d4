/**
 * Page side of an import: start the worker, forward progress, cancel on request.
 */
import type { ImportProgress } from '../../../shared-types/index.ts';
import type { FromWorker, ToWorker } from './protocol.ts';
import type { ImportJob, ImportOutcome } from './run-import.ts';

export interface RunningImport {
  outcome: Promise<ImportOutcome>;
  cancel(): void;
}

export function startImport(job: ImportJob, onProgress: (p: ImportProgress) => void): RunningImport {
  const worker = new Worker(new URL('./import.worker.ts', import.meta.url), { type: 'module', name: 'import' });
  const send = (m: ToWorker) => worker.postMessage(m);
  const outcome = new Promise<ImportOutcome>((resolve) => {
    worker.onmessage = (ev: MessageEvent<FromWorker>) => {
      const m = ev.data;
      if (m.type === 'progress') onProgress(m.progress);
      else {
        resolve(m.outcome);
        worker.terminate();
      }
    };
    worker.onerror = (ev) => {
      resolve({
        status: 'refused',
        problems: [{ severity: 'error', file: job.file.fileName, message: `The import worker stopped: ${ev.message || 'unknown error'}.`, hint: 'Nothing was stored. Reload the app and try again.' }],
        rejectedRows: [],
        rows: 0,
      });
      worker.terminate();
    };
  });
  send({ type: 'start', job });
  return { outcome, cancel: () => send({ type: 'cancel' }) };
}
