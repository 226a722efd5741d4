/**
 * Overlay draw time per frame with every layer on at 1080p in Debian Chromium (software
 * WebGL on SwiftShader here: no GPU), median and p95, beside the same shapes drawn with
 * Canvas 2D in the same run; then the demo footage played with the full overlay drawn on
 * every presented frame (does playback keep 25 fps?). Prints figures; never fails on timing.
 * Goal (issue 7): <= 4 ms p95 per frame.
 *
 * Run: npx tsx bench/overlay.bench.ts
 *
 * Measured 2026-12-02 on this 2-core machine, shared and loaded, SwiftShader (no GPU):
 * with dots, ball and trails only (before the geometry layers): pixi WebGL median 11.3 ms,
 * p95 19.6 ms; Canvas 2D reference 1.1 / 5.6 ms; playback 245 of 251 frames.
 * With every layer (offside/back/team lines, shape, length & width, Voronoi space added):
 * pixi WebGL median 442 ms, p95 744 ms (!); pixi canvas renderer 13.8 / 42 ms; Canvas 2D
 * reference 1.3 / 8.3 ms; playback 26 of 257 frames. The goal (p95 <= 4 ms) is not met; the
 * WebGL figure comes from the two filled-polygon layers: one layer at a time (20 frames,
 * median ms): hull 123, space 132, trails 13, extent 9.4, dots 5.5, team lines 3.9,
 * offside 3.8, distance 2.8, back line 1.4 — translucent fills over large parts of a 1080p
 * frame, which software GL pays for per pixel. First thing to try: draw those fills at a
 * lower resolution or through the canvas renderer on machines without a GPU.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'vite';
import { launchLocalChromium, serveFolder } from '../build/local-chromium.ts';
import type * as Entry from './overlay-entry.ts';

const FRAMES = Number(process.env.WM_BENCH_FRAMES ?? 300);

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'wm-overlay-bench-'));
  try {
    await build({
      configFile: false,
      logLevel: 'warn',
      build: { outDir: dir, emptyOutDir: false, minify: false, lib: { entry: new URL('./overlay-entry.ts', import.meta.url).pathname, formats: ['es'], fileName: () => 'bench.js' } },
    });
    writeFileSync(join(dir, 'index.html'), '<!doctype html><meta charset="utf-8"><body style="margin:0;background:#000"><script type="module">import * as wm from "./bench.js"; window.wm = wm;</script>');
    const footage = readFileSync(new URL('../fixtures/demo/footage.mp4', import.meta.url));
    const served = await serveFolder(dir, { routes: { '/footage.mp4': { type: 'video/mp4', body: footage } } });
    const browser = await launchLocalChromium(join(dir, 'home'));
    try {
      const page = await browser.newPage({ viewport: { width: 1920, height: 1200 } });
      await page.goto(served.url);
      await page.waitForFunction(() => 'wm' in window);
      type W = { wm: typeof Entry };
      const pixi = await page.evaluate((n) => (window as unknown as W).wm.pixiDraw(n), FRAMES);
      const c2d = await page.evaluate((n) => (window as unknown as W).wm.canvas2dDraw(n), FRAMES);
      const pixiCanvas = await page.evaluate((n) => (window as unknown as W).wm.pixiDraw(n, 'canvas'), FRAMES);
      const pixiAuto = await page.evaluate((n) => (window as unknown as W).wm.pixiDraw(n, 'auto'), FRAMES);
      const f = (x: number) => x.toFixed(2).padStart(7);
      console.log(`overlay draw, every layer on, 1920x1080, ${pixi.n} frames (pixi.js ${pixi.backend}, antialias off, draw + 1-px readback):`);
      console.log(`  pixi overlay     median ${f(pixi.median)} ms  p95 ${f(pixi.p95)} ms   (goal p95 <= 4 ms: ${pixi.p95 <= 4 ? 'met' : 'not met on this machine'})`);
      console.log(`  pixi overlay     median ${f(pixiCanvas.median)} ms  p95 ${f(pixiCanvas.p95)} ms   (pixi.js ${pixiCanvas.backend} renderer, same layer code)`);
      console.log(`  pixi overlay     median ${f(pixiAuto.median)} ms  p95 ${f(pixiAuto.p95)} ms   (the app's own choice here: ${pixiAuto.backend} — canvas when WebGL is a software rasteriser)`);
      console.log(`  Canvas 2D ref.   median ${f(c2d.median)} ms  p95 ${f(c2d.p95)} ms   (same markers, numbers, trails, lines, polygons)`);
      console.log(`  ratio pixi / Canvas 2D: median ${(pixi.median / c2d.median).toFixed(2)}x, p95 ${(pixi.p95 / c2d.p95).toFixed(2)}x`);
      const play = await page.evaluate(() => (window as unknown as W).wm.playback('/footage.mp4', 10));
      console.log(`playback of the demo footage (25 fps) for 10 s with the full 1080p overlay drawn on each presented frame:`);
      console.log(`  presented ${play.presented} of ${play.expected} frames (${play.fps.toFixed(1)} fps), dropped by the decoder ${play.dropped}; draw median ${f(play.drawMedian)} ms p95 ${f(play.drawP95)} ms`);
      console.log(`  keeps 25 fps: ${play.presented >= play.expected - 2 ? 'yes' : 'no'}`);
    } finally {
      await browser.close();
      served.server.close();
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
