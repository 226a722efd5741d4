/**
 * `whistlemark export` as a child process on a project file made the honest way:
 * `whistlemark sync` on the demo writes it (tracking, events, footage with its
 * fingerprint), then engine/project-file's reader and writer add what the Sync and Reels
 * screens would: the footage clock fit and pitch registration from the demo truth
 * (tests/demo-truth-rows.ts) and a reel with one clip around the demo's corner.
 * The MP4 is checked with Debian's ffprobe; the captions with webvtt-parser (npm registry).
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { readProjectFile, writeProjectFile, type FootageReference, type ProjectTables } from '../../engine/project-file/index.ts';
import { trueToTracking, truth, truthFootageFit, truthRegistration } from '../demo-truth-rows.ts';

const require = createRequire(import.meta.url);
const { WebVTTParser } = require('webvtt-parser') as { WebVTTParser: new () => { parse(s: string, mode?: string): { errors: unknown[] } } };
const ROOT = resolve(new URL('../..', import.meta.url).pathname);
const DEMO = join(ROOT, 'fixtures/demo/');
const SHOTS = join(ROOT, 'test-results');
const scratch = mkdtempSync(join(tmpdir(), 'wm-cli-export-'));
const corner = truth.restarts.find((r) => r.kind === 'corner')!;
const cornerTrk = trueToTracking(corner.period, corner.playedT);

function cli(args: string[]) {
  return spawnSync('node', ['bin/whistlemark.mjs', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 240_000 });
}

/** The synced demo project plus a footage fit, registration and one reel of `clips`. */
async function project(name: string, clips: { from: number; to: number; title: string }[], footagePath?: string): Promise<string> {
  const { manifest, tables } = await readProjectFile(readFileSync(join(scratch, 'synced.wmatch')));
  const t = tables as ProjectTables;
  const projectId = t.projects[0].id as number;
  const footage = t.sources.find((s) => s.kind === 'footage')!;
  const maxId = (rows: Record<string, unknown>[]) => rows.reduce((m, r) => Math.max(m, Number(r.id ?? 0)), 0);
  t.clockFits.push({ id: maxId(t.clockFits) + 1, projectId, sourceId: footage.id, fit: truthFootageFit(), createdAt: 2 });
  t.pitchRegistrations.push({ id: maxId(t.pitchRegistrations) + 1, projectId, footageSourceId: footage.id, data: truthRegistration(0, truth.footage.frameCount - 1), updatedAt: 2 });
  t.reels.push({ id: 1, projectId, title: 'Corners against', createdAt: 3 });
  clips.forEach((c, i) => t.clips.push({ id: i + 1, projectId, reelId: 1, order: i, period: corner.period, from: c.from, to: c.to, title: c.title, layers: ['dots', 'ball', 'offside'] }));
  const refs: FootageReference[] = manifest.footage.map((f) => (footagePath ? { ...f, path: footagePath } : f));
  const path = join(scratch, name);
  writeFileSync(path, await writeProjectFile(t, { writtenBy: 'cli-export test', databaseVersion: manifest.databaseVersion, footage: refs }));
  return path;
}

