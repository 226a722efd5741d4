/**
 * One import of a tracking or event file: stream the file through the importer, and only
 * when the whole file parsed without errors store it, in one transaction. Runs inside the
 * import worker; takes its dependencies as arguments so it is testable in Node.
 */
import type { ImportOptions, ImportProblem, ImportProgress, ImportResult, RejectedRow, SourceMapping } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { SourceRow, SourceSummary } from '../db/rows.ts';
import { storeSource, type ImportedPayload, type SourceFileInfo } from '../db/store.ts';
import { summariseEvents, summariseTracking } from '../summaries.ts';
import type { Importers, TextChunks } from './importers.ts';
import { openTextStream, ReadFailure, type FetchLike } from './text-stream.ts';

export interface ImportJob {
  projectId: number;
  file: SourceFileInfo & { url: string };
  mapping: SourceMapping;
  detected?: SourceRow['detected'];
  headerSignature?: string;
  rememberMapping: boolean;
  user: string;
}

export type ImportOutcome =
  | { status: 'stored'; sourceId: number; summary: SourceSummary; warnings: ImportProblem[]; rejectedRows: RejectedRow[] }
  | { status: 'refused'; problems: ImportProblem[]; rejectedRows: RejectedRow[]; rows: number }
  | { status: 'cancelled' };

export interface ImportDeps {
  db: WhistlemarkDb;
  importers: Importers;
  fetch: FetchLike;
  onProgress: (p: ImportProgress) => void;
  signal: AbortSignal;
}

export async function runImport(job: ImportJob, deps: ImportDeps): Promise<ImportOutcome> {
  const { signal } = deps;
  const base = { fileName: job.file.fileName, bytesTotal: job.file.size, onProgress: deps.onProgress, signal };
  try {
    const chunks = await openTextStream(deps.fetch, job.file.url, signal);
    const { result, payload, summary } = await parseFile(job, chunks, base, deps.importers);
    if (signal.aborted) return { status: 'cancelled' };
    const errors = result.problems.filter((p) => p.severity === 'error');
    if (!result.ok || !payload || !summary || errors.length > 0) {
      const problems = result.problems.length
        ? result.problems
        : [{ severity: 'error' as const, file: job.file.fileName, message: 'The importer gave no data and no reason.', hint: 'Check the mapping and try again.' }];
      return { status: 'refused', problems, rejectedRows: result.rejectedRows, rows: result.rows };
    }
    const warnings = result.problems.filter((p) => p.severity === 'warning');
    deps.onProgress({ bytesRead: job.file.size, bytesTotal: job.file.size, rows: result.rows, phase: 'storing' });
    if (signal.aborted) return { status: 'cancelled' };
    const sourceId = await storeSource(deps.db, {
      projectId: job.projectId,
      file: job.file,
      payload,
      summary,
      warnings,
      mapping: job.mapping,
      ...(job.detected ? { detected: job.detected } : {}),
      ...(job.headerSignature ? { headerSignature: job.headerSignature } : {}),
      rememberMapping: job.rememberMapping,
      user: job.user,
    });
    deps.onProgress({ bytesRead: job.file.size, bytesTotal: job.file.size, rows: result.rows, phase: 'done' });
    return { status: 'stored', sourceId, summary, warnings, rejectedRows: result.rejectedRows };
  } catch (err) {
    if (signal.aborted) return { status: 'cancelled' };
    const message = err instanceof ReadFailure ? `Reading ${job.file.fileName}: ${err.message}` : `Import of ${job.file.fileName} failed: ${(err as Error).message}`;
    return {
      status: 'refused',
      problems: [{ severity: 'error', file: job.file.fileName, message, hint: 'Nothing was stored. Fix the cause and import again.' }],
      rejectedRows: [],
      rows: 0,
    };
  }
}

interface Parsed {
  result: ImportResult<unknown>;
  payload?: ImportedPayload;
  summary?: SourceSummary;
}

/** Run the importer the mapping names; on data, also its payload and summary. */
async function parseFile(job: ImportJob, chunks: TextChunks, base: Omit<ImportOptions<never>, 'mapping'>, importers: Importers): Promise<Parsed> {
  const m = job.mapping;
  if (m.kind === 'tracking') {
    const r = await importers.importTracking(chunks, { ...base, mapping: m });
    return r.data ? { result: r, payload: { kind: 'tracking', data: r.data }, summary: summariseTracking(r.data, r.rows, r.rejectedRows.length) } : { result: r };
  }
  const r = await importers.importEvents(chunks, { ...base, mapping: m });
  return r.data ? { result: r, payload: { kind: 'events', data: r.data }, summary: summariseEvents(r.data, r.rows, r.rejectedRows.length) } : { result: r };
}
