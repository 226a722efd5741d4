// Browser side of tests/host/export-embedded.test.ts and bench/export.bench.ts: the renderer's
// own export and overlay code and the engine importer, bundled by esbuild.
import { exportClipEmbedded } from '../../renderer/src/export-clips/embedded.ts';
import { createOverlayRenderer } from '../../renderer/src/overlay/renderer.ts';
import { defaultSettings } from '../../renderer/src/overlay/style.ts';
import { detectSource, importTracking, textChunks } from '../../engine/import/index.ts';
import type { TrackingMapping } from '../../shared-types/import.ts';

async function loadTracking(url: string) {
  const text = await (await fetch(url)).text();
  const d = detectSource('tracking.csv', text.slice(0, 65536));
  const r = await importTracking(textChunks(text), { fileName: 'tracking.csv', mapping: d.mapping as TrackingMapping });
  if (!r.data) throw new Error('tracking import failed: ' + JSON.stringify(r.problems.slice(0, 3)));
  return r.data;
}

(window as unknown as Record<string, unknown>).wm = { exportClipEmbedded, createOverlayRenderer, defaultSettings, loadTracking };
