/**
 * The export queue: jobs in db.exportJobs run one after the other; each writes one MP4 (and
 * its WebVTT captions) per clip through the host's atomic save, then the reel's CSV and
 * JSON sidecars. A job remembers the files it finished, so after a restart it resumes with
 * the next clip; a cancelled job leaves only whole files (the host writes to a temporary
 * name and renames at the end; the clip being encoded is never handed to it).
 *
 *   const id = await queueExport(db, { projectId, reelId, clipIds, directory });
 *   await runQueue(db, host, projectId, { onProgress, signalFor });
 */
import type { ClockFit, HostApi, MatchEvent } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { ClipRow, ExportJobRow } from '../db/rows.ts';
import { loadOverlayData, overlaySources } from '../overlay/data.ts';
import type { OverlayData } from '../overlay/contract.ts';
import { createOverlayRenderer } from '../overlay/renderer.ts';
import type { OverlaySettings } from '../overlay/contract.ts';
import { mergeSettings, settingsKey } from '../watch/overlay-settings.ts';
import { ExportCancelled, exportClipEmbedded } from './embedded.ts';
import { planClip, PlanError, type ClipPlan, type PlanInputs } from './plan.ts';
import { fileStem, reelSidecars, sidecarVtt } from './sidecar.ts';
import { joinClips } from './concat.ts';
import { fetchFile } from '../host/index.ts';
import { exportClipNativeFromRenderer, nativeOverlayCanvas } from './native.ts';
import { titleCardFor, titleCardFrames, type TitleCard } from './title-card.ts';

export interface ExportContext {
  inputs: PlanInputs;
  overlay?: OverlayData;
  /** The Watch screen's overlay settings (team styles, trails); each clip chooses its layers. */
  settings: OverlaySettings;
  eventFit?: ClockFit;
  footageUrl: string;
  footageName: string;
  /** The opened footage's id, for the native path (the host reads the file itself). */
  footageFileId: string;
  /** Nominal frame rate (the native encoder's input rate, the title card's frame count). */
  fps: number;
  size: { width: number; height: number };
}

/** Everything an export needs from the project, or a message saying what is missing. */
export async function loadExportContext(db: WhistlemarkDb, host: HostApi, projectId: number): Promise<ExportContext> {
  const src = await overlaySources(db, projectId);
  if (!src) throw new Error('export needs tracking and footage in the project: import them on the Sources screen');
  const footageSource = await db.sources.get(src.footageSourceId);
  const footage = await db.footage.get(src.footageSourceId);
  const meta = await db.trackingMeta.get(src.trackingSourceId);
  if (!footageSource || !footage || !meta) throw new Error('export: the footage or tracking of this project is incomplete; import it again on the Sources screen');
  const fits = (await db.clockFits.where('projectId').equals(projectId).toArray()).sort((a, b) => b.createdAt - a.createdAt || (b.id ?? 0) - (a.id ?? 0));
  const fit = fits.find((f) => f.fit.source === 'footage' && f.sourceId === src.footageSourceId)?.fit;
  if (!fit) throw new Error('export needs the footage clock fit: fit the footage to tracking on the Sync screen first');
  const eventFit = fits.find((f) => f.fit.source === 'events')?.fit;
  const events: MatchEvent[] = (await db.events.where('projectId').equals(projectId).toArray()).map((e) => e.current);
  const nonLive = (await db.nonLive.where('footageSourceId').equals(src.footageSourceId).toArray()).filter((n) => n.projectId === projectId).map((n) => ({ fromT: n.fromT, toT: n.toT, kind: n.kind }));
  const overlay = await loadOverlayData(db, projectId, src);
  const [opened] = await host.openPaths([footageSource.path]);
  const settings = mergeSettings((await db.settings.get(settingsKey(projectId)))?.value);
  return {
    inputs: {
      fit,
      ...(eventFit ? { eventFit } : {}),
      probe: footage.probe,
      tracking: { rate: meta.rate, firstFrame: Object.fromEntries(meta.periods.map((p) => [p.period, p.firstFrame])) },
      events,
      nonLive,
    },
    ...(overlay ? { overlay } : {}),
    settings,
    ...(eventFit ? { eventFit } : {}),
    footageUrl: opened.url,
    footageName: footageSource.fileName,
    footageFileId: opened.fileId,
    fps: footage.probe.nominalFps,
    size: { width: footage.probe.width, height: footage.probe.height },
  };
}

