/**
 * The importer functions this renderer needs, as one injectable set. The real ones come
 * from engine/import (see engine-importers.ts); tests pass their own small set.
 */
import type {
  Detection,
  EventLog,
  EventMapping,
  ImportOptions,
  ImportResult,
  TrackingData,
  TrackingMapping,
} from '../../../shared-types/index.ts';

export type TextChunks = AsyncIterable<string>;

export interface Importers {
  detectSource(fileName: string, head: string): Detection;
  importTracking(chunks: TextChunks, opts: ImportOptions<TrackingMapping>): Promise<ImportResult<TrackingData>>;
  importEvents(chunks: TextChunks, opts: ImportOptions<EventMapping>): Promise<ImportResult<EventLog>>;
}
