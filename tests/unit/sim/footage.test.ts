import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { DEMO_FOOTAGE } from '../../../fixtures/sim/demo-config.ts';
import { project } from '../../../fixtures/sim/footage/camera.ts';
import { planFootage } from '../../../fixtures/sim/footage/plan.ts';
import { pitchMarkings, HALF_L, HALF_W } from '../../../fixtures/sim/pitch.ts';
import { sampleAt } from '../../../fixtures/sim/sample.ts';
import type { Truth } from '../../../fixtures/sim/truth.ts';
import { demoWorld } from './demo-world.ts';

// Outside references: Debian's ffmpeg/ffprobe (decoding and probing the committed file,
// fixtures/demo/footage.ffprobe.json made by ffprobe) and fft.js (npm) for the whistle spectrum.
const demo = new URL('../../../fixtures/demo/', import.meta.url).pathname;
const mp4 = demo + 'footage.mp4';
const truth = JSON.parse(readFileSync(demo + 'truth.json', 'utf8')) as Truth;
const probe = JSON.parse(readFileSync(demo + 'footage.ffprobe.json', 'utf8'));
const haveFfmpeg = spawnSync('ffmpeg', ['-version']).status === 0 && existsSync(mp4);
const W = DEMO_FOOTAGE.width, H = DEMO_FOOTAGE.height;

