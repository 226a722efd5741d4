/**
 * Clip export speed (prints figures, never fails): 10 s of the demo footage round the
 * corner, every overlay layer on, at 1280×720 and 1920×1080, in one run:
 *
 * - embedded: renderer/src/export-clips/embedded.ts in Debian Chromium (WebCodecs H.264
 *   decode + encode, mediabunny muxing, overlay by the Watch renderer, caption and title);
 * - native: the renderer draws the same overlay frames (export-clips/native.ts), keeps the
 *   runs of visible pixels and hands them in batches to the app's NativeSessions; the host's
 *   ffmpeg decodes, the host blends the runs into each I420 picture, a second ffmpeg encodes
 *   (electron/host/export/native-export.ts). The page runs in a Chromium not driven over the
 *   DevTools protocol, as the app's window is (bench/native-export-runner.ts);
 * - plain: the same native ffmpeg re-encoding the same span at the same size, no overlay —
 *   the practical limit on this machine;
 * - ffmpeg.wasm: the single-thread core (@ffmpeg/core 0.12.10) in Node re-encoding the same
 *   span with no overlay (ultrafast) — an upper bound for the wasm path, which would still
 *   have to take every overlay frame into its virtual file system.
 *
 * Goals (issue 8): embedded ≥ 2× realtime at 720p; native ≥ 0.7× plain ffmpeg.
 * Run: npx tsx bench/export.bench.ts   (WM_BENCH_SPAN_S=4 for a shorter span)
 *
 * Measured 2026-12-02 (second session), 10 s span, quiet machine (load average about 2):
 *   720p  embedded 1.31× realtime · native 0.62× · plain ffmpeg 2.86× · ffmpeg.wasm plain 0.80×
 *   1080p embedded 0.89× · native 0.32× · plain ffmpeg 1.48×
 * An earlier 4 s run measured embedded 2.47× at 720p; figures swing with the span and load.
 * Neither goal is met here. The native path's host half alone (the "host half only" row, a
 * ready overlay of 8–9% of the pixels) ran at 0.52× plain at 720p and 0.70× at 1080p in a 4 s
 * run (0.96× in a one-off 100-frame script), so the host side costs too, but the larger limit
 * is the renderer: drawing every layer and reading the canvas back (getImageData) cost 40–50 ms a
 * frame at 720p while ffmpeg's threads take both cores, against 15–20 ms alone. So the app
 * keeps the built-in encoder as the default and offers ffmpeg as a choice. The first run
 * also found the length-and-width layer drawing thousands of off-screen dashes (21 ms of a
 * 30 ms frame); dashes are now clipped to the picture.
 */
