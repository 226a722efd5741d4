/**
 * The page `whistlemark export` drives headless (route #cli-export): it installs a few
 * functions on the window for the command line to call through playwright-core. The same
 * project opening (openProjectBytes) and export queue (queueExport/runQueue) as the app.
 */
import type { HostApi } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { ClipRow } from '../db/rows.ts';
import { openProjectBytes } from '../export/project-io.ts';
import { fetchFile } from '../host/index.ts';
import { loadExportContext, outputNames, planClips, queueExport, runQueue } from './run-export.ts';

export const CLI_EXPORT_HASH = '#cli-export';

export interface CliExportPlan {
  /** Set when the export cannot start: the message to print. */
  problem?: string;
  reelId?: number;
  clips?: { title: string; durationS: number }[];
  /** Every file the export will write, in order. */
  files?: string[];
}

export interface CliExportApi {
  /** Opens the project file at `path` (read through the host) as a new project. */
  open(path: string): Promise<{ projectId: number; title: string; reels: string[]; footage: { path: string; state: string; detail: string }[] }>;
  plan(projectId: number, reelTitle: string): Promise<CliExportPlan>;
  /** Runs the export; progress goes to window.wmCliProgress when the caller exposed it. */
  run(projectId: number, reelId: number, directory: string, overwrite: boolean): Promise<{ state: string; message: string; outputs: string[] }>;
  cancel(): void;
}

export function installCliExport(db: WhistlemarkDb, host: HostApi): void {
  // One export per page (the command line opens a fresh one each run), so a cancel that
  // arrives before run() starts still counts.
  const abort = new AbortController();
  const api: CliExportApi = {
    async open(path) {
      const [file] = await host.openPaths([path]);
      const bytes = new Uint8Array(await (await fetchFile(file)).arrayBuffer());
      const opened = await openProjectBytes(db, host, bytes, file.name);
      const reels = (await db.reels.where('projectId').equals(opened.projectId).toArray()).map((r) => r.title);
      return { projectId: opened.projectId, title: opened.title, reels, footage: opened.footage.map((f) => ({ path: f.ref.path, state: f.state, detail: f.detail })) };
    },
    async plan(projectId, reelTitle) {
      const reels = await db.reels.where('projectId').equals(projectId).toArray();
      const reel = reels.find((r) => r.title === reelTitle) ?? reels.find((r) => r.title.toLowerCase() === reelTitle.toLowerCase());
      if (!reel) return { problem: reels.length ? `no reel titled "${reelTitle}". Reels in this project: ${reels.map((r) => `"${r.title}"`).join(', ')}` : `no reel titled "${reelTitle}": this project has no reels. Build one on the Reels screen and save the project.` };
      const clips = ((await db.clips.where('reelId').equals(reel.id!).toArray()) as (ClipRow & { id: number })[]).sort((a, b) => a.order - b.order);
      if (!clips.length) return { problem: `reel "${reel.title}" has no clips to export. Add clips on the Reels screen and save the project.` };
      const ctx = await loadExportContext(db, host, projectId);
      const { plans, problems } = planClips(ctx, clips);
      if (problems.length) return { problem: problems.join('\n') };
      const names = outputNames(reel.title, plans);
      const files = names.clip.flatMap((n) => [n.mp4, n.vtt]);
      if (plans.length > 1) files.push(names.reel.mp4, names.reel.vtt);
      files.push(names.csv, names.json);
      return { reelId: reel.id!, clips: plans.map((p) => ({ title: p.title, durationS: p.durationS })), files };
    },
    async run(projectId, reelId, directory, overwrite) {
      const signal = abort.signal;
      const jobId = await queueExport(db, { projectId, reelId, clipIds: [], directory, overwrite });
      const report = (window as unknown as { wmCliProgress?: (f: number, left: number | null, doing: string) => void }).wmCliProgress;
      await runQueue(db, host, projectId, {
        signalFor: (id) => (id === jobId ? signal : undefined),
        onProgress: (id, f, left, doing) => {
          if (id === jobId) report?.(f, left ?? null, doing);
        },
      });
      const job = await db.exportJobs.get(jobId);
      return { state: job?.state ?? 'failed', message: job?.message ?? 'the export job disappeared', outputs: job?.outputs ?? [] };
    },
    cancel() {
      abort.abort();
    },
  };
  (window as unknown as { whistlemarkCli: CliExportApi }).whistlemarkCli = api;
  document.body.dataset.cliExport = 'ready';
}
