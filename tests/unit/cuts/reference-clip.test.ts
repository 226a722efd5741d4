import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { scanFootageCuts } from '../../../electron/host/footage/frames-scan.ts';

// Reference media made by Debian's ffmpeg (fixtures/reference/make-cuts.sh): six shots of
// ffmpeg's test sources joined end to end; new shots start at frames 50, 100, 150, 190, 240.
// Inside: a fast pan (shot 3), a fade to black (shot 4), a pattern changing every frame (shot 6).
const clip = new URL('../../../fixtures/reference/cuts.mp4', import.meta.url).pathname;
const KNOWN_CUTS = [50, 100, 150, 190, 240];

/** ffmpeg's own scene score (the outside reference): frames where select='gt(scene,0.3)' fires. */
function ffmpegSceneCuts(file: string): number[] {
  const r = spawnSync('ffmpeg', ['-hide_banner', '-nostdin', '-i', file, '-an', '-vf', "select='gt(scene,0.3)',showinfo", '-f', 'null', '-'], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`ffmpeg scene reference failed: ${r.stderr}`);
  // showinfo prints each selected frame on stderr.
  return [...r.stderr.matchAll(/pts_time:([\d.]+)/g)].map((m) => Math.round(Number(m[1]) * 25));
}

describe('cuts on the reference clip made by Debian ffmpeg', () => {
  it('native ffmpeg decode: exactly the known cuts, and the same list as ffmpeg’s scene score > 0.3', async () => {
    const r = await scanFootageCuts(clip, { engine: 'native' });
    expect(r.frames).toBe(290);
    const ours = r.cuts.map((c) => c.frame);
    expect(ours).toEqual(KNOWN_CUTS);
    expect(r.cuts.map((c) => c.t)).toEqual(KNOWN_CUTS.map((f) => f / 25));
    expect(ffmpegSceneCuts(clip)).toEqual(ours);
  });

  it('embedded ffmpeg.wasm decode gives the same cuts', async () => {
    const r = await scanFootageCuts(clip, { engine: 'embedded' });
    expect(r.engine).toBe('embedded');
    expect(r.cuts.map((c) => c.frame)).toEqual(KNOWN_CUTS);
  });

  it('says what is wrong with a missing file', async () => {
    await expect(scanFootageCuts('/nonexistent/match.mp4', { engine: 'native' })).rejects.toThrow(/match\.mp4: file not found/);
  });
});
