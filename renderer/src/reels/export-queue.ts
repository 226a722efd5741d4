/**
 * The page's side of the export queue (export-clips/run-export.ts does the work): starting
 * the runner, resuming what a restart cut off, the cancel switches and the live progress.
 *
 * Resuming happens once per page load and project. A job still marked 'running' at that
 * point was cut off by the restart; later (a Reels screen opened again, another reel
 * picked) the same mark means it is running right now and must not be queued a second time.
 * Live progress lives here rather than in a panel, so a panel mounted while a job runs
 * still shows it.
 *
 *   await resumeAfterRestart(db, host, projectId, say);   // app start-up
 *   startQueue(db, host, projectId, say);                  // after queueExport()
 */
import { useSyncExternalStore } from 'react';
import type { HostApi } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { ExportJobRow } from '../db/rows.ts';
import { requeueInterrupted, runQueue } from '../export-clips/run-export.ts';

export interface LiveProgress {
  fraction: number;
  secondsLeft?: number;
  doing: string;
}

const controllers = new Map<number, AbortController>();
const resumedProjects = new Set<number>();
let live: Record<number, LiveProgress> = {};
const listeners = new Set<() => void>();

function setLive(id: number, p: LiveProgress) {
  live = { ...live, [id]: p };
  for (const l of listeners) l();
}

/** Runs the project's queued jobs (a no-op while the runner is busy: it picks them up). */
export function startQueue(db: WhistlemarkDb, host: HostApi, projectId: number, onError: (m: string) => void): void {
  void runQueue(db, host, projectId, {
    signalFor: (id) => {
      const ac = new AbortController();
      controllers.set(id, ac);
      return ac.signal;
    },
    onProgress: (id, fraction, secondsLeft, doing) => setLive(id, { fraction, ...(secondsLeft !== undefined ? { secondsLeft } : {}), doing }),
  }).catch((e: Error) => onError(`The export queue stopped: ${e.message}`));
}

/**
 * First call per page and project: jobs a restart cut off go back to the queue and the
 * runner starts; says what was resumed. Later calls only start the runner.
 */
export async function resumeAfterRestart(db: WhistlemarkDb, host: HostApi, projectId: number, say: (m: string) => void): Promise<void> {
  if (!resumedProjects.has(projectId)) {
    resumedProjects.add(projectId);
    const n = await requeueInterrupted(db, projectId, host);
    if (n) say(n === 1 ? 'An export cut off by the restart resumes with its next clip (see Reels).' : `${n} exports cut off by the restart resume with their next clips (see Reels).`);
  }
  startQueue(db, host, projectId, say);
}

/** A queued job is marked cancelled at once; a running one stops at its next frame. */
export async function cancelJob(db: WhistlemarkDb, job: ExportJobRow): Promise<void> {
  if (job.state === 'queued') await db.exportJobs.update(job.id!, { state: 'cancelled', message: 'cancelled before it started', updatedAt: Date.now() });
  controllers.get(job.id!)?.abort();
}

/** Live progress of the jobs running in this page, by job id. */
export function useLiveProgress(): Record<number, LiveProgress> {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => live,
  );
}

/** Clips of a job still to write, for "3 of 4 clips left" (the reel's own file comes last). */
export function clipsLeft(job: ExportJobRow): { left: number; total: number } {
  const total = job.clipIds.length;
  const written = job.outputs.filter((o) => o.endsWith('.mp4')).length;
  return { left: Math.max(0, total - written), total };
}
