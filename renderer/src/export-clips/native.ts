/**
 * The renderer's half of the native export path: the host's ffmpeg decodes and encodes the
 * footage (electron/host/export/native-export.ts), and this draws what goes over each
 * picture — the same overlay, caption and title card as the embedded path — reads it back,
 * keeps only the visible runs (engine/overlay-frames/runs.ts) and hands them to the host in
 * batches. Drawing the next batch overlaps the host encoding the last one.
 *
 *   const saved = await exportClipNativeFromRenderer(host, { fileId, plan, pts, fps: 25, overlay, width, height, directory, name });
 */
import type { HostApi, NativeClipProgress, SaveResult } from '../../../shared-types/host-api.ts';
import { encodeRuns, packBatch } from '../../../engine/overlay-frames/index.ts';
import { ExportCancelled, type ClipExportBase } from './embedded.ts';
import { overlayPainter } from './frame-overlay.ts';
import { drawTitleCard, titleCardFrames } from './title-card.ts';

export interface NativeClipRequest extends ClipExportBase {
  fileId: string;
  /** Nominal frame rate of the footage (the encoder's input rate). */
  fps: number;
  directory: string;
  name: string;
  overwrite?: boolean;
  /** The canvas to read back (nativeOverlayCanvas; the overlay renderer may draw straight into it). */
  canvas?: OffscreenCanvas;
  /** Told the host's session id once it exists (kept with the job, to stop it after a restart). */
  onSession?: (sessionId: string) => void;
  /** Filled with milliseconds spent per stage (for the benchmark). */
  stats?: NativeStageStats;
}

export interface NativeStageStats {
  paintMs: number;
  readMs: number;
  encodeMs: number;
  /** Waiting for the host to take a batch (the encoder is the slower side). */
  waitMs: number;
  frames: number;
  bytes: number;
}

/**
 * A canvas whose 2-D context is CPU-backed (willReadFrequently): every frame is read back, which
 * a GPU-backed canvas makes slow. Give it to createOverlayRenderer({ canvas }) too and, with
 * pixi's canvas renderer, the overlay is drawn straight into it — no copy per frame.
 */
export function nativeOverlayCanvas(width: number, height: number): OffscreenCanvas {
  const canvas = new OffscreenCanvas(width, height);
  canvas.getContext('2d', { willReadFrequently: true });
  return canvas;
}

/** Frames per batch and bytes per batch, whichever comes first (fewer, larger transfers). */
const BATCH_FRAMES = 8;
const BATCH_BYTES = 4 << 20;
/** Batches on their way to the host at once. */
const IN_FLIGHT = 2;

export async function exportClipNativeFromRenderer(host: HostApi, req: NativeClipRequest): Promise<SaveResult> {
  const { plan, width, height } = req;
  if (req.signal?.aborted) throw new ExportCancelled();
  const frames = plan.footage.outFrame - plan.footage.inFrame;
  const cardFrames = titleCardFrames(req.titleCard, req.fps);
  const total = cardFrames + frames;
  const canvas = req.canvas ?? nativeOverlayCanvas(width, height);
  const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
  // When the overlay renderer draws into this canvas it clears it itself.
  const ownCanvas = req.overlay?.renderer.canvas === canvas;
  const paint = overlayPainter(plan, req.overlay, { width, height, caption: req.caption ?? true, titleS: req.titleCard ? 0 : (req.titleS ?? 2) });

  const started = await host.nativeClipStart({
    fileId: req.fileId,
    inT: plan.footage.inT,
    frames,
    fps: req.fps,
    width,
    height,
    ...(cardFrames ? { cardFrames } : {}),
    overlay: true,
    directory: req.directory,
    name: req.name,
    ...(req.overwrite ? { overwrite: true } : {}),
  });
  const id = started.sessionId;
  req.onSession?.(id);
  const t0 = performance.now();
  const report = (p: NativeClipProgress) => {
    const f = p.totalFrames > 0 ? p.encodedFrames / p.totalFrames : 0;
    const spent = (performance.now() - t0) / 1000;
    req.onProgress?.(f, f > 0.02 ? (spent / f) * (1 - f) : undefined);
  };
  const inflight: Promise<unknown>[] = [];
  const stats = req.stats;
  let failure: unknown;
  const send = (batch: Uint32Array[]) => {
    const bytes = new Uint8Array(packBatch(batch).buffer);
    const p = host.nativeClipFrames(id, bytes).then(report, (e: unknown) => (failure ??= e));
    inflight.push(p);
  };
  try {
    let batch: Uint32Array[] = [];
    let batchWords = 0;
    for (let k = 0; k < total; k++) {
      if (req.signal?.aborted) throw new ExportCancelled();
      if (failure) throw failure;
      const t1 = performance.now();
      if (k < cardFrames) drawTitleCard(ctx, width, height, req.titleCard!);
      else {
        const index = plan.footage.inFrame + (k - cardFrames);
        const srcT = req.pts[index] ?? plan.footage.inT;
        if (!ownCanvas) ctx.clearRect(0, 0, width, height);
        paint(ctx, index, srcT, srcT - plan.footage.inT);
      }
      const t2 = performance.now();
      const pixels = ctx.getImageData(0, 0, width, height).data;
      const t3 = performance.now();
      const words = encodeRuns(pixels, width, height);
      const t4 = performance.now();
      batch.push(words);
      batchWords += words.length;
      if (stats) {
        stats.paintMs += t2 - t1;
        stats.readMs += t3 - t2;
        stats.encodeMs += t4 - t3;
        stats.frames++;
        stats.bytes += words.length * 4;
      }
      if (batch.length >= BATCH_FRAMES || batchWords * 4 >= BATCH_BYTES || k === total - 1) {
        const t5 = performance.now();
        while (inflight.length >= IN_FLIGHT) await inflight.shift();
        if (stats) stats.waitMs += performance.now() - t5;
        send(batch);
        batch = [];
        batchWords = 0;
      }
    }
    await Promise.all(inflight);
    if (failure) throw failure;
    if (req.signal?.aborted) throw new ExportCancelled();
    const saved = await host.nativeClipFinish(id);
    req.onProgress?.(1, 0);
    return saved;
  } catch (e) {
    await host.nativeClipCancel(id).catch(() => undefined);
    if (req.signal?.aborted) throw new ExportCancelled();
    throw e;
  }
}
