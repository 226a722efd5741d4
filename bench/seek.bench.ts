/**
 * Seek-to-frame latency of the footage player at 720p in Debian Chromium (prints figures,
 * never fails). A 1280×720 25 fps H.264 clip (2 s keyframe interval, B-frames) is made on
 * the fly by Debian's ffmpeg; the built renderer's #footage-check page plays it through
 * the browser host, and the player's own control is timed from the page:
 *   - random seeks (seekToFrame to a random frame, resolved when the frame is on screen
 *     and verified against the PTS table),
 *   - sequential steps forward (step(+1)) and backward (step(-1)).
 * Reference in the same run: Debian's ffmpeg doing an accurate seek and decoding one frame
 * (`ffmpeg -ss T -i clip -frames:v 1 -f null -`), timed per call as a process (so it
 * includes process start; its own `-benchmark` figure is printed too).
 * Goal: seek p95 <= 150 ms.
 *
 * Run: npx tsx bench/seek.bench.ts   (builds dist/renderer first when it is missing)
 */
import { rendererBuildState } from '../scripts/renderer-freshness.mjs';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'vite';
import { launchLocalChromium } from '../build/local-chromium.ts';
import { startBrowserHost } from '../electron/serve.ts';

const ROOT = new URL('..', import.meta.url).pathname;
const SECONDS = 120;
const FPS = 25;
const GOAL_P95_MS = 150;

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
};
const fmt = (xs: number[]) => `median ${pct(xs, 0.5).toFixed(1).padStart(6)} ms   p95 ${pct(xs, 0.95).toFixed(1).padStart(6)} ms   (n=${xs.length})`;

/** Seeded choices (LCG constants of Numerical Recipes, from memory). */
function chooser(seed: number) {
  let s = seed >>> 0;
  return (n: number) => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return Math.floor((s / 2 ** 32) * n);
  };
}

interface Timed {
  ms: number[];
  wrong: number;
}
interface PageResult {
  seeks: Timed;
  forward: Timed;
  backward: Timed;
}

/** Runs in the page: times the player's own control (window.footageCheck). */
const PAGE_CODE = `async (random) => {
  const c = globalThis.footageCheck;
  await c.ready;
  const time = async (xs, expect) => {
    const ms = [];
    let wrong = 0;
    for (let k = 0; k < xs.length; k++) {
      const t0 = performance.now();
      const f = await xs[k]();
      ms.push(performance.now() - t0);
      if (f.index !== expect(k) || !f.exact) wrong++;
    }
    return { ms, wrong };
  };
  // Warm-up: the first seeks pay for decoder start.
  for (const i of [10, 2000, 500]) await c.seekToFrame(i);
  const seeks = await time(random.map((i) => () => c.seekToFrame(i)), (k) => random[k]);
  await c.seekToFrame(1000);
  const forward = await time(Array.from({ length: 100 }, () => () => c.step(1)), (k) => 1001 + k);
  await c.seekToFrame(1600);
  const backward = await time(Array.from({ length: 60 }, () => () => c.step(-1)), (k) => 1599 - k);
  return { seeks, forward, backward };
}`;

async function main() {
  const scratch = mkdtempSync(join(tmpdir(), 'wm-seek-bench-'));
  try {
    const clip = join(scratch, 'seek720.mp4');
    console.log(`making a ${SECONDS} s 1280x720 ${FPS} fps H.264 clip with Debian ffmpeg ...`);
    execFileSync('ffmpeg', ['-hide_banner', '-v', 'error', '-y', '-f', 'lavfi', '-i', `testsrc2=size=1280x720:rate=${FPS}:duration=${SECONDS}`, '-c:v', 'libx264', '-preset', 'veryfast', '-crf', '26', '-g', String(2 * FPS), '-bf', '2', '-pix_fmt', 'yuv420p', '-movflags', '+faststart', clip]);
    const rendererDir = join(ROOT, 'dist/renderer');
    if (rendererBuildState(ROOT) !== 'fresh') {
      console.log('building the renderer (dist/renderer) ...');
      await build({ configFile: join(ROOT, 'build/vite.config.ts'), logLevel: 'warn' });
    }
    const host = await startBrowserHost({ rendererDir, openBrowser: false, log: () => {} });
    const browser = await launchLocalChromium(join(scratch, 'home'));
    const frames = SECONDS * FPS;
    const pick = chooser(2026);
    const random = Array.from({ length: 120 }, () => pick(frames));
    try {
      const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
      await page.goto(host.url);
      await page.goto(`${host.origin}/#footage-check?path=${encodeURIComponent(clip)}`);
      await page.reload();
      await page.waitForFunction(() => (globalThis as { footageCheck?: unknown }).footageCheck, undefined, { timeout: 60_000 });
      // Page code as text: tsx (esbuild keepNames) would wrap functions in a helper the page lacks.
      const r = (await page.evaluate(`(${PAGE_CODE})(${JSON.stringify(random)})`)) as PageResult;
      // Reference: Debian's ffmpeg, accurate seek (-ss before -i) + decode one frame.
      const wall: number[] = [];
      const own: number[] = [];
      for (const i of random.slice(0, 40)) {
        const t = (i + 0.5) / FPS;
        const t0 = performance.now();
        const p = spawnSync('ffmpeg', ['-hide_banner', '-benchmark', '-threads', '1', '-ss', t.toFixed(3), '-i', clip, '-frames:v', '1', '-f', 'null', '-'], { encoding: 'utf8' });
        wall.push(performance.now() - t0);
        const m = /bench: utime=([\d.]+)s stime=([\d.]+)s rtime=([\d.]+)s/.exec(p.stderr);
        if (m) own.push(Number(m[3]) * 1000);
      }
      console.log(`\nseek-to-frame at 1280x720, ${FPS} fps H.264 (keyframe every ${2 * FPS} frames), Debian Chromium ${browser.version()}, headless, software decode`);
      console.log(`  player random seek       ${fmt(r.seeks.ms)}   wrong frames: ${r.seeks.wrong}`);
      console.log(`  player step forward      ${fmt(r.forward.ms)}   wrong frames: ${r.forward.wrong}`);
      console.log(`  player step backward     ${fmt(r.backward.ms)}   wrong frames: ${r.backward.wrong}`);
      console.log(`  ffmpeg -ss + 1 frame     ${fmt(wall)}   (whole process, 1 thread)`);
      if (own.length) console.log(`  ffmpeg own rtime         ${fmt(own)}   (-benchmark, inside the process)`);
      const p95 = pct(r.seeks.ms, 0.95);
      console.log(`  ratio random seek / ffmpeg process: median ${(pct(r.seeks.ms, 0.5) / pct(wall, 0.5)).toFixed(2)}x, p95 ${(p95 / pct(wall, 0.95)).toFixed(2)}x`);
      console.log(`  goal: random seek p95 <= ${GOAL_P95_MS} ms -> ${p95 <= GOAL_P95_MS ? 'met' : 'NOT met'} (${p95.toFixed(1)} ms); load average ${execFileSync('cat', ['/proc/loadavg'], { encoding: 'utf8' }).trim()}`);
    } finally {
      await browser.close();
      await host.close();
    }
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

await main();
