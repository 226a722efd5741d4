/**
 * The native export path (electron/host/export/native-export.ts) with Debian's ffmpeg 5.1,
 * checked with Debian's ffprobe/ffmpeg on the reference clip with a burned-in frame counter
 * (fixtures/reference/cfr25.mp4, make-reference.sh): frame count and duration = out − in,
 * first frame = in-frame, audio kept, overlay frames laid over at their pixels; a cancelled
 * export and a refused overwrite leave nothing behind. The blend between the two ffmpeg
 * processes is checked against ffmpeg's own overlay filter; the HostApi sessions with a title
 * card against the frame counter and ffmpeg's astats (silence under the card).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { probeFootageFile } from '../../electron/host/footage/probe.ts';
import { exportClipNative } from '../../electron/host/export/native-export.ts';
import { blendRunsI420, decodeRuns, encodeRuns, i420Size, packBatch } from '../../engine/overlay-frames/index.ts';
import { NativeSessions } from '../../electron/host/export/native-sessions.ts';

const ROOT = new URL('../../', import.meta.url).pathname;
const REF = join(ROOT, 'fixtures/reference/cfr25.mp4');
const dir = mkdtempSync(join(tmpdir(), 'wm-native-export-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const frameOf = (file: string, n: number, fmt: 'gray' | 'rgb24') =>
  execFileSync('ffmpeg', ['-v', 'error', '-i', file, '-vf', `select=eq(n\\,${n})`, '-frames:v', '1', '-f', 'rawvideo', '-pix_fmt', fmt, '-'], { maxBuffer: 1 << 24 });
function counterDiff(a: Buffer, b: Buffer, width: number): number {
  let s = 0;
  let k = 0;
  for (let y = 4; y < 40; y++) for (let x = 4; x < 160; x++, k++) s += Math.abs(a[y * width + x] - b[y * width + x]);
  return s / k;
}

/** Transparent overlay frames (run-encoded) with an opaque red square at (200..220, 100..120). */
async function* squares(n: number, w: number, h: number) {
  const f = new Uint8Array(w * h * 4);
  for (let y = 100; y < 120; y++) for (let x = 200; x < 220; x++) f.set([255, 0, 0, 255], (y * w + x) * 4);
  const words = encodeRuns(f, w, h);
  for (let i = 0; i < n; i++) yield words;
}

describe('native export (ffmpeg on PATH)', () => {
  it('cuts on the exact frames, keeps audio and lays the overlay frames over the picture', async () => {
    const probe = await probeFootageFile(REF);
    const inFrame = 13;
    const frames = 50;
    const { path } = await exportClipNative({ input: REF, inT: probe.pts[inFrame], frames, fps: 25, width: 320, height: 180, overlay: squares(frames, 320, 180), directory: dir, name: 'ref-native.mp4' });
    const info = JSON.parse(execFileSync('ffprobe', ['-v', 'error', '-count_frames', '-show_streams', '-show_format', '-of', 'json', path], { encoding: 'utf8' }));
    const v = info.streams.find((s: { codec_type: string }) => s.codec_type === 'video');
    const a = info.streams.find((s: { codec_type: string }) => s.codec_type === 'audio');
    expect(v.codec_name).toBe('h264');
    expect(Number(v.nb_read_frames)).toBe(frames);
    expect(Math.abs(Number(v.duration) - frames / 25)).toBeLessThanOrEqual(1 / 25 + 1e-6);
    expect(a?.codec_name).toBe('aac');
    expect(Math.abs(Number(a.duration) - frames / 25)).toBeLessThan(0.1);
    const first = frameOf(path, 0, 'gray');
    const diffs = [11, 12, 13, 14, 15].map((n) => counterDiff(first, frameOf(REF, n, 'gray'), 320));
    expect(diffs.indexOf(Math.min(...diffs))).toBe(2);
    const rgb = frameOf(path, 20, 'rgb24');
    const at = (x: number, y: number) => [...rgb.subarray((y * 320 + x) * 3, (y * 320 + x) * 3 + 3)];
    const [r, g, b] = at(210, 110);
    expect(r).toBeGreaterThan(200);
    expect(g).toBeLessThan(60);
    expect(b).toBeLessThan(60);
    const src = frameOf(REF, inFrame + 20, 'rgb24');
    expect(src[(110 * 320 + 210) * 3 + 1] > 60 || src[(110 * 320 + 210) * 3 + 2] > 60).toBe(true); // not red in the source
  });

  it('never overwrites without being asked, and a cancelled export leaves nothing behind', async () => {
    writeFileSync(join(dir, 'taken.mp4'), 'keep me');
    await expect(exportClipNative({ input: REF, inT: 0, frames: 10, fps: 25, width: 320, height: 180, directory: dir, name: 'taken.mp4' })).rejects.toThrow(/already exists; nothing was written/);
    const demo = join(ROOT, 'fixtures/demo/footage.mp4');
    const ac = new AbortController();
    let seen = 0;
    await expect(
      exportClipNative({ input: demo, inT: 40, frames: 4000, fps: 25, width: 1280, height: 720, directory: dir, name: 'cancelled.mp4', signal: ac.signal, onProgress: (p) => ((seen = p), p > 0.02 && ac.abort()) }),
    ).rejects.toThrow(/cancelled; nothing was written/);
    expect(seen).toBeGreaterThan(0);
    expect(readdirSync(dir).sort()).toEqual(['ref-native.mp4', 'taken.mp4']);
  });
});

