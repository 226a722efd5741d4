/**
 * The footage player in Debian Chromium on the built renderer (the #footage-check page).
 *
 * Frame accuracy: the reference clips of fixtures/reference/make-reference.sh (made by
 * Debian's ffmpeg 5.1) carry their frame index as a row of black/white blocks. After each
 * seek the test reads the blocks from the pixels Chromium shows and checks the frame is
 * the one `ffprobe -show_frames` (the committed *.ffprobe.json) places at that time, and
 * that the player reports that same frame. The reader itself is checked first on every
 * frame decoded by Debian's ffmpeg, so a broken reader cannot pass.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { frameShownAt } from '../../renderer/src/player/frame-table.ts';
import { DEMO_DIR, ROOT, shot, startApp, type RunningApp } from './harness.ts';
import { demoProject, storeDemoRows } from './setup-rows.ts';
import type { ClockFit } from '../../shared-types/index.ts';

const REF = join(ROOT, 'fixtures/reference');
const BITS = 12;
/** Centre of block k of the frame code (make-reference.sh: x = 4 + 12k, y = h - 14, 10×10). */
const blockCentre = (k: number, h: number) => ({ x: 4 + 12 * k + 5, y: h - 14 + 5 });

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

async function openCheck(page: Page, path: string) {
  const origin = new URL(app.url).origin;
  await page.goto(`${origin}/#footage-check?path=${encodeURIComponent(path)}`);
  await page.reload();
  await expect.poll(() => page.getByTestId('readout-frame').innerText(), { timeout: 60_000 }).toMatch(/^0 \/ \d+$/);
}
const frameText = (page: Page) => page.getByTestId('readout-frame').innerText();

/** Footage times of the video frames as ffprobe listed them (the committed json), minus the first. */
function ffprobeTable(file: string): number[] {
  const j = JSON.parse(readFileSync(join(REF, `${file}.ffprobe.json`), 'utf8')) as { frames: { media_type: string; pts_time: string }[] };
  const t = j.frames.filter((f) => f.media_type === 'video').map((f) => Number(f.pts_time)).sort((a, b) => a - b);
  return t.map((v) => Math.round((v - t[0]) * 1e6) / 1e6);
}

/** The block code of every frame as Debian's ffmpeg decodes it (grey bytes). */
function referenceCodes(file: string): { codes: number[]; width: number; height: number } {
  const [width, height] = execFileSync('ffprobe', ['-v', 'error', '-select_streams', 'v:0', '-show_entries', 'stream=width,height', '-of', 'csv=p=0', join(REF, file)], { encoding: 'utf8' })
    .trim()
    .split('\n')[0] // MPEG-TS lists the stream under its program too
    .split(',')
    .map(Number);
  const raw = execFileSync('ffmpeg', ['-v', 'error', '-i', join(REF, file), '-map', '0:v:0', '-fps_mode', 'passthrough', '-f', 'rawvideo', '-pix_fmt', 'gray', '-'], { maxBuffer: 1 << 30 });
  const size = width * height;
  const codes: number[] = [];
  for (let f = 0; f * size < raw.length; f++) {
    let code = 0;
    for (let k = 0; k < BITS; k++) {
      const { x, y } = blockCentre(k, height);
      if (raw[f * size + y * width + x] > 128) code |= 1 << k;
    }
    codes.push(code);
  }
  return { codes, width, height };
}

type Target = { frame: number } | { t: number } | { step: number };
interface Seen {
  reported: number;
  exact: boolean;
  code: number;
}

