/**
 * `readProjectFile(bytes) → { manifest, tables }`: checks everything before handing
 * anything back — zip structure, format name and version, every entry's size and SHA-256,
 * every table present with its row count, one project, references that resolve. Any
 * failure is a ProjectFileError saying what is wrong and what to do; nothing is returned
 * half read.
 */
import { strFromU8, unzipSync, type Unzipped } from 'fflate';
import { FORMAT_NAME, FORMAT_VERSION, MANIFEST_ENTRY, PROJECT_TABLES, ProjectFileError, type ProjectManifest, type ProjectTable, type ProjectTables } from './format.ts';
import { keyOf, refsOf } from './references.ts';
import { sha256Hex } from './sha256.ts';
import { decodeValue } from './values.ts';

export interface ReadProject {
  manifest: ProjectManifest;
  /** Rows with the file's ids (dense, from 1). */
  tables: ProjectTables;
}

const WHAT_TO_DO = 'Open another copy of the project (for example the one you saved before), or sync the match again.';

export async function readProjectFile(bytes: Uint8Array, fileName = 'the file'): Promise<ReadProject> {
  if (bytes.byteLength < 4 || bytes[0] !== 0x50 || bytes[1] !== 0x4b || bytes[2] !== 0x03 || bytes[3] !== 0x04) {
    throw new ProjectFileError(
      `${fileName} is not a Whistlemark match project: it is not a zip archive${bytes.byteLength === 0 ? ' (it is empty)' : ''}. Choose a .wmatch file saved by Whistlemark.`,
      'not-zip',
    );
  }
  let zip: Unzipped;
  try {
    zip = unzipSync(bytes);
  } catch (e) {
    throw new ProjectFileError(`${fileName} is damaged or truncated: its zip directory cannot be read (${(e as Error).message}). ${WHAT_TO_DO}`, 'damaged');
  }
  const manifestBytes = zip[MANIFEST_ENTRY];
  if (!manifestBytes) throw new ProjectFileError(`${fileName} is a zip archive but not a Whistlemark match project (it has no ${MANIFEST_ENTRY}). Choose a .wmatch file saved by Whistlemark.`, 'foreign');
  let manifest: ProjectManifest;
  try {
    manifest = JSON.parse(strFromU8(manifestBytes)) as ProjectManifest;
  } catch (e) {
    throw new ProjectFileError(`${fileName}: its ${MANIFEST_ENTRY} is not valid JSON (${(e as Error).message}). ${WHAT_TO_DO}`, 'damaged');
  }
  if (manifest?.format !== FORMAT_NAME)
    throw new ProjectFileError(`${fileName} is a zip archive with a ${MANIFEST_ENTRY}, but not a Whistlemark match project (format "${String(manifest?.format)}"). Choose a .wmatch file saved by Whistlemark.`, 'foreign');
  if (!Number.isInteger(manifest.formatVersion) || manifest.formatVersion < 1)
    throw new ProjectFileError(`${fileName}: format version "${String(manifest.formatVersion)}" is not one Whistlemark writes. ${WHAT_TO_DO}`, 'invalid');
  if (manifest.formatVersion > FORMAT_VERSION)
    throw new ProjectFileError(`${fileName} was written by a newer Whistlemark (${manifest.writtenBy}, project format ${manifest.formatVersion}); this one reads format ${FORMAT_VERSION}. Update Whistlemark to open it.`, 'newer');

  // A changed byte can leave the manifest valid JSON of the wrong shape: check it before use.
  const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
  if (!isRecord(manifest.entries) || !Object.values(manifest.entries).every((w) => isRecord(w) && typeof w.size === 'number' && typeof w.sha256 === 'string'))
    throw new ProjectFileError(`${fileName} is damaged: its ${MANIFEST_ENTRY} has no usable list of entries and checksums. ${WHAT_TO_DO}`, 'damaged');
  if (!isRecord(manifest.tables) || !Object.values(manifest.tables).every((t) => isRecord(t) && typeof t.entry === 'string' && typeof t.rows === 'number'))
    throw new ProjectFileError(`${fileName} is damaged: its ${MANIFEST_ENTRY} has no usable list of tables. ${WHAT_TO_DO}`, 'damaged');

  for (const [name, want] of Object.entries(manifest.entries)) {
    const got = zip[name];
    if (!got) throw new ProjectFileError(`${fileName} is damaged: the entry ${name} listed in its manifest is missing. ${WHAT_TO_DO}`, 'damaged');
    if (got.byteLength !== want.size || (await sha256Hex(got)) !== want.sha256)
      throw new ProjectFileError(`${fileName} is damaged: the entry ${name} does not match its checksum (${got.byteLength} bytes, ${want.size} expected). ${WHAT_TO_DO}`, 'damaged');
  }
  const chunk = (n: number) => {
    const c = zip[`chunks/${n}.bin`];
    if (!c || !manifest.entries[`chunks/${n}.bin`]) throw new ProjectFileError(`${fileName} is damaged: binary chunk ${n} is missing. ${WHAT_TO_DO}`, 'damaged');
    return c;
  };
  const tables = {} as ProjectTables;
  for (const table of PROJECT_TABLES) {
    const info = manifest.tables?.[table];
    if (!info) throw new ProjectFileError(`${fileName}: the manifest lists no ${table} table. ${WHAT_TO_DO}`, 'invalid');
    const raw = zip[info.entry];
    if (!raw || !manifest.entries[info.entry]) throw new ProjectFileError(`${fileName} is damaged: the ${table} table (${info.entry}) is missing. ${WHAT_TO_DO}`, 'damaged');
    let rows: unknown;
    try {
      rows = decodeValue(JSON.parse(strFromU8(raw)), chunk);
    } catch (e) {
      if (e instanceof ProjectFileError) throw e;
      throw new ProjectFileError(`${fileName}: the ${table} table (${info.entry}) cannot be read: ${(e as Error).message}. ${WHAT_TO_DO}`, 'invalid');
    }
    if (!Array.isArray(rows) || rows.length !== info.rows || !rows.every((r) => typeof r === 'object' && r !== null))
      throw new ProjectFileError(`${fileName}: the ${table} table holds ${Array.isArray(rows) ? rows.length : 'no'} rows where the manifest says ${info.rows}. ${WHAT_TO_DO}`, 'invalid');
    tables[table] = rows as Record<string, unknown>[];
  }
  checkReferences(tables, fileName);
  return { manifest, tables };
}

