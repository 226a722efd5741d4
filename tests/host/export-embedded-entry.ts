// Browser side of tests/host/export-embedded.test.ts and bench/export.bench.ts: the renderer's
// own export and overlay code and the engine importer, bundled by esbuild.
import { exportClipEmbedded } from '../../renderer/src/export-clips/embedded.ts';
import { joinClips } from '../../renderer/src/export-clips/concat.ts';
import { createOverlayRenderer } from '../../renderer/src/overlay/renderer.ts';
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

(window as unknown as Record<string, unknown>).wm = { joinClips, exportClipEmbedded, createOverlayRenderer, defaultSettings, loadTracking, overlayData };
