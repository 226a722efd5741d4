// Browser side of tests/host/export-embedded.test.ts and bench/export.bench.ts: the renderer's
// own export and overlay code and the engine importer, bundled by esbuild.
import { drawCaption, exportClipEmbedded, layerSelection } from '../../renderer/src/export-clips/embedded.ts';
import { joinClips } from '../../renderer/src/export-clips/concat.ts';
import { createOverlayRenderer } from '../../renderer/src/overlay/renderer.ts';
import { buildOverlayScene } from '../../renderer/src/overlay/scene.ts';
import { defaultSettings } from '../../renderer/src/overlay/style.ts';
import type { OverlayData } from '../../renderer/src/overlay/contract.ts';
import { detectSource, importTracking, textChunks } from '../../engine/import/index.ts';
import type { TrackingData } from '../../shared-types/index.ts';
import type { TrackingMapping } from '../../shared-types/import.ts';

let cached: Promise<TrackingData> | undefined;
function loadTracking(url: string): Promise<TrackingData> {
  cached ??= (async () => {
    const text = await (await fetch(url)).text();
    const d = detectSource('tracking.csv', text.slice(0, 65536));
    const r = await importTracking(textChunks(text), { fileName: 'tracking.csv', mapping: d.mapping as TrackingMapping });
    if (!r.data) throw new Error('tracking import failed: ' + JSON.stringify(r.problems.slice(0, 3)));
    return r.data;
  })();
  return cached;
}

/** Overlay data from the tracking file plus fit/registration given by the caller. */
async function overlayData(o: Pick<OverlayData, 'fit' | 'registration' | 'footage'>): Promise<OverlayData> {
  const t = await loadTracking('/tracking.csv');
  return { pitch: t.pitch, rate: t.rate, objects: t.objects, ballIndex: t.ballIndex, periods: t.periods, fit: o.fit, registration: o.registration, nonLive: [], footage: o.footage } as OverlayData;
}

/**
 * The native path's renderer half: overlay + caption frames as RGBA, POSTed one by one to
 * `post` (what the app would stream to its host). Returns the milliseconds spent drawing.
 */
async function streamOverlayFrames(a: { o: Pick<OverlayData, 'fit' | 'registration' | 'footage'>; pts: number[]; inFrame: number; frames: number; width: number; height: number; layers: string[]; post: string }) {
  const data = await overlayData(a.o);
  const r = await createOverlayRenderer({ width: a.width, height: a.height, preserveDrawingBuffer: true });
  const canvas = new OffscreenCanvas(a.width, a.height);
  const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
  const settings = { ...defaultSettings(), layers: layerSelection(a.layers) };
  let drawMs = 0;
  let inflight: Promise<unknown> = Promise.resolve();
  for (let k = 0; k < a.frames; k++) {
    const t0 = performance.now();
    const index = a.inFrame + k;
    r.draw(buildOverlayScene(data, { index, t: a.pts[index] }, settings, { width: a.width, height: a.height }));
    ctx.clearRect(0, 0, a.width, a.height);
    ctx.drawImage(r.canvas, 0, 0);
    drawCaption(ctx, a.width, a.height, 'clock', k < 50 ? 'Title' : undefined);
    const px = ctx.getImageData(0, 0, a.width, a.height).data;
    drawMs += performance.now() - t0;
    await inflight;
    inflight = fetch(a.post, { method: 'POST', body: px });
  }
  await inflight;
  await fetch(a.post + '?end=1', { method: 'POST', body: new Uint8Array(0) });
  r.destroy();
  return drawMs;
}

(window as unknown as Record<string, unknown>).wm = { joinClips, exportClipEmbedded, createOverlayRenderer, defaultSettings, loadTracking, overlayData, streamOverlayFrames };
