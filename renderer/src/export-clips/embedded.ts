/**
 * The embedded export path (nothing installed): one clip of the footage to an H.264 MP4 in
 * the renderer with WebCodecs, muxed by mediabunny. Every frame is decoded and re-encoded
 * (never cut on a keyframe): the file starts on the plan's in-frame and ends before its
 * out-frame. The overlay is drawn by the Watch screen's own renderer (overlay/renderer.ts +
 * buildOverlayScene) for each source frame's index and time, then laid over the picture
 * with the caption (match clock) and, for the first seconds, the clip's title.
 *
 * With a title card the file opens on the card (opaque, silent) and the clip follows it
 * unchanged; the card's frames and silence go through the same Conversion (lead-in.ts), so
 * there is still one encode and one decoder configuration, and the lower-third title is
 * left out (the card already says it).
 *
 * Why mediabunny + WebCodecs and not the ffmpeg.wasm core: the overlay is a canvas here
 * already, and handing it to WebCodecs costs a copy, while ffmpeg.wasm would need every
 * overlay frame as PNG/raw in its virtual file system (see bench/export.bench.ts).
 *
 *   const bytes = await exportClipEmbedded({ url, plan, overlay, width: 1280, height: 720, signal, onProgress });
 */
import { ALL_FORMATS, BlobSource, BufferTarget, Conversion, Input, Mp4OutputFormat, Output, UrlSource, type AudioSample, type VideoSample } from 'mediabunny';
import { frameAtOrBefore } from '../../../engine/timecode/index.ts';
import type { OverlayData, OverlayRenderer, OverlaySettings } from '../overlay/contract.ts';
import type { ClipPlan } from './plan.ts';
import type { ClockFit } from '../../../shared-types/index.ts';
import { overlayPainter } from './frame-overlay.ts';
import { titleCardFrames, type TitleCard } from './title-card.ts';
import { frameStepAt, leadIn, type LeadIn } from './lead-in.ts';

export interface OverlayInput {
  data: OverlayData;
  settings: OverlaySettings;
  renderer: OverlayRenderer;
  /** Event log -> tracking fit, for the match clock caption. */
  eventFit?: ClockFit;
}

/** What either export path needs to draw and report one clip. */
export interface ClipExportBase {
  plan: ClipPlan;
  /** Footage PTS table (the probe's), to find each frame's index. */
  pts: ArrayLike<number>;
  overlay?: OverlayInput;
  width: number;
  height: number;
  /** Draw the match clock caption (bottom left). Default true. */
  caption?: boolean;
  /** Seconds the clip title stays on screen at the start (0: none). Default 2. Ignored with a card. */
  titleS?: number;
  /** A title card ahead of the clip (title-card.ts): titleCardFrames(card, fps) frames, silent. */
  titleCard?: TitleCard;
  signal?: AbortSignal;
  /** fraction 0..1 and seconds left (estimated from the speed so far). */
  onProgress?: (fraction: number, secondsLeft: number | undefined) => void;
}

export interface EmbeddedClipRequest extends ClipExportBase {
  /** URL of the footage (the host serves opened files, byte ranges included) or its bytes. */
  source: string | Blob;
}

export class ExportCancelled extends Error {
  constructor() {
    super('export cancelled; nothing was written');
  }
}

export { drawCaption, layerSelection } from './frame-overlay.ts';

export async function exportClipEmbedded(req: EmbeddedClipRequest): Promise<Uint8Array> {
  const { plan, width, height } = req;
  if (req.signal?.aborted) throw new ExportCancelled();
  const input = new Input({ source: typeof req.source === 'string' ? new UrlSource(req.source) : new BlobSource(req.source), formats: ALL_FORMATS });
  const target = new BufferTarget();
  const output = new Output({ format: new Mp4OutputFormat({ fastStart: 'in-memory' }), target });
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext('2d')!;
  const ov = req.overlay;
  const titleS = req.titleS ?? 2;
  const caption = req.caption ?? true;
  const start = plan.footage.inT;
  const end = plan.footage.outT;
  // Half of the last frame's length: the trim ends inside the out-frame's predecessor, never on it.
  const lastStep = plan.footage.outFrame > 0 && plan.footage.outFrame < req.pts.length ? req.pts[plan.footage.outFrame] - req.pts[plan.footage.outFrame - 1] : 1 / 25;
  const half = 0.5 * (lastStep > 0 ? lastStep : 1 / 25);

  const paint = overlayPainter(plan, ov, { width, height, caption, titleS: req.titleCard ? 0 : titleS });
  const process = (sample: VideoSample) => {
    // Output timestamps start at the trim start; the source frame is found in the PTS table.
    const srcT = start + sample.timestamp;
    const index = Math.max(0, frameAtOrBefore(req.pts, srcT + 1e-4));
    sample.draw(ctx, 0, 0, width, height);
    paint(ctx, index, req.pts[index] ?? srcT, sample.timestamp);
    return canvas;
  };

  // Without a card the hooks are exactly today's (no audio hook: AAC may be copied as is).
  // With one, each Conversion gets its own lead-in, since a second one starts over.
  const step = frameStepAt(req.pts, plan.footage.inFrame);
  const cardFrames = titleCardFrames(req.titleCard, 1 / step);
  const hooks = () => {
    if (!req.titleCard || !cardFrames) return { video: process, audio: undefined };
    const lead: LeadIn = leadIn(req.titleCard, cardFrames, step, width, height);
    return { video: (s: VideoSample) => lead.video(process(s), s), audio: (s: AudioSample) => lead.audio(s) };
  };
  const first = hooks();
  const conversion = await Conversion.init({
    input,
    output,
    trim: { start, end: end - half },
    video: { codec: 'avc', forceTranscode: true, process: first.video, processedWidth: width, processedHeight: height, keyFrameInterval: 2 },
    audio: { codec: 'aac', process: first.audio },
    showWarnings: false,
  });
  if (!conversion.isValid) {
    const why = conversion.discardedTracks.map((d) => `${d.track.type} track: ${d.reason}`).join('; ');
    throw new Error(`${plan.title}: this browser cannot export the footage (${why || 'no usable track'})`);
  }
  // AAC cannot be encoded by this browser's WebCodecs: re-init with Opus when the audio was dropped.
  let conv = conversion;
  if (conversion.discardedTracks.some((d) => d.track.type === 'audio')) {
    const output2 = new Output({ format: new Mp4OutputFormat({ fastStart: 'in-memory' }), target: new BufferTarget() });
    const again = hooks();
    conv = await Conversion.init({
      input,
      output: output2,
      trim: { start, end: end - half },
      video: { codec: 'avc', forceTranscode: true, process: again.video, processedWidth: width, processedHeight: height, keyFrameInterval: 2 },
      audio: { codec: 'opus', forceTranscode: true, process: again.audio },
      showWarnings: false,
    });
  }
  const t0 = performance.now();
  conv.onProgress = (p) => {
    const spent = (performance.now() - t0) / 1000;
    req.onProgress?.(p, p > 0.02 ? (spent / p) * (1 - p) : undefined);
  };
  const onAbort = () => void conv.cancel();
  req.signal?.addEventListener('abort', onAbort);
  try {
    await conv.execute();
  } catch (e) {
    if (req.signal?.aborted) throw new ExportCancelled();
    throw e;
  } finally {
    req.signal?.removeEventListener('abort', onAbort);
    input.dispose?.();
  }
  if (req.signal?.aborted) throw new ExportCancelled();
  const buf = (conv.output.target as BufferTarget).buffer;
  if (!buf) throw new Error(`${plan.title}: the encoder produced no file`);
  return new Uint8Array(buf);
}
