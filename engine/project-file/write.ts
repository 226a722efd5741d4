/**
 * `writeProjectFile(tables, options) → Uint8Array`: one match project as a .wmatch file
 * (see format.ts). Pure: the caller reads the rows from its database and saves the bytes
 * atomically (electron/host/atomic-save.ts).
 */
import { strToU8, zipSync, type Zippable } from 'fflate';
import { FORMAT_NAME, FORMAT_VERSION, MANIFEST_ENTRY, PROJECT_TABLES, type FootageReference, type ManifestEntry, type ProjectManifest, type ProjectTables } from './format.ts';
import { denseIdMap, renumber } from './references.ts';
import { sha256Hex } from './sha256.ts';
import { encodeValue } from './values.ts';

export interface WriteOptions {
  /** e.g. "Whistlemark 0.3.0". */
  writtenBy: string;
  databaseVersion: number;
  /** Footage the project points at, by database source id. */
  footage?: FootageReference[];
  savedAt?: Date;
  /** Deflate level of the binary chunks (tracking); 1 is fast and already halves them. */
  chunkLevel?: 0 | 1 | 2 | 3 | 4 | 5 | 6 | 7 | 8 | 9;
}

export async function writeProjectFile(tables: ProjectTables, opts: WriteOptions): Promise<Uint8Array> {
  const projects = tables.projects;
  if (projects.length !== 1) throw new Error(`a match project file holds exactly one project; got ${projects.length}`);
  const map = denseIdMap(tables);
  const dense = renumber(tables, map);
  const chunks: Uint8Array[] = [];
  const files: Record<string, Uint8Array> = {};
  const tableInfo: ProjectManifest['tables'] = {};
  for (const table of PROJECT_TABLES) {
    const rows = dense[table] ?? [];
    const entry = `tables/${table}.json`;
    files[entry] = strToU8(JSON.stringify(encodeValue(rows, chunks)));
    tableInfo[table] = { entry, rows: rows.length };
  }
  chunks.forEach((c, i) => (files[`chunks/${i}.bin`] = c));
  const entries: Record<string, ManifestEntry> = {};
  for (const [name, bytes] of Object.entries(files)) entries[name] = { size: bytes.byteLength, sha256: await sha256Hex(bytes) };
  const manifest: ProjectManifest = {
    format: FORMAT_NAME,
    formatVersion: FORMAT_VERSION,
    writtenBy: opts.writtenBy,
    savedAt: (opts.savedAt ?? new Date()).toISOString(),
    databaseVersion: opts.databaseVersion,
    title: String(projects[0].title ?? ''),
    tables: tableInfo,
    chunks: chunks.length,
    entries,
    footage: (opts.footage ?? []).map((f) => ({ ...f, sourceId: map('sources', f.sourceId) })),
  };
  // The manifest goes first, so a reader (or a person with any zip tool) sees what it is at once.
  const zippable: Zippable = { [MANIFEST_ENTRY]: [strToU8(JSON.stringify(manifest, null, 1)), { level: 6 }] };
  for (const [name, bytes] of Object.entries(files)) zippable[name] = [bytes, { level: name.endsWith('.bin') ? (opts.chunkLevel ?? 1) : 6 }];
  return zipSync(zippable);
}
