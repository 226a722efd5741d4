/**
 * The embedded export path (renderer/src/export-clips/embedded.ts: WebCodecs + mediabunny,
 * overlay by the Watch renderer) run in Debian Chromium, its output checked with Debian's
 * ffprobe/ffmpeg 5.1:
 * - reference clip with a burned-in frame counter (fixtures/reference/cfr25.mp4, made by
 *   Debian's ffmpeg): frame count and duration = out − in within one frame, the first frame
 *   is the in-frame (compared with the source frames decoded by ffmpeg), audio present;
 * - demo clip round the corner: the overlay's team colours sit where the demo's true
 *   positions project through truth-homography.json;
 * - cancelling mid-way rejects and returns no bytes;
 * - with a title card: the card's frames first (its colours), then the in-frame, the
 *   duration card + (out − in), audio over the whole file and silent under the card.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { probeFootageFile } from '../../electron/host/footage/probe.ts';
import { footageToTracking } from '../../engine/fit/footage-map.ts';
import { planClip, type ClipPlan } from '../../renderer/src/export-clips/plan.ts';
import { openExportPage, PAGE_B64, type ExportPage } from './export-page.ts';
import { homographies, project, truth, truthEventFit, truthFootageFit, truthRegistration, trueToTracking } from '../demo-truth-rows.ts';

const ROOT = new URL('../../', import.meta.url).pathname;
const REF = join(ROOT, 'fixtures/reference/cfr25.mp4');
const DEMO = join(ROOT, 'fixtures/demo');
let ep: ExportPage;
const scratch = mkdtempSync(join(tmpdir(), 'wm-export-test-'));

beforeAll(async () => {
  ep = await openExportPage({ '/ref.mp4': REF, '/demo.mp4': join(DEMO, 'footage.mp4'), '/tracking.csv': join(DEMO, 'tracking.csv') });
});
afterAll(async () => {
  await ep?.close();
  rmSync(scratch, { recursive: true, force: true });
});

const ffprobe = (file: string) =>
  JSON.parse(execFileSync('ffprobe', ['-v', 'error', '-show_streams', '-show_format', '-count_frames', '-of', 'json', file], { encoding: 'utf8' })) as {
    streams: { codec_type: string; codec_name: string; nb_read_frames?: string; duration?: string; width?: number; height?: number }[];
    format: { duration: string };
  };

/** Frame n of a file decoded by Debian's ffmpeg as raw pixels. */
function frameOf(file: string, n: number, pixFmt: 'gray' | 'rgb24', size?: string): Buffer {
  return execFileSync('ffmpeg', ['-v', 'error', '-i', file, '-vf', `select=eq(n\\,${n})${size ? `,scale=${size}` : ''}`, '-frames:v', '1', '-f', 'rawvideo', '-pix_fmt', pixFmt, '-'], { maxBuffer: 64 << 20 });
}

