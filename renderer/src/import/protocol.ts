/** Messages between the page and the import worker. */
import type { ImportProgress } from '../../../shared-types/index.ts';
import type { ImportJob, ImportOutcome } from './run-import.ts';

export type ToWorker = { type: 'start'; job: ImportJob } | { type: 'cancel' };

export type FromWorker =
  | { type: 'progress'; progress: ImportProgress }
  | { type: 'outcome'; outcome: ImportOutcome };