/** Runs the targets through the page's player control and reads the code off the shown pixels. */
async function runTargets(page: Page, targets: Target[]): Promise<Seen[]> {
  return page.evaluate(
    async ({ targets, bits }) => {
      type Control = {
        ready: Promise<unknown>;
        video: HTMLVideoElement;
        seekToFrame(i: number): Promise<{ index: number; exact: boolean }>;
        seekToTime(t: number): Promise<{ index: number; exact: boolean }>;
        step(n: number): Promise<{ index: number; exact: boolean }>;
      };
      const c = (globalThis as unknown as { footageCheck: Control }).footageCheck;
      await c.ready;
      const v = c.video;
      const w = v.videoWidth;
      const h = v.videoHeight;
      const canvas = new OffscreenCanvas(w, h);
      const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
      const read = () => {
        ctx.drawImage(v, 0, 0, w, h);
        const d = ctx.getImageData(0, 0, w, h).data;
        let code = 0;
        for (let k = 0; k < bits; k++) {
          const x = 4 + 12 * k + 5;
          const y = h - 14 + 5;
          const i = (y * w + x) * 4;
          // Luma from RGB (BT.601 weights, common practice).
          if (0.299 * d[i] + 0.587 * d[i + 1] + 0.114 * d[i + 2] > 128) code |= 1 << k;
        }
        return code;
      };
      const out: { reported: number; exact: boolean; code: number }[] = [];
      for (const t of targets) {
        const f = 'frame' in t ? await c.seekToFrame(t.frame) : 't' in t ? await c.seekToTime(t.t) : await c.step(t.step);
        out.push({ reported: f.index, exact: f.exact, code: read() });
      }
      return out;
    },
    { targets, bits: BITS },
  );
}

/** Seeded choices, so a failure can be replayed (LCG constants of Numerical Recipes, from memory). */
function chooser(seed: number) {
  let s = seed >>> 0;
  return (n: number) => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return Math.floor((s / 2 ** 32) * n);
  };
}

/** Frames and times to visit: random frames, both sides of frame boundaries, random times, steps. */
function targetsFor(pts: number[], seed: number, extraFrames: number[] = []): { targets: Target[]; expected: number[] } {
  const pick = chooser(seed);
  const n = pts.length;
  const targets: Target[] = [];
  const expected: number[] = [];
  const frame = (i: number) => (targets.push({ frame: i }), expected.push(i));
  const time = (t: number) => (targets.push({ t }), expected.push(frameShownAt(pts, t)));
  frame(n - 1);
  frame(0);
  for (const i of extraFrames) frame(i);
  for (let k = 0; k < 30; k++) frame(pick(n));
  for (let k = 0; k < 12; k++) {
    const i = 1 + pick(n - 1);
    time(pts[i]); // exactly at a frame's start: that frame
    time(pts[i] - 0.0005); // half a millisecond before: the one before it
  }
  const end = pts[n - 1] + (pts[n - 1] - pts[n - 2]);
  for (let k = 0; k < 20; k++) time((pick(1_000_000) / 1_000_000) * end);
  // Steps from a random frame: forward 8, back 4.
  frame(pick(n - 12) + 2);
  let at = expected[expected.length - 1];
  for (let k = 0; k < 8; k++) (targets.push({ step: 1 }), expected.push(++at));
  for (let k = 0; k < 4; k++) (targets.push({ step: -1 }), expected.push(--at));
  return { targets, expected };
}

const CLIPS = [
  { file: 'code25.mp4', what: '25 fps H.264 MP4 with B-frames (edit list)' },
  { file: 'code50.mp4', what: '50 fps H.264 MP4' },
  { file: 'code2997.mov', what: '30000/1001 fps MOV, over a minute', extra: [1799, 1800, 1801] },
  { file: 'codevfr.mp4', what: 'variable rate MP4 (20/40/60/80 ms intervals)' },
  { file: 'codeoffset.m2t', what: 'MPEG-TS starting at 11.4 s (played through the MP4 copy)' },
];

describe('frame accuracy against reference media made by Debian ffmpeg', () => {
  for (const clip of CLIPS) {
    it(`${clip.file}: ${clip.what}`, async () => {
      const pts = ffprobeTable(clip.file);
      const ref = referenceCodes(clip.file);
      // The reader and the clip: every frame Debian's ffmpeg decodes carries its own index.
      expect(ref.codes).toEqual(pts.map((_, i) => i));
      const { page } = app;
      await openCheck(page, join(REF, clip.file));
      const { targets, expected } = targetsFor(pts, 1 + clip.file.length, clip.extra);
      const seen = await runTargets(page, targets);
      const wrong = seen.map((s, k) => ({ k, target: targets[k], expected: expected[k], ...s })).filter((s) => s.code !== s.expected || s.reported !== s.expected || !s.exact);
      expect(wrong).toEqual([]);
      expect(app.pageErrors).toEqual([]);
    });
  }

  it('the check can fail: a frame code read one frame off is caught', async () => {
    const pts = ffprobeTable('code25.mp4');
    await openCheck(app.page, join(REF, 'code25.mp4'));
    const [s] = await runTargets(app.page, [{ frame: 77 }]);
    expect(s.code).toBe(77);
    expect(s.code).not.toBe(frameShownAt(pts, pts[77] - 0.0005));
  });
});

