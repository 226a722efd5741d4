/**
 * The opened-file registry: the only files the hosts will ever serve. Each file the
 * analyst chose gets an opaque random `fileId`; the renderer addresses files by that id
 * alone, so a request can never name a path (no traversal, no guessing).
 *
 * Example: const reg = new OpenedFiles((id) => `/files/${id}`);
 *          const f = await reg.open('/media/match.mp4'); reg.get(f.fileId)?.path
 */
import { randomBytes } from 'node:crypto';
import { stat } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import type { OpenedFile } from '../../shared-types/host-api.ts';

/** fileIds are 128 random bits in hex: unguessable, and safe in a URL path segment. */
export const FILE_ID_PATTERN = /^[0-9a-f]{32}$/;

export class OpenedFiles {
  private byId = new Map<string, OpenedFile>();
  private idByPath = new Map<string, string>();

  constructor(private readonly urlFor: (fileId: string, name: string) => string) {}

  /** Opens one regular file (refreshing size/mtime if it was opened before). */
  async open(path: string): Promise<OpenedFile> {
    const abs = resolve(path);
    const info = await stat(abs).catch((e: NodeJS.ErrnoException) => {
      throw new Error(`${abs}: cannot open (${e.code === 'ENOENT' ? 'file not found' : e.code ?? e.message}); check the path and that you may read it`);
    });
    if (!info.isFile()) throw new Error(`${abs}: not a file; choose a file, not a folder`);
    const fileId = this.idByPath.get(abs) ?? randomBytes(16).toString('hex');
    const name = basename(abs);
    const file: OpenedFile = { fileId, name, path: abs, size: info.size, mtimeMs: info.mtimeMs, url: this.urlFor(fileId, name) };
    this.byId.set(fileId, file);
    this.idByPath.set(abs, fileId);
    return file;
  }

  /** Opens all paths or none: the first failure is reported and nothing is registered. */
  async openAll(paths: string[]): Promise<OpenedFile[]> {
    const checked = await Promise.all(
      paths.map(async (p) => {
        const abs = resolve(p);
        const info = await stat(abs).catch(() => null);
        if (!info) return `${abs}: file not found`;
        if (!info.isFile()) return `${abs}: not a file`;
        return null;
      }),
    );
    const problems = checked.filter((c): c is string => c !== null);
    if (problems.length) throw new Error(`Nothing was opened. ${problems.join('; ')}. Check the paths and try again.`);
    const out: OpenedFile[] = [];
    for (const p of paths) out.push(await this.open(p));
    return out;
  }

  /** The opened file for an id, or undefined for anything else (including malformed ids). */
  get(fileId: string): OpenedFile | undefined {
    if (!FILE_ID_PATTERN.test(fileId)) return undefined;
    return this.byId.get(fileId);
  }
}
