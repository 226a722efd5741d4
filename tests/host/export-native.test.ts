/**
 * The native export path (electron/host/export/native-export.ts) with Debian's ffmpeg 5.1,
 * checked with Debian's ffprobe/ffmpeg on the reference clip with a burned-in frame counter
 * (fixtures/reference/cfr25.mp4, make-reference.sh): frame count and duration = out − in,
 * first frame = in-frame, audio kept, overlay frames laid over at their pixels; a cancelled
 * export and a refused overwrite leave nothing behind.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { probeFootageFile } from '../../electron/host/footage/probe.ts';
import { exportClipNative } from '../../electron/host/export/native-export.ts';
import { encodeRuns } from '../../engine/overlay-frames/index.ts';

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
