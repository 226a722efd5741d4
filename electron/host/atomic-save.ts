/**
 * Atomic file save: the bytes go to a temporary file in the same folder, are flushed to
 * disk (fsync), and only then take the real name in one step. A crash or an error half
 * way leaves the previous file as it was. Without `overwrite`, an existing file is never
 * replaced: the final step is a hard link, which the file system refuses atomically when
 * the name is taken (no check-then-write race).
 *
 * Example: await saveAtomic({ directory: '/exports', name: 'report.csv', bytes })
 *   → { path: '/exports/report.csv', bytesWritten: 1234 }
 */
import { randomBytes } from 'node:crypto';
import { link, open, rename, stat, unlink } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import type { SaveResult } from '../../shared-types/host-api.ts';

export interface AtomicSaveRequest {
  directory: string;
  name: string;
  /** All bytes at once, or chunks as they are produced (an export writer). */
  bytes: Uint8Array | AsyncIterable<Uint8Array>;
  overwrite?: boolean;
}

/** A plain file name: no folders, no "..", nothing the file system treats specially. */
export function checkFileName(name: string): string {
  const trimmed = name.trim();
  if (trimmed === '' || trimmed === '.' || trimmed === '..' || /[/\\\0]/.test(trimmed) || trimmed.length > 255) {
    throw new Error(`"${name}" is not a usable file name: give a plain name without folders, e.g. "report.csv"`);
  }
  return trimmed;
}

async function exists(path: string): Promise<boolean> {
  return stat(path).then(
    () => true,
    () => false,
  );
}

export async function saveAtomic(req: AtomicSaveRequest): Promise<SaveResult> {
  const name = checkFileName(req.name);
  const dir = resolve(req.directory);
  const dirInfo = await stat(dir).catch(() => null);
  if (!dirInfo?.isDirectory()) throw new Error(`${dir}: folder not found; choose an existing folder to save into`);
  const target = join(dir, name);
  const refuse = () => new Error(`${target} already exists; nothing was written. Choose another name or confirm replacing it.`);
  if (!req.overwrite && (await exists(target))) throw refuse();

  const temp = join(dir, `.${name}.${randomBytes(6).toString('hex')}.partial`);
  let bytesWritten = 0;
  const handle = await open(temp, 'wx', 0o644);
  try {
    try {
      const chunks = req.bytes instanceof Uint8Array ? [req.bytes] : req.bytes;
      for await (const chunk of chunks) {
        let off = 0;
        while (off < chunk.length) {
          const { bytesWritten: n } = await handle.write(chunk, off, chunk.length - off);
          off += n;
        }
        bytesWritten += chunk.length;
      }
      await handle.sync();
    } finally {
      await handle.close();
    }
    if (req.overwrite) {
      await rename(temp, target);
    } else {
      try {
        await link(temp, target);
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        if (code === 'EEXIST') throw refuse();
        // File systems without hard links (FAT, some network shares): check, then rename.
        if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'ENOSYS') throw e;
        if (await exists(target)) throw refuse();
        await rename(temp, target);
      }
      await unlink(temp).catch(() => undefined);
    }
  } catch (e) {
    await unlink(temp).catch(() => undefined);
    throw e;
  }
  // Flush the folder entry too, so the new name survives a power cut (POSIX fsync on a dir).
  await open(dir, 'r')
    .then(async (d) => {
      await d.sync().catch(() => undefined);
      await d.close();
    })
    .catch(() => undefined);
  return { path: target, bytesWritten };
}
