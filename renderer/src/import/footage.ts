/** Footage import: the host probes the file (real PTS table); we store the probe. */
import type { HostApi, OpenedFile } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import { storeSource } from '../db/store.ts';
import { summariseFootage } from '../summaries.ts';

export const FOOTAGE_EXTENSIONS = ['mp4', 'm4v', 'mov', 'webm', 'mkv', 'ts', 'mts'];

export function looksLikeFootage(fileName: string): boolean {
  const ext = fileName.toLowerCase().split('.').pop() ?? '';
  return FOOTAGE_EXTENSIONS.includes(ext);
}

export async function importFootage(db: WhistlemarkDb, host: HostApi, projectId: number, file: OpenedFile, user: string): Promise<number> {
  const probe = await host.probeFootage(file.fileId);
  const summary = summariseFootage(probe);
  const warnings = probe.variableRate
    ? [{ severity: 'warning' as const, file: file.name, message: `Variable frame rate (measured ${probe.measuredFps.toFixed(3)} fps, nominal ${probe.nominalFps}).`, hint: 'Times use the real frame timestamps, so this is handled; just be aware.' }]
    : [];
  return storeSource(db, {
    projectId,
    file: { fileName: file.name, path: file.path, size: file.size, mtimeMs: file.mtimeMs },
    payload: { kind: 'footage', probe },
    summary,
    warnings,
    user,
  });
}
