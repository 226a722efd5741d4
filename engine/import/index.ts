/**
 * Importers: pure TypeScript, fed text chunks by whoever reads the file (a renderer worker
 * from fetch(), the CLI from electron/host/text-stream.ts).
 *
 * const d = detectSource(name, head);
 * const r = await importTracking(chunks, { fileName: name, mapping: d.mapping as TrackingMapping });
 */
export { detectSource } from './detect.ts';
export { importTracking } from './tracking/import.ts';
export { importEvents } from './events/import.ts';
export { defaultKindNames, makeKindLookup } from './kind-names.ts';
export { toCentreMetres, fromCentreMetres, makeConverter } from './coordinates.ts';
export { ImportAbortedError, isAbortError } from './text/abort.ts';
export { parseMatchClock, parseIsoMs } from './events/clock.ts';
export { parseObjectId } from './object-ids.ts';

/** Chunks of a string, for tests and in-memory imports: textChunks('a,b\n1,2', 4). */
export async function* textChunks(text: string, size = 65536): AsyncIterable<string> {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size);
}
