import { afterEach, describe, expect, it, vi } from 'vitest';
import { command } from '../../../electron/cli/cuts.ts';

// Reference media made by Debian ffmpeg (fixtures/reference/make-cuts.sh): cuts at 2.0, 4.0,
// 6.0, 7.6 and 9.6 s (frames 50, 100, 150, 190, 240); no sound.
const clip = new URL('../../../fixtures/reference/cuts.mp4', import.meta.url).pathname;

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  vi.spyOn(console, 'log').mockImplementation((...a) => void out.push(a.join(' ')));
  vi.spyOn(console, 'error').mockImplementation((...a) => void err.push(a.join(' ')));
  return { out, err };
}
afterEach(() => vi.restoreAllMocks());

describe('whistlemark cuts', () => {
  it('--json: the known cuts with frame and time; 2–20 s stretches between cuts are proposed as replays (the 1.6 s shot is too short)', async () => {
    const { out } = capture();
    expect(await command.run([clip, '--native', '--json'])).toBe(0);
    const r = JSON.parse(out.join('\n'));
    expect(r.cuts.map((c: { frame: number }) => c.frame)).toEqual([50, 100, 150, 190, 240]);
    expect(r.nonLive.map((p: { fromT: number; toT: number; kind: string }) => [p.kind, p.fromT, p.toT])).toEqual([
      ['replay', 2, 4],
      ['replay', 7.6, 9.6],
    ]);
  });
  it('table output names the time, frame and the proposals', async () => {
    const { out } = capture();
    expect(await command.run([clip])).toBe(0);
    const text = out.join('\n');
    expect(text).toMatch(/5 cuts in 290 frames/);
    expect(text).toMatch(/0:07\.600\s+190/);
    expect(text).toMatch(/no sound, so no whistle cues/);
    expect(text).toMatch(/proposed non-live stretches: 2/);
  });
  it('refuses unknown options with the usage (exit 2)', async () => {
    const { err } = capture();
    expect(await command.run([clip, '--fast'])).toBe(2);
    expect(err.join('\n')).toMatch(/unknown option --fast/);
  });
});
