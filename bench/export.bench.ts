/**
 * Clip export speed (prints figures, never fails): 10 s of the demo footage round the
 * corner, every overlay layer on, at 1280×720 and 1920×1080, in one run:
 *
 * - embedded: renderer/src/export-clips/embedded.ts in Debian Chromium (WebCodecs H.264
 *   decode + encode, mediabunny muxing, overlay by the Watch renderer, caption and title);
 * - native: the renderer draws the same overlay frames (RGBA) and POSTs them to a loopback
 *   server (as the app would to its host), which streams them into Debian's ffmpeg
 *   (electron/host/export/native-export.ts: overlay filter, libx264 veryfast);
 * - plain: the same native ffmpeg re-encoding the same span at the same size, no overlay —
 *   the practical limit on this machine;
 * - ffmpeg.wasm: the single-thread core (@ffmpeg/core 0.12.10) in Node re-encoding the same
 *   span with no overlay (ultrafast) — an upper bound for the wasm path, which would still
 *   have to take every overlay frame into its virtual file system.
 *
 * Goals (issue 8): embedded ≥ 2× realtime at 720p; native ≥ 0.7× plain ffmpeg.
 * Run: npx tsx bench/export.bench.ts   (WM_BENCH_SPAN_S=4 for a shorter span)
 *
 * Measured 2026-12-02, 4 s span, 2 cores shared by several sessions (load average 22-23),
 * "every layer" = the layers the overlay renderer draws today (dots, ball, trails, distance):
 *   720p  embedded 0.90× realtime · native 0.03× · plain ffmpeg 0.43× · ffmpeg.wasm plain 0.13×
 *   1080p embedded 0.25× · native 0.01× · plain ffmpeg 0.27×
 * So WebCodecs + mediabunny beat the ffmpeg.wasm core (without even an overlay) about 7× and
 * are the embedded path. Neither goal was met under that load; the native path is dominated
 * by the overlay readback (getImageData of the composited canvas, 175 ms/frame at 720p) and
 * the 3.7 MB-per-frame POSTs, not by ffmpeg.
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
import { LAYER_IDS } from '../renderer/src/overlay/contract.ts';
import { truth, truthEventFit, truthFootageFit, truthRegistration, trueToFootage } from '../tests/demo-truth-rows.ts';

const ROOT = new URL('../', import.meta.url).pathname;
const DEMO = join(ROOT, 'fixtures/demo');
const SPAN_S = Number(process.env.WM_BENCH_SPAN_S ?? 10);
const SIZES = [
  { name: '720p', width: 1280, height: 720 },
  { name: '1080p', width: 1920, height: 1080 },
];

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
  const widths = [6, 44, 8, 11, 0];
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
