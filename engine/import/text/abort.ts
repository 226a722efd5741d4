/** Abort handling shared by the importers: reject with an AbortError-like error, return nothing. */

export class ImportAbortedError extends Error {
  override name = 'AbortError';
  constructor(message = 'Import aborted') {
    super(message);
  }
}

/** Throws when the signal has fired. Called once per chunk, so an abort lands within one chunk. */
export function throwIfAborted(signal: AbortSignal | undefined): void {
  if (signal?.aborted) throw new ImportAbortedError();
}

export const isAbortError = (e: unknown): boolean => e instanceof Error && e.name === 'AbortError';