import { readFileSync, mkdtempSync, rmSync, mkdirSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { cpus, loadavg, tmpdir } from 'node:os';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { build } from 'esbuild';
import { launchLocalChromium } from '../build/local-chromium.ts';
import { probeFootageFile } from '../electron/host/footage/probe.ts';
import { exportClipNative } from '../electron/host/export/native-export.ts';
import { runNativeInPlainChromium } from './native-export-runner.ts';
import { decodeRuns, encodeRuns } from '../engine/overlay-frames/index.ts';
import { LAYER_IDS } from '../renderer/src/overlay/contract.ts';
import { truth, truthEventFit, truthFootageFit, truthRegistration, trueToFootage } from '../tests/demo-truth-rows.ts';

const ROOT = new URL('../', import.meta.url).pathname;
const DEMO = join(ROOT, 'fixtures/demo');
const SPAN_S = Number(process.env.WM_BENCH_SPAN_S ?? 10);
const SIZES = [
  { name: '720p', width: 1280, height: 720 },
  { name: '1080p', width: 1920, height: 1080 },
];

/** A fixed overlay covering about an eighth of the picture (discs, lines, a translucent block). */
function syntheticOverlay(w: number, h: number): Uint32Array {
  const f = new Uint8Array(w * h * 4);
  for (let d = 0; d < 40; d++) {
    const cx = Math.round(w * (0.05 + ((d * 0.131) % 0.9)));
    const cy = Math.round(h * (0.08 + ((d * 0.097) % 0.84)));
    for (let y = -12; y <= 12; y++) for (let x = -12; x <= 12; x++) if (x * x + y * y <= 144) f.set([220, 30, 30, 255], ((cy + y) * w + cx + x) * 4);
  }
  for (let y = Math.round(h * 0.3); y < Math.round(h * 0.55); y++) for (let x = Math.round(w * 0.3); x < Math.round(w * 0.55); x++) f.set([30, 120, 255, 60], (y * w + x) * 4);
  for (let l = 0; l < 6; l++) for (let y = 0; y < h; y++) for (let k = 0; k < 3; k++) f.set([255, 255, 0, 200], (y * w + Math.round(w * (0.08 + l * 0.15)) + (y >> 3) + k) * 4);
  return encodeRuns(f, w, h);
}

async function* repeat(frame: Uint32Array, n: number) {
  for (let i = 0; i < n; i++) yield frame;
}

async function ffmpegWasmPlain(file: string, inT: number, width: number, height: number): Promise<number> {
  const require = createRequire(import.meta.url);
  const folder = join(dirname(require.resolve('@ffmpeg/core')), '..', 'esm');
  const g = globalThis as Record<string, unknown>;
  g.self ??= { location: { href: pathToFileURL(folder + '/').href } };
  const { default: createCore } = await import(pathToFileURL(join(folder, 'ffmpeg-core.js')).href);
  const core = await createCore({ wasmBinary: readFileSync(join(folder, 'ffmpeg-core.wasm')) });
  core.FS.writeFile('/in.mp4', readFileSync(file));
  const t0 = performance.now();
  core.exec('-v', 'error', '-ss', inT.toFixed(3), '-i', '/in.mp4', '-t', String(SPAN_S), '-vf', `scale=${width}:${height}`, '-c:v', 'libx264', '-preset', 'ultrafast', '-c:a', 'aac', '/out.mp4');
  return (performance.now() - t0) / 1000;
}

async function main() {
  console.log(`export bench: ${SPAN_S} s span, ${cpus().length} cores, load average ${loadavg().map((l) => l.toFixed(1)).join(' ')}`);
  const scratch = mkdtempSync(join(tmpdir(), 'wm-export-bench-'));
  const site = join(scratch, 'site');
  mkdirSync(site);
  await build({ entryPoints: [join(ROOT, 'tests/host/export-embedded-entry.ts')], bundle: true, format: 'esm', outfile: join(site, 'entry.js'), logLevel: 'error' });
  writeFileSync(join(site, 'index.html'), '<!doctype html><meta charset="utf-8"><script type="module" src="entry.js"></script>');
  const media: Record<string, Buffer> = { '/demo.mp4': readFileSync(join(DEMO, 'footage.mp4')), '/tracking.csv': readFileSync(join(DEMO, 'tracking.csv')) };
  const server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://x');
    const body = media[url.pathname] ?? (url.pathname === '/' ? readFileSync(join(site, 'index.html')) : url.pathname === '/entry.js' ? readFileSync(join(site, 'entry.js')) : undefined);
    if (!body) return res.writeHead(404).end();
    res.writeHead(200, { 'content-type': url.pathname.endsWith('.js') ? 'text/javascript' : url.pathname.endsWith('.mp4') ? 'video/mp4' : 'text/html' }).end(body);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const browser = await launchLocalChromium(join(scratch, 'home'));
  const page = await browser.newPage();
  await page.goto(base + '/');
  await page.waitForFunction(() => (window as unknown as { wm?: unknown }).wm);

  const probe = await probeFootageFile(join(DEMO, 'footage.mp4'));
  const corner = truth.restarts.find((r) => r.kind === 'corner')!;
  const inT0 = trueToFootage(corner.playedT) - 3;
  const inFrame = probe.pts.findIndex((t) => t >= inT0);
  const frames = SPAN_S * 25;
  const fit = truthFootageFit();
  const o = { fit, registration: truthRegistration(inFrame - 2, inFrame + frames + 2), footage: { width: probe.width, height: probe.height } };
  const layers = [...LAYER_IDS];
  const plan = { title: 'Corner', layers, footage: { inFrame, outFrame: inFrame + frames, inT: probe.pts[inFrame], outT: probe.pts[inFrame + frames] } };
  await page.evaluate(() => (window as any).wm.loadTracking('/tracking.csv'));
  const nativeSeconds = await runNativeInPlainChromium(scratch, { o, plan: { ...plan, index: 0, period: 1, matchClock: { in: '', out: '' }, note: '' }, pts: probe.pts, sizes: SIZES, card: false });

  const rows: string[][] = [];
  const header = ['size', 'path', 'seconds', '× realtime', 'note'];
  const widths = [6, 46, 8, 11, 0];
  const show = (r: string[]) => console.log(r.map((v, c) => v.padEnd(widths[c])).join('  '));
  show(header);
  const push = rows.push.bind(rows);
  rows.push = (...r: string[][]) => (r.forEach(show), push(...r));
  for (const size of SIZES) {
    // Embedded (whole path in the renderer).
    const emb = await page.evaluate(
      async ({ o, plan, pts, size, eventFit }) => {
        const wm = (window as any).wm;
        const data = await wm.overlayData(o);
        const renderer = await wm.createOverlayRenderer({ width: size.width, height: size.height, preserveDrawingBuffer: true });
        const t0 = performance.now();
        const bytes = await wm.exportClipEmbedded({ source: '/demo.mp4', plan, pts, overlay: { data, settings: wm.defaultSettings(), renderer, eventFit }, width: size.width, height: size.height });
        const s = (performance.now() - t0) / 1000;
        renderer.destroy();
        return { s, bytes: bytes.length, backend: renderer.backend };
      },
      { o, plan, pts: probe.pts, size, eventFit: truthEventFit() },
    );
    rows.push([size.name, 'embedded (WebCodecs + mediabunny)', emb.s.toFixed(2), (SPAN_S / emb.s).toFixed(2), `${(emb.bytes / 1e6).toFixed(1)} MB, overlay ${emb.backend}`]);

    const native = nativeSeconds[size.name];
    rows.push([size.name, 'native (renderer overlay runs -> ffmpeg pipe)', native.toFixed(2), (SPAN_S / native).toFixed(2), `overlay ${nativeSeconds[size.name + ' backend']}; ${nativeSeconds[size.name + ' stages']}`]);
    const t1 = performance.now();
    await exportClipNative({ input: join(DEMO, 'footage.mp4'), inT: probe.pts[inFrame], frames, fps: 25, width: size.width, height: size.height, directory: scratch, name: `plain-${size.name}.mp4`, overwrite: true });
    const plain = (performance.now() - t1) / 1000;
    rows.push([size.name, 'plain native ffmpeg, no overlay', plain.toFixed(2), (SPAN_S / plain).toFixed(2), `native / plain speed = ${(plain / native).toFixed(2)} (goal ≥ 0.7)`]);
    // The host half alone: the same two-ffmpeg pipeline fed a ready-made overlay (no renderer).
    const synthetic = syntheticOverlay(size.width, size.height);
    const t2 = performance.now();
    await exportClipNative({ input: join(DEMO, 'footage.mp4'), inT: probe.pts[inFrame], frames, fps: 25, width: size.width, height: size.height, overlay: repeat(synthetic, frames), directory: scratch, name: `host-${size.name}.mp4`, overwrite: true });
    const hostOnly = (performance.now() - t2) / 1000;
    rows.push([size.name, 'native host half only (ready overlay runs)', hostOnly.toFixed(2), (SPAN_S / hostOnly).toFixed(2), `${((decodeRuns(synthetic).pixels.length / (size.width * size.height)) * 100).toFixed(0)}% of pixels covered; / plain = ${(plain / hostOnly).toFixed(2)}`]);
    if (size.name === '720p') {
      rows.push([size.name, 'embedded vs goal', '', (SPAN_S / emb.s).toFixed(2), `goal ≥ 2× realtime: ${SPAN_S / emb.s >= 2 ? 'met' : 'not met'}`]);
      try {
        const w = await ffmpegWasmPlain(join(DEMO, 'footage.mp4'), probe.pts[inFrame], size.width, size.height);
        rows.push([size.name, 'ffmpeg.wasm single-thread, no overlay', w.toFixed(2), (SPAN_S / w).toFixed(2), `embedded WebCodecs path / wasm speed = ${(w / emb.s).toFixed(2)}`]);
      } catch (e) {
        rows.push([size.name, 'ffmpeg.wasm single-thread', '', '', `did not run: ${(e as Error).message}`]);
      }
    }
  }
  await browser.close();
  server.close();
  rmSync(scratch, { recursive: true, force: true });
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
