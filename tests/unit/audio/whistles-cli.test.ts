import { afterEach, describe, expect, it, vi } from 'vitest';
import { command } from '../../../electron/cli/whistles.ts';

// Reference media made by Debian ffmpeg (fixtures/reference/audio/make-whistle-clip.sh):
// a single at 2.0 s, a double at 6.0 s, a single at 10.0 s.
const clip = new URL('../../../fixtures/reference/audio/whistle-clip.mp4', import.meta.url).pathname;

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  vi.spyOn(console, 'log').mockImplementation((...a) => void out.push(a.join(' ')));
  vi.spyOn(console, 'error').mockImplementation((...a) => void err.push(a.join(' ')));
  return { out, err };
}
afterEach(() => vi.restoreAllMocks());

describe('whistlemark whistles', () => {
  it('--embedded --json: the three whistles of the reference clip with time, duration, pattern, strength, Hz', async () => {
    const { out } = capture();
    expect(await command.run([clip, '--embedded', '--json'])).toBe(0);
    const r = JSON.parse(out.join('\n'));
    expect(r.engine).toBe('embedded');
    expect(r.candidates.map((c: { pattern: string }) => c.pattern)).toEqual(['single', 'double', 'single']);
    expect(r.candidates.map((c: { onset: number }) => Math.round(c.onset))).toEqual([2, 6, 10]);
  });
  it('table output names the footage time and blast kind', async () => {
    const { out } = capture();
    expect(await command.run([clip])).toBe(0);
    expect(out.join('\n')).toMatch(/3 whistle candidates/);
    expect(out.join('\n')).toMatch(/0:05\.99\d\s+0\.8\d s\s+double/);
  });
  it('refuses unknown options and two engines at once with the usage (exit 2)', async () => {
    const { err } = capture();
    expect(await command.run([clip, '--fast'])).toBe(2);
    expect(await command.run([clip, '--native', '--embedded'])).toBe(2);
    expect(err.join('\n')).toMatch(/unknown option --fast/);
  });
});