beforeAll(() => {
  const r = cli(['sync', DEMO + 'tracking.csv', DEMO + 'events.csv', DEMO + 'footage.mp4', '--project', join(scratch, 'synced.wmatch')]);
  expect(r.status, r.stderr).toBe(0);
}, 120_000);
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe('whistlemark export', () => {
  it('writes the MP4 with audio, captions and sidecars of a one-clip reel, and then refuses to overwrite them', async () => {
    const file = await project('one.wmatch', [{ from: cornerTrk - 1.5, to: cornerTrk + 2.5, title: 'Corner' }]);
    const out = join(scratch, 'out');
    const r = cli(['export', '--project', file, '--reel', 'Corners against', '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/clip 1\/1 +\d+ %/); // progress on stderr
    const files = readdirSync(out).sort();
    expect(files).toEqual(['corners-against-01-corner.mp4', 'corners-against-01-corner.vtt', 'corners-against.csv', 'corners-against.json'].sort());
    const sidecar = JSON.parse(readFileSync(join(out, 'corners-against.json'), 'utf8'));
    const clip = sidecar.clips[0];
    // The clip's in/out landed on the requested tracking span (within one 25 Hz frame).
    expect(Math.abs(clip.in.trackingS - (cornerTrk - 1.5))).toBeLessThanOrEqual(1 / 25 + 1e-3);
    expect(Math.abs(clip.out.trackingS - (cornerTrk + 2.5))).toBeLessThanOrEqual(1 / 25 + 1e-3);
    // Debian ffprobe: H.264 with an audio stream, duration = out − in within one frame.
    const mp4 = join(out, 'corners-against-01-corner.mp4');
    const info = JSON.parse(spawnSync('ffprobe', ['-v', 'error', '-show_streams', '-show_format', '-of', 'json', mp4], { encoding: 'utf8' }).stdout);
    expect(info.streams.map((s: { codec_name: string }) => s.codec_name)).toContain('h264');
    expect(info.streams.some((s: { codec_type: string }) => s.codec_type === 'audio')).toBe(true);
    expect(Math.abs(Number(info.format.duration) - (clip.out.footageS - clip.in.footageS))).toBeLessThanOrEqual(1 / 25 + 1e-6);
    expect(new WebVTTParser().parse(readFileSync(mp4.replace(/\.mp4$/, '.vtt'), 'utf8'), 'metadata').errors).toEqual([]);
    expect(readFileSync(join(out, 'corners-against.csv'), 'utf8').split('\n').length).toBeGreaterThan(1);

    // A frame from the middle, to look at (Debian ffmpeg), and the progress as printed.
    mkdirSync(SHOTS, { recursive: true });
    writeFileSync(join(SHOTS, 'cli-export-stderr.txt'), r.stderr);
    spawnSync('ffmpeg', ['-v', 'error', '-y', '-ss', '2', '-i', mp4, '-frames:v', '1', join(SHOTS, 'cli-export-frame.png')]);
    expect(existsSync(join(SHOTS, 'cli-export-frame.png'))).toBe(true);
    const before = readFileSync(mp4);
    const again = cli(['export', '--project', file, '--reel', 'corners against', '--out', out]);
    expect(again.status).toBe(1);
    expect(again.stderr).toMatch(/already holds corners-against-01-corner\.mp4.*--replace/s);
    expect(readFileSync(mp4).equals(before)).toBe(true);
  }, 240_000);

  it('names the reels when the asked one is not there', async () => {
    const file = await project('names.wmatch', [{ from: cornerTrk, to: cornerTrk + 1, title: 'Corner' }]);
    const out = join(scratch, 'none');
    const r = cli(['export', '--project', file, '--reel', 'Free kicks', '--out', out]);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('no reel titled "Free kicks". Reels in this project: "Corners against"');
    expect(existsSync(out)).toBe(false);
  }, 120_000);

  it('says which footage file is missing and what to do', async () => {
    const file = await project('moved.wmatch', [{ from: cornerTrk, to: cornerTrk + 1, title: 'Corner' }], join(scratch, 'gone', 'footage.mp4'));
    const r = cli(['export', '--project', file, '--reel', 'Corners against', '--out', join(scratch, 'moved-out')]);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain(`footage file ${join(scratch, 'gone', 'footage.mp4')} is missing`);
    expect(r.stderr).toMatch(/relink the footage/);
  }, 120_000);

  it('Ctrl+C cancels and leaves no half-written file', async () => {
    const file = await project('long.wmatch', [{ from: cornerTrk - 20, to: cornerTrk + 20, title: 'Long corner' }]);
    const out = join(scratch, 'cancelled');
    const child = spawn('node', ['bin/whistlemark.mjs', 'export', '--project', file, '--reel', 'Corners against', '--out', out], { cwd: ROOT });
    let stderr = '';
    let sent = false;
    child.stderr.on('data', (d: Buffer) => {
      stderr += d.toString();
      if (!sent && /clip 1\/1/.test(stderr)) {
        sent = true;
        child.kill('SIGINT');
      }
    });
    const code = await new Promise<number | null>((res) => child.on('exit', (c) => res(c)));
    expect(sent, stderr).toBe(true);
    expect(code, stderr).toBe(130);
    expect(stderr).toContain('cancelled');
    expect(existsSync(out) ? readdirSync(out) : []).toEqual([]); // no clip, no temporary file
  }, 240_000);
});