function decodeFrame(i: number): Uint8Array {
  // Input seeking decodes from the previous keyframe and drops frames before the target.
  const t = (i / DEMO_FOOTAGE.fps - 0.01).toFixed(3);
  const r = spawnSync('ffmpeg', ['-v', 'error', '-ss', t, '-i', mp4, '-frames:v', '1', '-f', 'rawvideo', '-pix_fmt', 'rgb24', 'pipe:1'], { maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(r.stderr.toString());
  return new Uint8Array(r.stdout);
}

describe('committed footage agrees with ffprobe and the truth', () => {
  const video = probe.streams.find((s: { codec_type: string }) => s.codec_type === 'video');
  it('frame count and duration in truth.json equal ffprobe (committed footage.ffprobe.json)', () => {
    expect(Number(video.nb_frames)).toBe(truth.footage!.frameCount);
    expect(probe.video_frames.length).toBe(truth.footage!.frameCount);
    expect(Number(video.duration)).toBeCloseTo(truth.footage!.durationS, 3);
    expect(video.r_frame_rate).toBe('25/1');
    expect([video.width, video.height]).toEqual([W, H]);
    // Every frame at n / 25 s: constant rate from zero (ffprobe pts_time).
    probe.video_frames.forEach((f: { pts_time: string }, n: number) => expect(Number(f.pts_time)).toBeCloseTo(n / 25, 4));
  });

  it.skipIf(!haveFfmpeg)('live ffprobe of the committed file reports the same frames and duration', () => {
    // Counting packets reads the sample table without decoding: one packet per video frame.
    const r = spawnSync('ffprobe', ['-v', 'error', '-count_packets', '-select_streams', 'v:0', '-show_entries', 'stream=nb_read_packets,duration,codec_name', '-of', 'json', mp4], { encoding: 'utf8' });
    const s = JSON.parse(r.stdout).streams[0];
    expect(s.codec_name).toBe('h264');
    expect(Number(s.nb_read_packets)).toBe(truth.footage!.frameCount);
    expect(Number(s.duration)).toBeCloseTo(Number(video.duration), 6);
  });
});

describe.skipIf(!haveFfmpeg)('truth homography puts the markings where the decoded frames show them', () => {
  const world = demoWorld();
  const plan = planFootage(world, DEMO_FOOTAGE);
  const marks = pitchMarkings(0.25).filter((m) => !m.spotR).flatMap((m) => m.points);
  const luma = (rgb: Uint8Array, u: number, v: number) => {
    const o = (v * W + u) * 3;
    return 0.299 * rgb[o] + 0.587 * rgb[o + 1] + 0.114 * rgb[o + 2];
  };
  /** Line points and grass points of frame i, away from players, the ball and the graphics. */
  function checkFrame(i: number, rgb: Uint8Array, shiftU = 0, shiftV = 0) {
    const fr = plan.frames[i];
    const pos = new Float64Array(47);
    sampleAt(world, fr.t, pos);
    const people: { u: number; v: number }[] = [];
    for (let o = 0; o < 23; o++)
      for (const z of [0, 0.9, 1.8]) people.push(project(fr.P, pos[2 * o], pos[2 * o + 1], z));
    const clear = (u: number, v: number) => u > 4 && u < W - 5 && v > 45 && v < H - 5 && people.every((p) => Math.hypot(p.u - u, p.v - v) > 18);
    const toImage = (x: number, y: number) => {
      const h = fr.H;
      const w = h[6] * x + h[7] * y + h[8];
      return { u: (h[0] * x + h[1] * y + h[2]) / w + shiftU, v: (h[3] * x + h[4] * y + h[5]) / w + shiftV };
    };
    let lineOk = 0, lineN = 0;
    for (const p of marks) {
      const { u, v } = toImage(p.x, p.y);
      if (!clear(u, v)) continue;
      const iu = Math.floor(u), iv = Math.floor(v);
      let best = 0;
      for (let dv = -1; dv <= 1; dv++) for (let du = -1; du <= 1; du++) best = Math.max(best, luma(rgb, iu + du, iv + dv));
      lineN++;
      if (best > 160) lineOk++;
    }
    let grassOk = 0, grassN = 0;
    for (let x = -HALF_L + 3; x < HALF_L - 3; x += 2.1)
      for (let y = -HALF_W + 3; y < HALF_W - 3; y += 2.3) {
        if (marks.some((m) => Math.hypot(m.x - x, m.y - y) < 1.5)) continue;
        const { u, v } = toImage(x, y);
        if (!clear(u, v)) continue;
        const o = (Math.floor(v) * W + Math.floor(u)) * 3;
        grassN++;
        if (rgb[o + 1] > rgb[o] + 25 && rgb[o + 1] > rgb[o + 2] + 25) grassOk++;
      }
    return { line: lineOk / lineN, lineN, grass: grassOk / grassN, grassN };
  }

  const frames = [750, 2400, 2700, 7100, 9000]; // lead-in, live, slow replay, goal replay, second period
  it.each(frames)('frame %i: projected line points are near-white, grass points green', (i) => {
    const rgb = decodeFrame(i);
    expect(rgb.length).toBe(W * H * 3);
    const r = checkFrame(i, rgb);
    expect(r.lineN).toBeGreaterThan(50);
    expect(r.grassN).toBeGreaterThan(50);
    expect(r.line).toBeGreaterThan(0.9);
    expect(r.grass).toBeGreaterThan(0.97);
  });

  it('control: the same check fails for a homography 6 pixels off', () => {
    const rgb = decodeFrame(2400);
    const good = checkFrame(2400, rgb).line;
    const offU = checkFrame(2400, rgb, 6, 0).line, offV = checkFrame(2400, rgb, 0, 6).line;
    // A shift along a line keeps it on the line, so each direction alone is only partly off
    // (how much depends on which lines the frame shows); across it, the check must break.
    expect((offU + offV) / 2).toBeLessThan(0.5);
    expect(good - Math.min(offU, offV)).toBeGreaterThan(0.5);
  });
});

describe.skipIf(!haveFfmpeg)('whistles in the soundtrack where the truth says (fft.js spectrum)', () => {
  function bandPeak(t: number) {
    const r = spawnSync('ffmpeg', ['-v', 'error', '-ss', t.toFixed(3), '-t', '0.2', '-i', mp4, '-vn', '-f', 's16le', '-ac', '1', '-ar', '48000', 'pipe:1'], { maxBuffer: 1 << 22 });
    const pcm = new Int16Array(r.stdout.buffer, r.stdout.byteOffset, Math.floor(r.stdout.length / 2));
    const n = 8192;
    const fft = new FFT(n);
    const input = new Array<number>(n).fill(0);
    for (let i = 0; i < Math.min(n, pcm.length); i++) input[i] = (pcm[i] / 32768) * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1)));
    const out = fft.createComplexArray();
    fft.realTransform(out, input);
    const hz = 48000 / n;
    const mag = (k: number) => Math.hypot(out[2 * k], out[2 * k + 1]);
    const band: number[] = [];
    let peakK = 0;
    for (let k = Math.ceil(2000 / hz); k <= Math.floor(4500 / hz); k++) {
      band.push(mag(k));
      if (mag(k) > mag(peakK)) peakK = k;
    }
    band.sort((a, b) => a - b);
    const median = band[band.length >> 1];
    // Second harmonic: strongest bin within ±3 % of twice the peak.
    let h2 = 0;
    for (let k = Math.floor(peakK * 1.94); k <= Math.ceil(peakK * 2.06); k++) h2 = Math.max(h2, mag(k));
    return { ratio: mag(peakK) / median, f: peakK * hz, h2: h2 / median };
  }

  it('every third whistle: a 2–4.5 kHz peak far above the band median, with its harmonic (REFERENCES.md)', () => {
    const ws = truth.whistles!.filter((_, i) => i % 3 === 0);
    expect(ws.length).toBeGreaterThan(2);
    for (const w of ws) {
      const r = bandPeak(w.footageT + 0.08);
      expect(r.f).toBeGreaterThan(2000);
      expect(r.f).toBeLessThan(4500);
      expect(r.ratio, `whistle at ${w.footageT}`).toBeGreaterThan(20);
      expect(r.h2).toBeGreaterThan(5);
    }
  });

  it('control: crowd noise alone (no whistle within 3 s) has no such peak', () => {
    const quiet = [12, 100, 330].filter((t) => truth.whistles!.every((w) => Math.abs(w.footageT - t) > 3));
    expect(quiet.length).toBeGreaterThan(0);
    for (const t of quiet) expect(bandPeak(t).ratio).toBeLessThan(20);
  });
});