/** Mean absolute difference over the counter box (top-left, where make-reference.sh burns "n pts"). */
function counterDiff(a: Buffer, b: Buffer, width: number): number {
  let s = 0;
  let k = 0;
  for (let y = 4; y < 40; y++) for (let x = 4; x < 160; x++, k++) s += Math.abs(a[y * width + x] - b[y * width + x]);
  return s / k;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
async function runExport(args: Record<string, any>): Promise<Buffer> {
  const b64 = await ep.page.evaluate(
    async ({ args, b64 }) => {
      const wm = (window as any).wm;
      const blob = await (await fetch(args.url)).blob();
      let overlay;
      if (args.overlay) {
        const t = await wm.loadTracking('/tracking.csv');
        const o = args.overlay;
        const data = { pitch: t.pitch, rate: t.rate, objects: t.objects, ballIndex: t.ballIndex, periods: t.periods, fit: o.fit, registration: o.registration, nonLive: [], footage: o.footage };
        const renderer = await wm.createOverlayRenderer({ width: args.width, height: args.height, preserveDrawingBuffer: true });
        overlay = { data, settings: wm.defaultSettings(), renderer, eventFit: o.eventFit };
      }
      const bytes = await wm.exportClipEmbedded({ source: blob, plan: args.plan, pts: args.pts, overlay, width: args.width, height: args.height, titleS: args.titleS ?? 0, caption: args.caption ?? false, titleCard: args.titleCard });
      return (0, eval)(b64)(bytes);
    },
    { args, b64: PAGE_B64 },
  );
  return Buffer.from(b64, 'base64');
}

describe('embedded export (WebCodecs + mediabunny in Debian Chromium)', () => {
  it('cuts on the exact frames of the reference clip and keeps the audio', async () => {
    const probe = await probeFootageFile(REF);
    const inFrame = 13;
    const outFrame = 63;
    const plan = { title: 'ref', layers: [], footage: { inFrame, outFrame, inT: probe.pts[inFrame], outT: probe.pts[outFrame] } } as unknown as ClipPlan;
    const out = join(scratch, 'ref-clip.mp4');
    writeFileSync(out, await runExport({ url: '/ref.mp4', plan, pts: probe.pts, width: 320, height: 180 }));
    const info = ffprobe(out);
    const v = info.streams.find((s) => s.codec_type === 'video')!;
    const a = info.streams.find((s) => s.codec_type === 'audio');
    expect(v.codec_name).toBe('h264');
    expect(Number(v.nb_read_frames)).toBe(outFrame - inFrame);
    const want = probe.pts[outFrame] - probe.pts[inFrame];
    expect(Math.abs(Number(info.format.duration) - want)).toBeLessThanOrEqual(1 / 25 + 1e-6);
    // Audio kept (the reference has a 440 Hz sine: make-reference.sh).
    expect(a).toBeDefined();
    expect(Math.abs(Number(a!.duration) - want)).toBeLessThan(0.1);
    // The first frame is the in-frame: nearest to source frame 13 of its neighbours 11..15.
    const first = frameOf(out, 0, 'gray');
    const diffs = [11, 12, 13, 14, 15].map((n) => counterDiff(first, frameOf(REF, n, 'gray'), 320));
    expect(diffs.indexOf(Math.min(...diffs))).toBe(2);
    const last = frameOf(out, outFrame - inFrame - 1, 'gray');
    const lastDiffs = [60, 61, 62, 63, 64].map((n) => counterDiff(last, frameOf(REF, n, 'gray'), 320));
    expect(lastDiffs.indexOf(Math.min(...lastDiffs))).toBe(2);
  });

  it('opens on the title card (silent), then the clip from its in-frame', async () => {
    const probe = await probeFootageFile(REF);
    const inFrame = 13;
    const outFrame = 63;
    const plan = { title: 'ref', layers: [], footage: { inFrame, outFrame, inT: probe.pts[inFrame], outT: probe.pts[outFrame] } } as unknown as ClipPlan;
    const card = { seconds: 2, title: 'Press after the goal kick', kicker: 'Pressing triggers · 3 of 7', clock: '1st half  12:04–12:06', note: 'Both 8s jump the pivot as soon as the keeper opens up; the full-back holds. Watch the far winger tuck in to close the switch.' };
    const W = 1280;
    const H = 720;
    const out = join(scratch, 'ref-card.mp4');
    // titleS 2: the lower-third title would show on the first clip frames; with a card it must not.
    writeFileSync(out, await runExport({ url: '/ref.mp4', plan, pts: probe.pts, width: W, height: H, titleS: 2, titleCard: card }));
    mkdirSync(join(ROOT, 'test-results'), { recursive: true });
    execFileSync('ffmpeg', ['-v', 'error', '-y', '-i', out, '-vf', 'select=eq(n\\,0)', '-frames:v', '1', join(ROOT, 'test-results/export-embedded-title-card.png')]);
    const cardFrames = 50; // 2 s at 25 fps
    const info = ffprobe(out);
    const v = info.streams.find((s) => s.codec_type === 'video')!;
    const a = info.streams.find((s) => s.codec_type === 'audio');
    expect(Number(v.nb_read_frames)).toBe(cardFrames + outFrame - inFrame);
    const want = cardFrames / 25 + probe.pts[outFrame] - probe.pts[inFrame];
    expect(Math.abs(Number(info.format.duration) - want)).toBeLessThanOrEqual(1 / 25 + 1e-6);

    // Card frames: the background colour of drawTitleCard (#10161b) in a corner, and the
    // title line (white, 52 px at 720p from x 132, baseline 348) far from it.
    const bg = [0x10, 0x16, 0x1b];
    for (const n of [0, cardFrames - 1]) {
      const rgb = frameOf(out, n, 'rgb24');
      for (const [x, y] of [[20, 20], [W - 20, H - 20], [W / 2, 120]]) {
        const i = (y * W + x) * 3;
        for (let c = 0; c < 3; c++) expect(Math.abs(rgb[i + c] - bg[c])).toBeLessThanOrEqual(8);
      }
      let bright = 0;
      for (let y = 306; y < 350; y++) for (let x = 132; x < 700; x++) if (rgb[(y * W + x) * 3] > 160) bright++;
      expect(bright / (44 * 568)).toBeGreaterThan(0.05);
    }
    // The first frame after the card is the in-frame (counter compared at the source size),
    // and no lower-third title covers it: where drawCaption puts it (0..~110 × 24..76 px at
    // 720p for "ref") the frame matches source frame 13 scaled up.
    const after = frameOf(out, cardFrames, 'gray', '320:180');
    const diffs = [11, 12, 13, 14, 15].map((n) => counterDiff(after, frameOf(REF, n, 'gray'), 320));
    expect(diffs.indexOf(Math.min(...diffs))).toBe(2);
    const big = frameOf(out, cardFrames, 'gray');
    const src = frameOf(REF, inFrame, 'gray', `${W}:${H}`);
    let d = 0;
    for (let y = 28; y < 72; y++) for (let x = 4; x < 100; x++) d += Math.abs(big[y * W + x] - src[y * W + x]);
    expect(d / (44 * 96)).toBeLessThan(12);

    // Audio over the whole file; silent under the card, the reference's 440 Hz sine after it
    // (RMS by Debian's ffmpeg 5.1 astats filter).
    expect(a).toBeDefined();
    expect(Math.abs(Number(a!.duration) - want)).toBeLessThan(0.1);
    const rmsDb = (from: number, to: number) => {
      const log = spawnSync('ffmpeg', ['-v', 'info', '-nostats', '-i', out, '-vn', '-af', `atrim=${from}:${to},astats=measure_perchannel=none`, '-f', 'null', '-'], { encoding: 'utf8' }).stderr;
      const m = /Overall[\s\S]*?RMS level dB: (-?inf|-?[\d.]+)/.exec(log);
      if (!m) throw new Error(`astats printed no overall RMS level for ${from}–${to} s:\n${log.slice(-600)}`);
      return m[1].endsWith('inf') ? -Infinity : Number(m[1]);
    };
    const cardS = cardFrames / 25;
    expect(rmsDb(0, cardS - 0.05)).toBeLessThan(-70);
    // The sine at 0.1 peak is about −23 dB RMS in the source (astats on cfr25.mp4).
    expect(rmsDb(cardS + 0.1, want - 0.1)).toBeGreaterThan(-30);
  });

  it('burns the overlay where the demo truth positions project (truth-homography.json)', async () => {
    const probe = await probeFootageFile(join(DEMO, 'footage.mp4'));
    const fit = truthFootageFit();
    const corner = truth.restarts.find((r) => r.kind === 'corner')!;
    const tTrk = trueToTracking(corner.period, corner.playedT);
    const first = truth.tracking.periods.find((p) => p.period === corner.period)!.firstFrame;
    const plan = planClip({ id: 1, projectId: 1, reelId: 1, order: 0, period: corner.period, from: tTrk - 1, to: tTrk + 1, title: 'Corner', layers: ['dots', 'ball'] }, 0, {
      fit,
      probe,
      tracking: { rate: 25, firstFrame: { [corner.period]: first } },
      events: [],
      nonLive: [],
    });
    const W = 1280;
    const H = 720;
    const out = join(scratch, 'demo-corner.mp4');
    const bytes = await runExport({
      url: '/demo.mp4',
      plan,
      pts: probe.pts,
      width: W,
      height: H,
      caption: true,
      titleS: 0.5,
      overlay: { fit, eventFit: truthEventFit(), registration: truthRegistration(plan.footage.inFrame - 2, plan.footage.outFrame + 2), footage: { width: 640, height: 360 } },
    });
    writeFileSync(out, bytes);
    const k = 25;
    const src = plan.footage.inFrame + k;
    const rgb = frameOf(out, k, 'rgb24');
    const srcRgb = frameOf(join(DEMO, 'footage.mp4'), src, 'rgb24', `${W}:${H}`);
    mkdirSync(join(ROOT, 'test-results'), { recursive: true }); // a fresh checkout has none yet
    execFileSync('ffmpeg', ['-v', 'error', '-y', '-i', out, '-vf', `select=eq(n\\,${k})`, '-frames:v', '1', join(ROOT, 'test-results/export-embedded-demo-frame.png')]);

    // Where each player stands at that frame: tracking.csv row nearest the fitted moment.
    const m = footageToTracking(fit, probe.pts[src])!;
    const lines = readFileSync(join(DEMO, 'tracking.csv'), 'utf8').split('\n');
    const head = lines[0].split(',');
    const row = lines.find((l) => l.startsWith(`${m.period},${first + Math.round(m.t * 25)},`))!.split(',');
    const h = homographies()[src];
    const points: { team: 'home' | 'away'; u: number; v: number }[] = [];
    for (const team of ['home', 'away'] as const)
      for (let s = 1; s <= 11; s++) {
        const x = Number(row[head.indexOf(`${team}_${s}_x`)]);
        const y = Number(row[head.indexOf(`${team}_${s}_y`)]);
        if (!Number.isFinite(x) || !Number.isFinite(y) || row[head.indexOf(`${team}_${s}_x`)] === '') continue;
        const [u, v] = project(h, x, y);
        points.push({ team, u: u * (W / 640), v: v * (H / 360) });
      }
    // Players 14 px clear of every other player and inside the picture.
    const clear = points.filter((p) => p.u > 20 && p.v > 20 && p.u < W - 20 && p.v < H - 60 && points.every((q) => q === p || Math.hypot(q.u - p.u, q.v - p.v) > 14));
    expect(clear.length).toBeGreaterThanOrEqual(6);
    // Team colours (overlay/style.ts, Okabe & Ito): home orange #E69F00, away blue #0072B2.
    const isTeam = (team: 'home' | 'away', r: number, g: number, b: number) => (team === 'home' ? r > 150 && g > 90 && g < 200 && b < 90 : b > 120 && b > r + 60 && g < b);
    const ringMatches = (buf: Buffer, p: (typeof clear)[number]) => {
      let hits = 0;
      for (let a = 0; a < 8; a++) {
        const x = Math.round(p.u + 5 * Math.cos((a * Math.PI) / 4));
        const y = Math.round(p.v + 5 * Math.sin((a * Math.PI) / 4));
        const i = (y * W + x) * 3;
        if (isTeam(p.team, buf[i], buf[i + 1], buf[i + 2])) hits++;
      }
      return hits >= 3;
    };
    const exported = clear.filter((p) => ringMatches(rgb, p)).length;
    const source = clear.filter((p) => ringMatches(srcRgb, p)).length;
    expect(exported / clear.length).toBeGreaterThanOrEqual(0.8);
    expect(source / clear.length).toBeLessThan(0.3);
  });

  it('joins exported clips into one reel file without re-encoding (frame count, order, audio)', async () => {
    const probe = await probeFootageFile(REF);
    const spans = [
      [10, 30],
      [60, 85],
    ];
    const b64 = await ep.page.evaluate(
      async ({ spans, pts, b64 }) => {
        const wm = (window as any).wm;
        const blob = await (await fetch('/ref.mp4')).blob();
        const parts = [];
        for (const [a, b] of spans) parts.push(await wm.exportClipEmbedded({ source: blob, plan: { title: 'p', layers: [], footage: { inFrame: a, outFrame: b, inT: pts[a], outT: pts[b] } }, pts, width: 320, height: 180, titleS: 0, caption: false }));
        return (0, eval)(b64)(await wm.joinClips(parts));
      },
      { spans, pts: probe.pts, b64: PAGE_B64 },
    );
    const out = join(scratch, 'joined.mp4');
    writeFileSync(out, Buffer.from(b64, 'base64'));
    const info = ffprobe(out);
    const v = info.streams.find((s) => s.codec_type === 'video')!;
    expect(Number(v.nb_read_frames)).toBe(20 + 25);
    expect(Math.abs(Number(info.format.duration) - 45 / 25)).toBeLessThanOrEqual(1 / 25 + 1e-6);
    expect(info.streams.some((s) => s.codec_type === 'audio')).toBe(true);
    // Frame 20 of the reel is the second clip's in-frame (source frame 60).
    const f = frameOf(out, 20, 'gray');
    const diffs = [58, 59, 60, 61, 62].map((n) => counterDiff(f, frameOf(REF, n, 'gray'), 320));
    expect(diffs.indexOf(Math.min(...diffs))).toBe(2);
  });

  it('a cancelled export rejects and hands back nothing', async () => {
    const probe = await probeFootageFile(join(DEMO, 'footage.mp4'));
    const plan = { title: 'long', layers: [], footage: { inFrame: 800, outFrame: 3300, inT: probe.pts[800], outT: probe.pts[3300] } };
    const res = await ep.page.evaluate(
      async ({ plan, pts }) => {
        const wm = (window as any).wm;
        const blob = await (await fetch('/demo.mp4')).blob();
        const ac = new AbortController();
        let seen = 0;
        try {
          const bytes = await wm.exportClipEmbedded({ source: blob, plan, pts, width: 640, height: 360, signal: ac.signal, onProgress: (p: number) => ((seen = p), p > 0.05 && ac.abort()) });
          return { ok: true, size: bytes.length, seen };
        } catch (e) {
          return { ok: false, message: (e as Error).message, seen };
        }
      },
      { plan, pts: probe.pts },
    );
    expect(res.ok).toBe(false);
    expect(res.message).toMatch(/cancelled; nothing was written/);
    expect(res.seen).toBeGreaterThan(0.05);
    expect(res.seen).toBeLessThan(0.9);
    expect(readdirSync(scratch).filter((f) => f.includes('long'))).toEqual([]);
  });
});
