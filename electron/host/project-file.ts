/**
 * Match project files on disk: save through the atomic writer (temporary file, fsync,
 * rename; never replacing without `overwrite`), optionally streamed in slices so a
 * progress bar can move, and read back fully checked (engine/project-file).
 *
 *   await saveProjectFile('/matches/demo.wmatch', bytes, { overwrite: true });
 *   const { manifest, tables } = await openProjectFile('/matches/demo.wmatch');
 */
import { readFile } from 'node:fs/promises';
import { basename, dirname, resolve } from 'node:path';
import type { SaveResult } from '../../shared-types/host-api.ts';
import { readProjectFile, type ReadProject } from '../../engine/project-file/index.ts';
import { saveAtomic } from './atomic-save.ts';

export interface SaveProjectOptions {
  overwrite?: boolean;
  /** Bytes per write; each slice is handed to `onProgress`. */
  sliceBytes?: number;
  onProgress?: (written: number, total: number) => void | Promise<void>;
}

export async function saveProjectFile(path: string, bytes: Uint8Array, opts: SaveProjectOptions = {}): Promise<SaveResult> {
  const target = resolve(path);
  const slice = Math.max(1, opts.sliceBytes ?? 4 << 20);
  async function* slices() {
    for (let at = 0; at < bytes.length; at += slice) {
      const part = bytes.subarray(at, Math.min(bytes.length, at + slice));
      yield part;
      await opts.onProgress?.(Math.min(bytes.length, at + slice), bytes.length);
    }
  }
  return saveAtomic({ directory: dirname(target), name: basename(target), bytes: slices(), overwrite: opts.overwrite === true });
}

export async function openProjectFile(path: string): Promise<ReadProject> {
  const target = resolve(path);
  const bytes = await readFile(target).catch((e: NodeJS.ErrnoException) => {
    throw new Error(`${target}: ${e.code === 'ENOENT' ? 'no such file; was it moved or renamed?' : e.message}`);
  });
  return readProjectFile(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), basename(target));
}
