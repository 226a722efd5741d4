/**
 * Everything the mapping screen needs about one opened file before import: detection,
 * the mapping to start from (remembered or detected), and the header signature.
 */
import type { Detection, OpenedFile, SourceMapping } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import { chooseMapping, headerSignature, recallMapping } from '../mapping/memory.ts';
import { looksLikeFootage } from './footage.ts';
import type { Importers } from './importers.ts';
import { readHead, type FetchLike } from './text-stream.ts';

export type PreparedFile =
  | { kind: 'footage'; file: OpenedFile }
  | {
      kind: 'tracking' | 'events' | 'unknown';
      file: OpenedFile;
      detection: Detection;
      mapping?: SourceMapping;
      fromMemory: boolean;
      signature: string;
    };

/** Absolute URL for a file the host serves (workers resolve relative URLs elsewhere). */
export function absoluteUrl(url: string, base: string): string {
  return new URL(url, base).href;
}

export async function prepareFile(
  db: WhistlemarkDb,
  importers: Pick<Importers, 'detectSource'>,
  fetchFn: FetchLike,
  file: OpenedFile,
  base: string,
): Promise<PreparedFile> {
  if (looksLikeFootage(file.name)) return { kind: 'footage', file };
  const head = await readHead(fetchFn, absoluteUrl(file.url, base));
  const detection = importers.detectSource(file.name, head);
  const signature = headerSignature(detection.kind, detection.header);
  const remembered = await recallMapping(db, signature);
  const { mapping, fromMemory } = chooseMapping(detection.mapping, remembered, detection.header);
  return { kind: detection.kind, file, detection, fromMemory, signature, ...(mapping ? { mapping } : {}) };
}