/** Plans of the clips in order; a clip that cannot be planned is reported, not skipped silently. */
export function planClips(ctx: ExportContext, clips: (ClipRow & { id: number })[]): { plans: ClipPlan[]; problems: string[] } {
  const plans: ClipPlan[] = [];
  const problems: string[] = [];
  clips.forEach((c, i) => {
    try {
      plans.push(planClip(c, i, ctx.inputs));
    } catch (e) {
      if (e instanceof PlanError) problems.push(e.message);
      else throw e;
    }
  });
  return { plans, problems };
}

/** File names of a job's outputs: one MP4 + VTT per clip, then the reel's CSV and JSON. */
export function outputNames(reelTitle: string, plans: ClipPlan[]): { clip: { mp4: string; vtt: string }[]; reel: { mp4: string; vtt: string }; csv: string; json: string } {
  const stem = fileStem(reelTitle);
  return {
    clip: plans.map((p) => {
      const base = `${stem}-${String(p.index + 1).padStart(2, '0')}-${fileStem(p.title)}`;
      return { mp4: `${base}.mp4`, vtt: `${base}.vtt` };
    }),
    reel: { mp4: `${stem}.mp4`, vtt: `${stem}.vtt` },
    csv: `${stem}.csv`,
    json: `${stem}.json`,
  };
}

export interface QueueRequest {
  projectId: number;
  reelId: number;
  clipIds: number[];
  directory: string;
  overwrite?: boolean;
  /** 'native': the host's ffmpeg encodes (faster; needs ffmpeg on PATH). Default 'embedded'. */
  path?: 'embedded' | 'native';
  /** Seconds of title card before each clip; 0 or absent: none. */
  titleCardS?: number;
}

export async function queueExport(db: WhistlemarkDb, req: QueueRequest): Promise<number> {
  const now = Date.now();
  const row: ExportJobRow = {
    projectId: req.projectId,
    reelId: req.reelId,
    clipIds: req.clipIds,
    state: 'queued',
    directory: req.directory,
    path: req.path ?? 'embedded',
    progress: 0,
    outputs: [],
    createdAt: now,
    updatedAt: now,
    ...(req.overwrite ? { overwrite: true } : {}),
    ...(req.titleCardS ? { titleCardS: req.titleCardS } : {}),
  };
  return (await db.exportJobs.add(row)) as number;
}

export interface RunHooks {
  /** Job id, fraction of the job done, seconds left (estimate) and what is being written. */
  onProgress?: (jobId: number, fraction: number, secondsLeft: number | undefined, doing: string) => void;
  /** Signal that cancels this job. */
  signalFor?: (jobId: number) => AbortSignal | undefined;
}

/**
 * Jobs found 'running' were cut off by a restart: they go back to the queue. A native encode
 * the restart abandoned is stopped, so its temporary file goes at once (the host would
 * otherwise drop it only after its idle timeout).
 */
export async function requeueInterrupted(db: WhistlemarkDb, projectId: number, host?: HostApi): Promise<number> {
  const stuck = (await db.exportJobs.where('state').equals('running').toArray()).filter((j) => j.projectId === projectId);
  for (const j of stuck) {
    if (j.nativeSession && host) await host.nativeClipCancel(j.nativeSession).catch(() => undefined);
    await db.exportJobs.update(j.id!, { state: 'queued', message: 'resumed after a restart', nativeSession: undefined, updatedAt: Date.now() });
  }
  return stuck.length;
}

let running = false;