/** One project; unique keys; every reference (outside the undo history) points at a row in the file. */
function checkReferences(tables: ProjectTables, fileName: string) {
  if (tables.projects.length !== 1) throw new ProjectFileError(`${fileName}: holds ${tables.projects.length} projects; a match project file holds exactly one. ${WHAT_TO_DO}`, 'invalid');
  const keys = new Map<ProjectTable, Set<number>>();
  for (const table of PROJECT_TABLES) {
    const k = keyOf(table);
    const set = new Set<number>();
    tables[table].forEach((row, i) => {
      const id = row[k.field];
      if (typeof id !== 'number' || set.has(id))
        throw new ProjectFileError(`${fileName}: row ${i + 1} of the ${table} table has ${typeof id === 'number' ? 'a repeated' : 'no'} ${k.field}. ${WHAT_TO_DO}`, 'invalid');
      set.add(id);
    });
    if (k.table === table) keys.set(table, set);
  }
  for (const table of PROJECT_TABLES) {
    const k = keyOf(table);
    const targets = { ...refsOf(table), ...(k.table !== table ? { [k.field]: k.table } : {}) };
    tables[table].forEach((row, i) => {
      for (const [field, target] of Object.entries(targets)) {
        const v = row[field];
        if (v === undefined && field === 'pairedWith') continue;
        if (typeof v !== 'number' || !keys.get(target)!.has(v))
          throw new ProjectFileError(`${fileName}: row ${i + 1} of the ${table} table points at ${target} ${String(v)}, which is not in the file. ${WHAT_TO_DO}`, 'invalid');
      }
    });
  }
}
