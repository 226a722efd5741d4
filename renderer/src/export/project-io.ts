/**
 * Save and open whole match projects from the app. Saving reads the project's rows,
 * fingerprints its footage (size + SHA-256 of the first and last MiB, read through the
 * host), and hands the file to the host's atomic save. Opening checks the whole file
 * first, then adds it as a new project in one transaction, then looks for its footage.
 */
import { fingerprintFromEnds, MIB, readProjectFile, writeProjectFile, type ContentFingerprint, type FootageReference } from '../../../engine/project-file/index.ts';
import type { HostApi, OpenedFile } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import { fetchFile } from '../host/index.ts';
import { addProjectTables, readProjectTables } from './project-tables.ts';
import { fileSlug } from './export-data.ts';


export async function fingerprintOpened(file: OpenedFile): Promise<ContentFingerprint> {
  const headEnd = Math.min(file.size, MIB) - 1;
  const head = file.size ? new Uint8Array(await (await fetchFile(file, { range: [0, Math.max(0, headEnd)] })).arrayBuffer()) : new Uint8Array(0);
  const tailStart = Math.max(0, file.size - MIB);
  const tail = file.size ? new Uint8Array(await (await fetchFile(file, { range: [tailStart, file.size - 1] })).arrayBuffer()) : new Uint8Array(0);
  return fingerprintFromEnds(file.size, head.subarray(0, headEnd + 1), tail);
}

export async function buildProjectFile(db: WhistlemarkDb, host: HostApi, projectId: number, appVersion: string): Promise<{ name: string; bytes: Uint8Array; missingFootage: string[] }> {
  const tables = await readProjectTables(db, projectId);
  const footage: FootageReference[] = [];
  const missingFootage: string[] = [];
  for (const s of tables.sources.filter((r) => r.kind === 'footage')) {
    const ref: FootageReference = { sourceId: s.id as number, path: String(s.path), fileName: String(s.fileName) };
    try {
      const [opened] = await host.openPaths([ref.path]);
      ref.fingerprint = await fingerprintOpened(opened);
    } catch {
      missingFootage.push(ref.path); // saved by path only; the open will ask to relink
    }
    footage.push(ref);
  }
  const bytes = await writeProjectFile(tables, { writtenBy: `Whistlemark ${appVersion}`, databaseVersion: db.verno, footage });
  return { name: `${fileSlug(String(tables.projects[0].title))}.wmatch`, bytes, missingFootage };
}

export interface FootageCheck {
  ref: FootageReference;
  /** The new project's source id. */
  sourceId: number;
  state: 'found' | 'missing' | 'different';
  detail: string;
}

/** Opens a project file's bytes as a new project; resolves to its id and where its footage stands. */
export async function openProjectBytes(db: WhistlemarkDb, host: HostApi, bytes: Uint8Array, fileName: string): Promise<{ projectId: number; title: string; footage: FootageCheck[] }> {
  const { manifest, tables } = await readProjectFile(bytes, fileName);
  const projectId = await addProjectTables(db, tables);
  // The new source ids, in the file's order (ids keep their order when shifted).
  const newSources = (await db.sources.where('projectId').equals(projectId).sortBy('id')).map((s) => s.id!);
  const fileSourceIds = tables.sources.map((s) => s.id as number);
  const footage: FootageCheck[] = [];
  for (const ref of manifest.footage) footage.push(await checkFootage(host, ref, newSources[fileSourceIds.indexOf(ref.sourceId)]));
  return { projectId, title: manifest.title, footage };
}

export async function checkFootage(host: HostApi, ref: FootageReference, sourceId: number, path = ref.path): Promise<FootageCheck> {
  let opened: OpenedFile;
  try {
    [opened] = await host.openPaths([path]);
  } catch (e) {
    return { ref, sourceId, state: 'missing', detail: `${path}: ${(e as Error).message}` };
  }
  if (!ref.fingerprint) return { ref, sourceId, state: 'found', detail: `${path} (not fingerprinted when saved)` };
  const fp = await fingerprintOpened(opened);
  const same = fp.size === ref.fingerprint.size && fp.headSha256 === ref.fingerprint.headSha256 && fp.tailSha256 === ref.fingerprint.tailSha256;
  return same
    ? { ref, sourceId, state: 'found', detail: path }
    : { ref, sourceId, state: 'different', detail: `${path} is not the same recording (size ${fp.size} bytes, ${ref.fingerprint.size} when saved, or different content)` };
}

/** Points a footage source at its new place (the analyst chose it in the relink prompt). */
export async function relinkFootage(db: WhistlemarkDb, sourceId: number, file: OpenedFile, user: string): Promise<void> {
  await db.transaction('rw', db.sources, db.audit, async () => {
    const src = await db.sources.get(sourceId);
    if (!src) throw new Error(`Footage source ${sourceId} no longer exists.`);
    await db.sources.update(sourceId, { path: file.path, fileName: file.name, size: file.size, mtimeMs: file.mtimeMs });
    await db.audit.add({ projectId: src.projectId, at: Date.now(), user, what: `relink footage ${src.fileName}`, subject: 'source', before: { sourceId, path: src.path }, after: { sourceId, path: file.path } });
  });
}
