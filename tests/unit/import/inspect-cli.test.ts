import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { coords, synthFrames, writeLong, writeWide } from './helpers/synthetic.ts';

const root = new URL('../../..', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'wm-inspect-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function inspect(...args: string[]) {
  const r = spawnSync('node', ['bin/whistlemark.mjs', 'inspect', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

describe('whistlemark inspect (spawned CLI)', () => {
  const synth = synthFrames({ rate: 25, periodS: 4, periods: 2 });

  it('wide tracking CSV: kind, layout, units, origin, periods, rate', () => {
    const p = join(dir, 'wide.csv');
    writeFileSync(p, writeWide(synth, coords({ unit: 'cm', origin: 'bottom_left' })));
    const r = inspect(p);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/kind:\s+tracking/);
    expect(r.out).toMatch(/layout:\s+wide/);
    expect(r.out).toMatch(/coordinates: cm, origin bottom-left/);
    expect(r.out).toMatch(/rate:\s+25 Hz/);
    expect(r.out).toMatch(/period 1:\s+frames 0\.\.99/);
    expect(r.out).toMatch(/period 2:\s+frames 100000\.\.100099 .* home attacks -x/);
    expect(r.out).toMatch(/import:\s+ok, 200 rows read/);
  });

  it('long tracking CSV with a broken row: the problem with file and line', () => {
    const p = join(dir, 'long.csv');
    const lines = writeLong(synth, coords({})).split('\n');
    [lines[100], lines[1000]] = [lines[1000], lines[100]]; // frame 43 moved up among frame 4's rows
    writeFileSync(p, lines.join('\n'));
    const r = inspect(p);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/layout:\s+long/);
    expect(r.out).toMatch(/FAILED/);
    expect(r.out).toMatch(/ERROR long\.csv, line 102, period 1 00:00\.16: Frame 4 of period 1 comes after frame 43: frames go backwards/);
  });

  it('an event log: clock style, teams, kinds', () => {
    const r = inspect('tests/unit/import/fixtures/events-demo-layout.csv');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/kind:\s+events/);
    expect(r.out).toMatch(/clock:\s+match clock continuing/);
    expect(r.out).toMatch(/teams:\s+home = Amber XI, away = Slate XI/);
    expect(r.out).toMatch(/kick_off 3/);
  });

  it('--json gives machine-readable output', () => {
    const r = inspect('tests/unit/import/fixtures/events-iso.json', '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.detection.mapping.clock).toBe('iso8601');
    expect(j.ok).toBe(true);
  });

  it('a file it cannot read: non-zero exit and a clear message', () => {
    const r = inspect(join(dir, 'missing.csv'));
    expect(r.code).not.toBe(0);
    expect(r.err).toMatch(/cannot read .*missing\.csv: no such file/);
  });

  it('a file that is neither tracking nor events: non-zero exit saying so', () => {
    const p = join(dir, 'notes.txt');
    writeFileSync(p, 'shopping list\nmilk\n');
    const r = inspect(p);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/Not recognised as tracking or an event log/);
  });

  // Reference clip made by Debian's ffmpeg (fixtures/reference, with its ffprobe table).
  const clip = join(root, 'fixtures/reference/cfr25.mp4');
  it.runIf(existsSync(clip))('footage: container, codecs, fps, frame count as ffprobe reports (ffprobe reference table)', async () => {
    const { readFileSync } = await import('node:fs');
    const ref = JSON.parse(readFileSync(clip + '.ffprobe.json', 'utf8'));
    const frames = (ref.frames ?? ref.packets ?? []).filter((f: { media_type?: string; codec_type?: string }) => (f.media_type ?? f.codec_type ?? 'video') === 'video').length;
    const r = inspect(clip);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/kind:\s+footage/);
    expect(r.out).toMatch(/container:\s+\S+/);
    expect(r.out).toMatch(/frame rate:\s+25\.000 fps nominal/);
    if (frames) expect(r.out).toMatch(new RegExp(`frames:\\s+${frames} `));
  });
});