describe('footage player on the screen', () => {
  it('29.97 drop-frame: typed timecode 00:01:00;02 shows frame 1800, a label drop-frame skips is refused, the non-drop readout of frame 1799 is 00:00:59:29', async () => {
    const { page } = app;
    await openCheck(page, join(REF, 'code2997.mov'));
    await page.getByLabel('Clock').selectOption('timecode');
    const moment = page.getByLabel(/^Moment/);
    await moment.fill('00:01:00;00');
    await moment.press('Enter');
    await expect.poll(() => page.getByRole('alert').innerText()).toMatch(/drop-frame skips labels ;00\.\.;01/);
    await moment.fill('00:01:00;02');
    await moment.press('Enter');
    await expect.poll(() => frameText(page)).toMatch(/^1800 \//);
    await expect.poll(() => page.getByTestId('readout-timecode').innerText()).toBe('00:01:00;02');
    const [s] = await runTargets(page, [{ step: 0 }]);
    expect(s.code).toBe(1800);
    await page.keyboard.press('ArrowLeft');
    await expect.poll(() => page.getByTestId('readout-timecode').innerText()).toBe('00:00:59;29');
    await page.getByRole('button', { name: 'DF' }).click();
    await expect.poll(() => page.getByTestId('readout-timecode').innerText()).toBe('00:00:59:29');
    await shot(page, 'player-2997-timecode');
  });

  it('opens the demo footage and follows keys, jumps and typed moments', async () => {
    const { page } = app;
    await openCheck(page, join(DEMO_DIR, 'footage.mp4'));
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => frameText(page)).toMatch(/^1 \//);
    await page.keyboard.press('Shift+ArrowRight');
    await expect.poll(() => frameText(page)).toMatch(/^126 \//);
    await page.keyboard.press('Comma');
    await expect.poll(() => frameText(page)).toMatch(/^125 \//);
    await page.keyboard.press('PageUp');
    await expect.poll(() => frameText(page)).toMatch(/^875 \//);
    await page.getByLabel('Clock').selectOption('frame');
    await page.getByLabel(/^Moment/).fill('1500');
    await page.getByLabel(/^Moment/).press('Enter');
    await expect.poll(() => frameText(page)).toMatch(/^1500 \//);
    await expect.poll(() => page.getByTestId('readout-timecode').innerText()).toBe('00:01:00:00');
    await expect.poll(() => page.getByTestId('readout-footage').innerText()).toBe('01:00.000');
    // Play, then pause with K: the frame shown moved on and is reported exactly.
    await page.keyboard.press('Space');
    await expect.poll(() => page.getByLabel('Shuttle speed').innerText()).toBe('▸ 1×');
    await page.keyboard.press('l');
    await expect.poll(() => page.getByLabel('Shuttle speed').innerText()).toBe('▸ 2×');
    await expect.poll(async () => Number((await frameText(page)).split(' ')[0])).toBeGreaterThan(1520);
    await page.keyboard.press('k');
    await expect.poll(() => page.getByLabel('Shuttle speed').innerText()).toBe('paused');
    const at = Number((await frameText(page)).split(' ')[0]);
    // Backward shuttle (seeks frame by frame): the frame number goes down.
    await page.keyboard.press('j');
    await expect.poll(async () => Number((await frameText(page)).split(' ')[0])).toBeLessThan(at - 5);
    await page.keyboard.press('k');
    await page.getByLabel('Clock').selectOption('frame');
    await page.getByLabel(/^Moment/).fill('1500');
    await page.getByLabel(/^Moment/).press('Enter');
    await expect.poll(() => frameText(page)).toMatch(/^1500 \//);
    await shot(page, 'player-demo');
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });
});

describe('footage player with a footage clock fit (demo match)', () => {
  it('reads out match clock and tracking frame through the newest fit, as the truth maps the frame on screen', async () => {
    const { page } = app;
    const truth = JSON.parse(readFileSync(join(DEMO_DIR, 'truth.json'), 'utf8')) as {
      clocks: Record<'footage' | 'tracking' | 'events', { segments: { period: 1 | 2; fromT: number; toT: number; offset: number; rate: number; kind?: string }[] }>;
      tracking: { rate: number; periods: { period: 1 | 2; firstFrame: number }[] };
    };
    if (!truth.clocks) return; // stand-in demo (no truth): nothing to compare with
    const trk = (p: number) => truth.clocks.tracking.segments.find((s) => s.period === p)!;
    const evt = (p: number) => truth.clocks.events.segments.find((s) => s.period === p)!;
    // Truth: true = offset + rate * source time per clock. Footage -> tracking: s = (fo + fr f - to) / tr.
    const seg = (period: 1 | 2, fromT: number, toT: number, offset: number, rate: number) => ({ period, fromT, toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] });
    const fit = { source: 'footage', method: 'huber', segments: truth.clocks.footage.segments.filter((s) => s.kind === 'live').map((s) => seg(s.period, s.fromT, s.toT, (s.offset - trk(s.period).offset) / trk(s.period).rate, s.rate / trk(s.period).rate)) };
    const eventFit = { source: 'events', method: 'huber', segments: ([1, 2] as const).map((p) => seg(p, 0, 3000, (evt(p).offset - trk(p).offset) / trk(p).rate, evt(p).rate / trk(p).rate)) };
    // The demo project is made on first start; store both fits beside it (raw IndexedDB, as Dexie would: tests/e2e/setup-rows.ts).
    await page.goto(app.url);
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 170_000 });
    const demo = await demoProject(page);
    await storeDemoRows(page, demo, { footageFit: fit as ClockFit, eventFit: eventFit as ClockFit });
    const ids = { projectId: demo.projectId, footage: demo.footageSourceId };
    await page.goto(`${new URL(app.url).origin}/#footage-check?project=${ids.projectId}&source=${ids.footage}`);
    await page.reload();
    await expect.poll(() => frameText(page), { timeout: 60_000 }).toMatch(/^0 \//);
    const pts = ffprobeTableOf(join(DEMO_DIR, 'footage.ffprobe.json'));
    const check = async (frame: number) => {
      await page.getByLabel('Clock').selectOption('frame');
      await page.getByLabel(/^Moment/).fill(String(frame));
      await page.getByLabel(/^Moment/).press('Enter');
      await expect.poll(() => frameText(page)).toMatch(new RegExp(`^${frame} /`));
      const f = pts[frame];
      const s = truth.clocks.footage.segments.find((q) => q.kind === 'live' && f >= q.fromT && f <= q.toT)!;
      const trueT = s.offset + s.rate * f;
      const tS = (trueT - trk(s.period).offset) / trk(s.period).rate;
      const first = truth.tracking.periods.find((p) => p.period === s.period)!.firstFrame;
      const e = (trueT - evt(s.period).offset) / evt(s.period).rate;
      const tenths = Math.floor(((s.period === 2 ? 2700 : 0) + e) * 10 + 1e-6);
      const clock = `${String(Math.floor(tenths / 600)).padStart(2, '0')}:${String(Math.floor((tenths % 600) / 10)).padStart(2, '0')}.${tenths % 10}`;
      expect(await page.getByTestId('readout-match').innerText()).toBe(`${clock} · P${s.period}`);
      expect(Math.abs(Number(await page.getByTestId('readout-tracking').innerText()) - (first + tS * truth.tracking.rate))).toBeLessThanOrEqual(0.5 + 1e-6);
    };
    // First period, and the second period after the half-time cut (footage kick-off 2 near 251.5 s).
    await check(1500);
    await check(Math.round(252 * 25));
    await check(Math.round(400 * 25));
    await shot(page, 'player-demo-fit');
    // Typed match clock goes to the frame showing it.
    await page.getByLabel('Clock').selectOption('match');
    await page.getByLabel(/^Moment/).fill('47:00.0');
    await page.getByLabel(/^Moment/).press('Enter');
    await expect.poll(() => page.getByTestId('readout-match').innerText()).toMatch(/^4[67]:[05]\d\.\d · P2$/);
    expect(app.outsideRequests).toEqual([]);
  });
});

function ffprobeTableOf(file: string): number[] {
  // fixtures/demo/footage.ffprobe.json: ffprobe -show_frames, trimmed to the video frames.
  const j = JSON.parse(readFileSync(file, 'utf8')) as { video_frames: { pts_time: string }[] };
  const t = j.video_frames.map((f) => Number(f.pts_time)).sort((a, b) => a - b);
  return t.map((v) => v - t[0]);
}
