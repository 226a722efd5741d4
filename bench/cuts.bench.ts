/**
 * Cut scan benchmark (prints, never fails). A 1280×720 25 fps H.264 recording made on the
 * fly by Debian's ffmpeg (shots of ffmpeg's test sources, 8 s each, in a temp folder
 * deleted after), scanned in the same run by:
 *  1. ffmpeg's own scene detection, native (select='gt(scene,0.3)'): the well-known tool;
 *  2. our scan with native ffmpeg decoding to 64×36 grey (the CLI's default path);
 *  3. our scan with the embedded ffmpeg.wasm core in Node (CLI without ffmpeg);
 *  4. the app's path in Debian Chromium: scanFootage() with its worker (embedded core,
 *     file read in place by range requests from the browser host).
 * Figures: frames per second, ratio to (1), and the time a 90-minute match (135 000
 * frames) would take at that rate. CPU load is printed: on a shared machine wall times
 * are slower than on an idle one.
 * WM_BENCH_CUT_MINUTES=1 npx tsx bench/cuts.bench.ts for a shorter run (default 3).
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { build } from 'vite';
import { CHROMIUM_ARGS, CHROMIUM_PATH, chromiumEnv } from '../build/local-chromium.ts';
import { startBrowserHost } from '../electron/serve.ts';
import { scanFootageCuts } from '../electron/host/footage/frames-scan.ts';

const minutes = Number(process.env.WM_BENCH_CUT_MINUTES ?? 3);
const MATCH_FRAMES = 90 * 60 * 25;
const root = new URL('..', import.meta.url).pathname;

function makeClip(dir: string): { file: string; frames: number; cuts: number } {
  const file = join(dir, 'footage.mp4');
  const shotS = 8;
  const shots = Math.max(2, Math.round((minutes * 60) / shotS));
  const sources = [
    'testsrc2=size=1280x720:rate=25',
    'mandelbrot=size=1280x720:rate=25',
    'smptehdbars=size=1280x720:rate=25,noise=alls=10:allf=t',
    'testsrc=size=1280x720:rate=25,hue=h=90',
  ];
  const inputs = Array.from({ length: shots }, (_, i) => ['-f', 'lavfi', '-i', `${sources[i % sources.length]},trim=duration=${shotS}`]).flat();
  const t0 = performance.now();
  const r = spawnSync('ffmpeg', [
    '-hide_banner', '-loglevel', 'error', '-y', ...inputs,
    '-filter_complex', `${Array.from({ length: shots }, (_, i) => `[${i}]`).join('')}concat=n=${shots}:v=1:a=0,format=yuv420p[v]`,
    '-map', '[v]', '-c:v', 'libx264', '-preset', 'veryfast', '-crf', '30', '-g', '50', '-bf', '2', '-movflags', '+faststart', file,
  ]);
  if (r.status !== 0) throw new Error(`ffmpeg could not make the clip: ${r.stderr}`);
  const frames = shots * shotS * 25;
  console.log(`made ${minutes} min of 1280×720 25 fps H.264 (${shots} shots, ${(statSync(file).size / 1e6).toFixed(1)} MB) in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  return { file, frames, cuts: shots - 1 };
}

function line(name: string, frames: number, ms: number, refFps: number, found: number | string): number {
  const fps = frames / (ms / 1000);
  const matchMin = MATCH_FRAMES / fps / 60;
  console.log(`  ${name.padEnd(44)} ${fps.toFixed(0).padStart(6)} fps  ${refFps ? `${(fps / refFps).toFixed(2)}× ffmpeg scene` : 'reference'.padEnd(16)}  90-min match ≈ ${matchMin.toFixed(1)} min   cuts ${found}`);
  return fps;
}

async function browserScan(dir: string, clip: string): Promise<{ ms: number; frames: number; cuts: number } | string> {
  const rendererDir = join(dir, 'renderer');
  const demoDir = join(dir, 'demo');
  mkdirSync(demoDir);
  // The host's demo needs a tracking and an event file beside the footage; the demo's do.
  copyFileSync(join(root, 'fixtures/demo/tracking.csv'), join(demoDir, 'tracking.csv'));
  copyFileSync(join(root, 'fixtures/demo/events.csv'), join(demoDir, 'events.csv'));
  copyFileSync(clip, join(demoDir, 'footage.mp4'));
  await build({
    configFile: false,
    root: join(root, 'tests/e2e/candidates-page'),
    base: './',
    logLevel: 'warn',
    build: { outDir: rendererDir, emptyOutDir: true, target: 'es2022' },
    worker: { format: 'es' },
  });
  const host = await startBrowserHost({ rendererDir, demoDir, openBrowser: false, log: () => {} });
  const context = await chromium.launchPersistentContext(join(dir, 'profile'), { executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS, env: chromiumEnv(join(dir, 'home')) });
  try {
    const page = context.pages()[0] ?? (await context.newPage());
    await page.goto(host.url);
    await page.waitForFunction(() => document.getElementById('state')?.textContent === 'ready', undefined, { timeout: 60_000 });
    const r = (await page.evaluate(() => (globalThis as never as { candidates: { scan(): Promise<unknown> } }).candidates.scan())) as {
      ok: boolean;
      message?: string;
      cuts: unknown[];
      timings: { pictureMs: number; frames: number };
    };
    if (!r.ok) return `failed: ${r.message}`;
    return { ms: r.timings.pictureMs, frames: r.timings.frames, cuts: r.cuts.length };
  } finally {
    await context.close();
    await host.close();
  }
}

async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'wm-cuts-bench-'));
  try {
    console.log(`load average ${loadavg().map((l) => l.toFixed(1)).join(' ')}`);
    const { file, frames, cuts } = makeClip(dir);
    console.log(`scanning ${frames} frames (${cuts} cuts made):`);

    let t0 = performance.now();
    const ref = spawnSync('ffmpeg', ['-hide_banner', '-nostdin', '-i', file, '-an', '-vf', "select='gt(scene,0.3)',showinfo", '-f', 'null', '-'], { encoding: 'utf8', maxBuffer: 1 << 28 });
    const refMs = performance.now() - t0;
    const refCuts = [...(ref.stderr ?? '').matchAll(/pts_time:/g)].length;
    const refFps = line("ffmpeg select='gt(scene,0.3)' (native)", frames, refMs, 0, refCuts);

    t0 = performance.now();
    const nat = await scanFootageCuts(file, { engine: 'native' });
    line('ours, native ffmpeg 64×36 grey + detector', nat.frames, performance.now() - t0, refFps, nat.cuts.length);

    t0 = performance.now();
    const emb = await scanFootageCuts(file, { engine: 'embedded' });
    line('ours, embedded ffmpeg.wasm in Node', emb.frames, performance.now() - t0, refFps, emb.cuts.length);

    const b = await browserScan(dir, file);
    if (typeof b === 'string') console.log(`  app path in Chromium: ${b}`);
    else line('ours, app worker in Chromium (embedded core)', b.frames, b.ms, refFps, b.cuts);
    console.log(`load average ${loadavg().map((l) => l.toFixed(1)).join(' ')}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
