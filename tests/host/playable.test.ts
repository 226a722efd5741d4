/**
 * Playable copies of footage Chromium cannot open (MPEG-TS): remuxed into MP4 without
 * re-encoding, by Debian's native ffmpeg and by the embedded ffmpeg.wasm core; the copy's
 * frames, read back by Debian's ffprobe (the outside reference), are the original's frames
 * at the same times relative to the first, and its decoded pictures are the original's.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { playableCopy } from '../../electron/host/footage/playable.ts';
import { probeFootageFile } from '../../electron/host/footage/probe.ts';
import { createHostService } from '../../electron/host/host-service.ts';

const REF = new URL('../../fixtures/reference/', import.meta.url).pathname;
const scratch = mkdtempSync(join(tmpdir(), 'wm-playable-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** ffprobe's video frame times, relative to the first (Debian ffmpeg 5.1). */
function ffprobeRelative(file: string): number[] {
  const out = execFileSync('ffprobe', ['-v', 'error', '-select_streams', 'v:0', '-show_entries', 'frame=pts_time', '-of', 'csv=p=0', file], { encoding: 'utf8' });
  const t = out.trim().split('\n').map(Number).sort((a, b) => a - b);
  return t.map((v) => Math.round((v - t[0]) * 1e6) / 1e6);
}
/** MD5 of every decoded picture, in presentation order (Debian ffmpeg -f framemd5). */
function pictureMd5s(file: string): string[] {
  const out = execFileSync('ffmpeg', ['-v', 'error', '-i', file, '-map', '0:v:0', '-f', 'framemd5', '-'], { encoding: 'utf8' });
  return out.split('\n').filter((l) => l && !l.startsWith('#')).map((l) => l.split(',').pop()!.trim());
}

describe('playableCopy', () => {
  it('leaves MP4, MOV and Matroska alone', async () => {
    for (const f of ['cfr25.mp4', 'ntsc.mov', 'vfr.mkv']) {
      const probe = await probeFootageFile(REF + f);
      expect(await playableCopy(REF + f, probe, join(scratch, 'none'))).toEqual({ path: REF + f, remuxed: false });
    }
  });

  for (const mode of ['native', 'embedded'] as const) {
    it(`MPEG-TS with a 10 s start offset -> MP4 with the same frames (${mode} ffmpeg)`, async () => {
      const src = REF + 'codeoffset.m2t';
      const probe = await probeFootageFile(src);
      expect(probe.startTime).toBeGreaterThan(10);
      const dir = join(scratch, mode);
      const copy = await playableCopy(src, probe, dir, { embeddedOnly: mode === 'embedded' });
      expect(copy).toMatchObject({ remuxed: true, by: mode });
      expect(copy.path.startsWith(dir)).toBe(true);
      // Same frame times as ffprobe gives for the original, and the same decoded pictures.
      expect(ffprobeRelative(copy.path)).toEqual(ffprobeRelative(src));
      expect(pictureMd5s(copy.path)).toEqual(pictureMd5s(src));
      expect(copy.mediaOffset).toBeGreaterThanOrEqual(0);
      expect(copy.mediaOffset).toBeLessThan(1);
      // Asked again: the cached copy, untouched.
      const before = statSync(copy.path).mtimeMs;
      const again = await playableCopy(src, probe, dir);
      expect(again).toMatchObject({ path: copy.path, by: 'cache', mediaOffset: copy.mediaOffset });
      expect(statSync(copy.path).mtimeMs).toBe(before);
    }, 120_000);
  }

  it('through the host service: the original name and path, the copy at the URL', async () => {
    const { api } = createHostService({ mode: 'browser', fileUrl: (id, name) => `/files/${id}/${name}`, playableCacheDir: join(scratch, 'service') });
    const [file] = await api.openPaths([REF + 'codeoffset.m2t']);
    const p = await api.playableFootage(file.fileId);
    expect(p).toMatchObject({ name: 'codeoffset.m2t', path: REF + 'codeoffset.m2t', remuxed: true });
    expect(p.url).not.toBe(file.url);
    const [mp4] = await api.openPaths([REF + 'cfr25.mp4']);
    expect(await api.playableFootage(mp4.fileId)).toMatchObject({ url: mp4.url, remuxed: false });
    await expect(api.playableFootage('0'.repeat(32))).rejects.toThrow(/no opened file has id/);
  }, 120_000);
});
