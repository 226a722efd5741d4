/**
 * Directory listing for the in-app file chooser (browser mode has no native dialog).
 * Folders first, then files, each group by name; hidden entries (dot files) are left out.
 *
 * Example: await listDirectory('/media') → { path: '/media', parent: '/', entries: [...] }
 */
import { readdir, stat } from 'node:fs/promises';
import { homedir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import type { DirectoryEntry, DirectoryListing } from '../../shared-types/host-api.ts';

export async function listDirectory(path?: string): Promise<DirectoryListing> {
  const dir = resolve(path && path.trim() !== '' ? path : homedir());
  const dirents = await readdir(dir, { withFileTypes: true }).catch((e: NodeJS.ErrnoException) => {
    const why = e.code === 'ENOENT' ? 'no such folder' : e.code === 'ENOTDIR' ? 'not a folder' : e.code === 'EACCES' ? 'permission denied' : e.message;
    throw new Error(`${dir}: cannot list (${why}); pick another folder`);
  });
  const entries: DirectoryEntry[] = [];
  for (const d of dirents) {
    if (d.name.startsWith('.')) continue;
    const p = join(dir, d.name);
    // Follow symbolic links so a linked media folder shows as a folder; skip broken ones.
    const info = d.isSymbolicLink() ? await stat(p).catch(() => null) : null;
    const isDir = info ? info.isDirectory() : d.isDirectory();
    const isFile = info ? info.isFile() : d.isFile();
    if (isDir) entries.push({ name: d.name, path: p, kind: 'directory' });
    else if (isFile) {
      const size = info?.size ?? (await stat(p).catch(() => null))?.size;
      entries.push({ name: d.name, path: p, kind: 'file', size });
    }
  }
  entries.sort((a, b) => (a.kind === b.kind ? a.name.localeCompare(b.name) : a.kind === 'directory' ? -1 : 1));
  const parent = dirname(dir);
  return { path: dir, parent: parent !== dir ? parent : undefined, entries };
}