/** Runs queued jobs of the project until none is left. Only one runner at a time. */
export async function runQueue(db: WhistlemarkDb, host: HostApi, projectId: number, hooks: RunHooks = {}): Promise<void> {
  if (running) return;
  running = true;
  try {
    for (;;) {
      const next = (await db.exportJobs.where('state').equals('queued').toArray()).filter((j) => j.projectId === projectId).sort((a, b) => a.createdAt - b.createdAt || a.id! - b.id!)[0];
      if (!next) return;
      await runJob(db, host, next, hooks);
    }
  } finally {
    running = false;
  }
}

async function runJob(db: WhistlemarkDb, host: HostApi, job: ExportJobRow, hooks: RunHooks): Promise<void> {
  const id = job.id!;
  const signal = hooks.signalFor?.(id);
  const set = (patch: Partial<ExportJobRow>) => db.exportJobs.update(id, { ...patch, updatedAt: Date.now() });
  await set({ state: 'running' });
  const outputs = [...job.outputs];
  let resumed = false;
  try {
    const reel = await db.reels.get(job.reelId);
    if (!reel) throw new Error(`reel ${job.reelId} no longer exists; nothing was exported`);
    const all = (await db.clips.where('reelId').equals(job.reelId).toArray()) as (ClipRow & { id: number })[];
    const byId = new Map(all.map((c) => [c.id, c]));
    const clips = (job.clipIds.length ? job.clipIds.map((c) => byId.get(c)).filter((c): c is ClipRow & { id: number } => !!c) : all.sort((a, b) => a.order - b.order));
    if (!clips.length) throw new Error(`reel "${reel.title}" has no clips to export`);
    const ctx = await loadExportContext(db, host, job.projectId);
    const { plans, problems } = planClips(ctx, clips);
    if (problems.length) throw new Error(problems.join('\n'));
    const names = outputNames(reel.title, plans);
    const total = plans.reduce((s, p) => s + p.durationS, 0);
    let doneS = 0;
    let carriedS = 0; // clips finished before a restart: not part of this run's pace
    const t0 = performance.now();
    const encoded: Uint8Array[] = [];
    const native = job.path === 'native';
    if (native && !(await host.info()).nativeFfmpeg) throw new Error('this job asks for the native ffmpeg path, but no ffmpeg is on PATH any more; export again with the built-in encoder');
    const canvas = native ? nativeOverlayCanvas(ctx.size.width, ctx.size.height) : undefined;
    const renderer = ctx.overlay ? await createOverlayRenderer({ ...ctx.size, preserveDrawingBuffer: true, ...(canvas ? { canvas } : {}) }) : undefined;
    // The card lasts whole frames (2.002 s at 29.97): sidecar times shift by exactly that.
    const cardS = job.titleCardS ? titleCardFrames({ seconds: job.titleCardS } as TitleCard, ctx.fps) / ctx.fps : 0;
    try {
      for (let i = 0; i < plans.length; i++) {
        const p = plans[i];
        const n = names.clip[i];
        if (outputs.includes(n.mp4)) {
          resumed = true;
          doneS += p.durationS;
          carriedS += p.durationS;
          continue; // finished before a restart
        }
        const overlay = ctx.overlay && renderer ? { data: ctx.overlay, settings: ctx.settings, renderer, ...(ctx.eventFit ? { eventFit: ctx.eventFit } : {}) } : undefined;
        const titleCard: TitleCard | undefined = job.titleCardS ? titleCardFor(p, { reelTitle: reel.title, count: plans.length, seconds: job.titleCardS }) : undefined;
        const onProgress = (f: number) => {
          const frac = total > 0 ? (doneS + f * p.durationS) / total : 0;
          const thisRun = total > 0 ? (doneS - carriedS + f * p.durationS) / total : 0;
          const spent = (performance.now() - t0) / 1000;
          hooks.onProgress?.(id, frac, thisRun > 0.02 ? (spent / thisRun) * (1 - frac) : undefined, n.mp4);
        };
        if (native) {
          await exportClipNativeFromRenderer(host, {
            fileId: ctx.footageFileId,
            plan: p,
            pts: ctx.inputs.probe.pts,
            fps: ctx.fps,
            ...(overlay ? { overlay } : {}),
            ...ctx.size,
            ...(canvas ? { canvas } : {}),
            ...(titleCard ? { titleCard } : {}),
            directory: job.directory,
            name: n.mp4,
            overwrite: !!job.overwrite,
            ...(signal ? { signal } : {}),
            onProgress,
            onSession: (nativeSession) => void set({ nativeSession }),
          });
          await set({ nativeSession: undefined });
        } else {
          const bytes = await exportClipEmbedded({
            source: ctx.footageUrl,
            plan: p,
            pts: ctx.inputs.probe.pts,
            ...(overlay ? { overlay } : {}),
            ...ctx.size,
            ...(titleCard ? { titleCard } : {}),
            ...(signal ? { signal } : {}),
            onProgress,
          });
          if (signal?.aborted) throw new ExportCancelled();
          await host.saveFile({ suggestedName: n.mp4, directory: job.directory, bytes, overwrite: !!job.overwrite });
          encoded.push(bytes);
        }
        await host.saveFile({ suggestedName: n.vtt, directory: job.directory, bytes: new TextEncoder().encode(sidecarVtt([{ ...p }], { titleCardS: cardS })), overwrite: !!job.overwrite });
        outputs.push(n.mp4, n.vtt);
        doneS += p.durationS;
        await set({ outputs: [...outputs], progress: total > 0 ? doneS / total : 1 });
      }
    } finally {
      renderer?.destroy();
    }
    // The whole reel as one file (clips joined without a second encode), when every clip
    // was encoded in this run; after a resume the earlier clips' bytes are gone.
    let reelNote = '';
    if (plans.length > 1 && !outputs.includes(names.reel.mp4)) {
      if (resumed) reelNote = '; the whole-reel file was left out after the resume (export again for it)';
      else {
        try {
          const reelBytes = await joinClips(native ? await readBack(host, job.directory, names.clip.map((c) => c.mp4)) : encoded);
          await host.saveFile({ suggestedName: names.reel.mp4, directory: job.directory, bytes: reelBytes, overwrite: !!job.overwrite });
          await host.saveFile({ suggestedName: names.reel.vtt, directory: job.directory, bytes: new TextEncoder().encode(sidecarVtt(plans, { titleCardS: cardS })), overwrite: !!job.overwrite });
          outputs.push(names.reel.mp4, names.reel.vtt);
        } catch (e) {
          reelNote = `; no whole-reel file: ${(e as Error).message}`;
        }
      }
    }
    const side = reelSidecars(reel.title, plans, { titleCardS: cardS, footageFile: ctx.footageName });
    for (const [name, text] of [
      [names.csv, side.csv],
      [names.json, side.json],
    ] as const) {
      if (outputs.includes(name)) continue;
      await host.saveFile({ suggestedName: name, directory: job.directory, bytes: new TextEncoder().encode(text), overwrite: !!job.overwrite });
      outputs.push(name);
    }
    await set({ state: 'done', progress: 1, outputs: [...outputs], message: `${plans.length === 1 ? '1 clip' : `${plans.length} clips`} written to ${job.directory} (${native ? 'ffmpeg on this machine' : 'built-in encoder'}${cardS ? ', title cards' : ''})${reelNote}` });
  } catch (e) {
    const cancelled = e instanceof ExportCancelled || signal?.aborted;
    await set({ state: cancelled ? 'cancelled' : 'failed', outputs, message: cancelled ? 'cancelled; the clip being encoded was not written' : (e as Error).message });
  }
}

/** The clip files the host's ffmpeg wrote, read back for the whole-reel join. */
async function readBack(host: HostApi, directory: string, names: string[]): Promise<Uint8Array[]> {
  const sep = directory.includes('\\') && !directory.includes('/') ? '\\' : '/';
  const files = await host.openPaths(names.map((n) => `${directory.replace(/[\\/]+$/, '')}${sep}${n}`));
  return Promise.all(files.map(async (f) => new Uint8Array(await (await fetchFile(f)).arrayBuffer())));
}
