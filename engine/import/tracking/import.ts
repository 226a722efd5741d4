/**
 * importTracking: streams text chunks through the layout's parser into a FrameStore, then
 * normalises. All-or-nothing: any error gives ok:false and no data.
 */
import type { TrackingData } from '../../../shared-types/domain.ts';
import type { ImportOptions, ImportResult, TrackingMapping } from '../../../shared-types/import.ts';
import { throwIfAborted } from '../text/abort.ts';
import { MAX_REJECTED_SHARE, ProblemLog } from '../text/problems.ts';
import { ProgressCounter } from '../text/progress.ts';
import { FrameStore } from './frame-store.ts';
import { normaliseTracking } from './normalise.ts';
import { trackingCsvParser } from './parse-csv.ts';
import { trackingJsonlParser } from './parse-jsonl.ts';

export async function importTracking(chunks: AsyncIterable<string>, opts: ImportOptions<TrackingMapping>): Promise<ImportResult<TrackingData>> {
  const log = new ProblemLog(opts.fileName);
  const store = new FrameStore();
  const progress = new ProgressCounter(opts.bytesTotal ?? 0, opts.onProgress);
  throwIfAborted(opts.signal);
  const parser = opts.mapping.layout === 'jsonl' ? trackingJsonlParser(opts.mapping, store, log) : trackingCsvParser(opts.mapping, store, log, opts.bytesTotal);
  let firstChunk = true;
  for await (let chunk of chunks) {
    throwIfAborted(opts.signal);
    if (firstChunk && chunk.charCodeAt(0) === 0xfeff) chunk = chunk.slice(1);
    firstChunk = false;
    parser.push(chunk);
    progress.rows = parser.rows();
    progress.chunk(chunk);
  }
  parser.end();
  throwIfAborted(opts.signal);
  progress.rows = parser.rows();
  progress.report('normalising');
  const rows = parser.rows();
  if (log.rejectedCount > 0 && log.rejectedCount > rows * MAX_REJECTED_SHARE) {
    log.error('too-many-rejected', {
      message: `${log.rejectedCount} of ${rows} rows could not be read.`,
      hint: 'The mapping probably does not fit this file; see the skipped rows.',
    });
  }
  const data = log.hasErrors() ? null : normaliseTracking(store, opts.mapping, log);
  throwIfAborted(opts.signal);
  const problems = log.finish();
  progress.report('done');
  const ok = data !== null && !log.hasErrors();
  return ok ? { ok, data: data!, problems, rejectedRows: log.rejectedRows, rows } : { ok: false, problems: ensureOne(problems, opts.fileName), rejectedRows: log.rejectedRows, rows };
}

/** A failed import always says why, even if the reason was only a warning so far. */
function ensureOne(problems: ImportResult<unknown>['problems'], file: string): ImportResult<unknown>['problems'] {
  if (problems.some((p) => p.severity === 'error')) return problems;
  return [...problems, { severity: 'error', file, message: 'Nothing could be imported.', hint: 'Check the mapping against the file.' }];
}