describe('native export: blend and sessions', () => {
  it('blends like ffmpeg\'s overlay filter (BT.709 conversion of the overlay) within one level on average where the overlay lies', () => {
    const w = 320;
    const h = 180;
    // Base picture and an overlay (discs and a translucent band) made by Debian's ffmpeg and by hand.
    const base = execFileSync('ffmpeg', ['-v', 'error', '-f', 'lavfi', '-i', `testsrc2=s=${w}x${h}:d=1`, '-frames:v', '1', '-pix_fmt', 'yuv420p', '-f', 'rawvideo', '-'], { maxBuffer: 1 << 24 });
    const rgba = new Uint8Array(w * h * 4);
    for (let y = 0; y < h; y++)
      for (let x = 0; x < w; x++) {
        if ((x - 100) ** 2 + (y - 90) ** 2 < 900) rgba.set([230, 40, 40, 255], (y * w + x) * 4);
        else if (y > 30 && y < 60 && x > 150) rgba.set([40, 90, 255, 110], (y * w + x) * 4);
      }
    writeFileSync(join(dir, 'base.yuv'), base);
    writeFileSync(join(dir, 'ov.rgba'), rgba);
    const theirs = execFileSync('ffmpeg', ['-v', 'error', '-f', 'rawvideo', '-pix_fmt', 'yuv420p', '-s', `${w}x${h}`, '-i', join(dir, 'base.yuv'), '-f', 'rawvideo', '-pix_fmt', 'rgba', '-s', `${w}x${h}`, '-i', join(dir, 'ov.rgba'),
      '-filter_complex', '[1:v]scale=out_color_matrix=bt709:out_range=tv,format=yuva420p[o];[0:v][o]overlay=format=yuv420[v]', '-map', '[v]', '-f', 'rawvideo', '-pix_fmt', 'yuv420p', '-'], { maxBuffer: 1 << 24 });
    const ours = new Uint8Array(base);
    blendRunsI420(ours, w, h, decodeRuns(encodeRuns(rgba, w, h)), 'bt709');
    expect(theirs.length).toBe(i420Size(w, h));
    // Compared where either blend changed the picture (elsewhere both must leave it alone).
    let sum = 0;
    let changed = 0;
    for (let i = 0; i < ours.length; i++) {
      if (ours[i] === base[i] && theirs[i] === base[i]) continue;
      changed++;
      sum += Math.abs(ours[i] - theirs[i]);
    }
    expect(changed).toBeGreaterThan(2000); // the overlay really is there
    expect(sum / changed).toBeLessThan(1); // 0.3 measured; BT.601 instead of 709 gives 5
    rmSync(join(dir, 'base.yuv'));
    rmSync(join(dir, 'ov.rgba'));
  });

  it('a session with a title card: card pictures first, then the in-frame; audio silent under the card; files only when finished', async () => {
    const probe = await probeFootageFile(REF);
    const w = 320;
    const h = 180;
    const card = 10;
    const frames = 30;
    const sessions = new NativeSessions();
    const req = { fileId: 'x', inT: probe.pts[13], frames, fps: 25, width: w, height: h, cardFrames: card, overlay: true, directory: dir, name: 'session-card.mp4' };
    const { sessionId, totalFrames } = await sessions.start(REF, req);
    expect(totalFrames).toBe(card + frames);
    const cardRgba = new Uint8Array(w * h * 4);
    for (let i = 0; i < w * h; i++) cardRgba.set([16, 22, 27, 255], i * 4);
    const cardWords = encodeRuns(cardRgba, w, h);
    const clear = encodeRuns(new Uint8Array(w * h * 4), w, h);
    const all = [...new Array(card).fill(cardWords), ...new Array(frames).fill(clear)];
    for (let k = 0; k < all.length; k += 8) await sessions.frames(sessionId, new Uint8Array(packBatch(all.slice(k, k + 8)).buffer));
    expect(readdirSync(dir).filter((f) => f.startsWith('session-card'))).toEqual([]); // only the temporary file so far
    const saved = await sessions.finish(sessionId);
    expect(saved.bytesWritten).toBeGreaterThan(1000);
    const info = JSON.parse(execFileSync('ffprobe', ['-v', 'error', '-count_frames', '-show_streams', '-of', 'json', saved.path], { encoding: 'utf8' }));
    const v = info.streams.find((s: { codec_type: string }) => s.codec_type === 'video');
    expect(Number(v.nb_read_frames)).toBe(card + frames);
    const first = frameOf(saved.path, 0, 'gray');
    // The card's #10161b: BT.709 luma 0.2126·16 + 0.7152·22 + 0.0722·27 ≈ 21 (ffmpeg's gray is full range).
    expect(Math.abs(first[90 * w + 160] - 21)).toBeLessThanOrEqual(3);
    const after = frameOf(saved.path, card, 'gray');
    const diffs = [11, 12, 13, 14, 15].map((n) => counterDiff(after, frameOf(REF, n, 'gray'), w));
    expect(diffs.indexOf(Math.min(...diffs))).toBe(2);
    // ffmpeg's astats: RMS level of the card's audio (silence) and of the clip's.
    const stats = (from: number, to: number) => {
      const r = execFileSync('sh', ['-c', `ffmpeg -v info -i '${saved.path}' -af atrim=${from}:${to},astats=measure_overall=RMS_level:measure_perchannel=none -f null - 2>&1`], { encoding: 'utf8' });
      const m = /RMS level dB: (-?[\d.]+|-inf)/.exec(r);
      return m ? (m[1] === '-inf' ? -Infinity : Number(m[1])) : NaN;
    };
    expect(stats(0.02, card / 25 - 0.05)).toBeLessThan(-60);
    expect(stats(card / 25 + 0.1, (card + frames) / 25)).toBeGreaterThan(-50);
  });

  it('a cancelled session and one fed a damaged batch leave nothing in the folder', async () => {
    const probe = await probeFootageFile(REF);
    const sessions = new NativeSessions();
    const before = readdirSync(dir).sort();
    // Cancel while frames stream in and the encoder holds back (large pictures, long clip).
    const demo = join(ROOT, 'fixtures/demo/footage.mp4');
    const a = await sessions.start(demo, { fileId: 'x', inT: 40, frames: 3000, fps: 25, width: 1280, height: 720, overlay: true, directory: dir, name: 'cancel-me.mp4' });
    const blank = new Uint8Array(packBatch(new Array(8).fill(encodeRuns(new Uint8Array(1280 * 720 * 4).fill(255, 0, 400_000), 1280, 720))).buffer);
    let encoded = 0;
    const feeding = (async () => {
      for (;;) encoded = (await sessions.frames(a.sessionId, blank)).encodedFrames;
    })().catch((e: Error) => e);
    await expect.poll(() => encoded, { timeout: 60_000, interval: 50 }).toBeGreaterThan(16);
    await sessions.cancel(a.sessionId);
    expect(String(await feeding)).toMatch(/cancelled|no export session/);
    const b = await sessions.start(REF, { fileId: 'x', inT: probe.pts[5], frames: 40, fps: 25, width: 320, height: 180, overlay: true, directory: dir, name: 'damaged.mp4' });
    await expect(sessions.frames(b.sessionId, new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8]))).rejects.toThrow(/not a batch of overlay frames/);
    await expect(sessions.finish(b.sessionId)).rejects.toThrow(/no export session/);
    await new Promise((r) => setTimeout(r, 200));
    expect(readdirSync(dir).sort()).toEqual(before);
  });
});
