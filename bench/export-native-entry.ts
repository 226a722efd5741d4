// Browser side of the native export rows of bench/export.bench.ts: the renderer's own native
// export code (export-clips/native.ts) with the overlay renderer, talking to the bench's host
// over the app's HTTP host client. Reads its job from /job.json, posts figures to /result.
import { createHttpHost } from '../renderer/src/host/http-host.ts';
import { exportClipNativeFromRenderer, nativeOverlayCanvas } from '../renderer/src/export-clips/native.ts';
import { createOverlayRenderer } from '../renderer/src/overlay/renderer.ts';
import { defaultSettings } from '../renderer/src/overlay/style.ts';
import { titleCardFor } from '../renderer/src/export-clips/title-card.ts';
import { detectSource, importTracking, textChunks } from '../engine/import/index.ts';
import type { ClipPlan } from '../renderer/src/export-clips/plan.ts';
import type { OverlayData } from '../renderer/src/overlay/contract.ts';
import type { TrackingMapping } from '../shared-types/import.ts';

interface Job {
  o: Pick<OverlayData, 'fit' | 'registration' | 'footage'>;
  plan: ClipPlan;
  pts: number[];
  sizes: { name: string; width: number; height: number }[];
  card: boolean;
}

async function main() {
  const job = (await (await fetch('/job.json')).json()) as Job;
  const text = await (await fetch('/tracking.csv')).text();
  const d = detectSource('tracking.csv', text.slice(0, 65536));
  const t = (await importTracking(textChunks(text), { fileName: 'tracking.csv', mapping: d.mapping as TrackingMapping })).data!;
  const data = { pitch: t.pitch, rate: t.rate, objects: t.objects, ballIndex: t.ballIndex, periods: t.periods, fit: job.o.fit, registration: job.o.registration, nonLive: [], footage: job.o.footage } as OverlayData;
  const host = createHttpHost({ token: 'bench' });
  const results: Record<string, number | string> = {};
  for (const size of job.sizes) {
    const canvas = nativeOverlayCanvas(size.width, size.height);
    const renderer = await createOverlayRenderer({ width: size.width, height: size.height, canvas, preserveDrawingBuffer: true });
    const stats = { paintMs: 0, readMs: 0, encodeMs: 0, waitMs: 0, frames: 0, bytes: 0 };
    const t0 = performance.now();
    await exportClipNativeFromRenderer(host, {
      stats,
      fileId: 'footage', plan: job.plan, pts: job.pts, fps: 25, width: size.width, height: size.height, canvas,
      overlay: { data, settings: defaultSettings(), renderer },
      ...(job.card ? { titleCard: titleCardFor(job.plan, { reelTitle: 'Bench', count: 1 }) } : {}),
      directory: '.', name: `native-${size.name}.mp4`, overwrite: true,
    });
    results[size.name] = (performance.now() - t0) / 1000;
    results[`${size.name} backend`] = renderer.backend;
    const per = (ms: number) => (ms / Math.max(1, stats.frames)).toFixed(1);
    results[`${size.name} stages`] = `per frame: paint ${per(stats.paintMs)} ms, read back ${per(stats.readMs)}, runs ${per(stats.encodeMs)}, waiting for the host ${per(stats.waitMs)}; ${(stats.bytes / stats.frames / 1e6).toFixed(2)} MB/frame`;
    renderer.destroy();
  }
  await fetch('/result', { method: 'POST', body: JSON.stringify(results) });
}
main().catch((e) => fetch('/result', { method: 'POST', body: JSON.stringify({ error: String(e?.stack ?? e) }) }));
