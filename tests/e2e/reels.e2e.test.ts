/**
 * Reels in the built app: a reel of every corner of the demo, exported to a folder; the
 * MP4, its WebVTT captions and the reel's CSV/JSON sidecars appear; the MP4 is checked with
 * Debian's ffprobe and a frame of it is extracted with ffmpeg for looking at.
 *
 * Set-up (said plainly): the footage and event-log clock fits and the pitch registration
 * are written from the simulator's truth (fixtures/demo/truth.json, truth-homography.json)
 * straight into the app's IndexedDB (tests/e2e/setup-rows.ts), because the Sync and Watch screens that make them are
 * built elsewhere and the export must be tested without them.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SHOTS, shot, startApp, type RunningApp } from './harness.ts';
import { demoProject, storeDemoRows } from './setup-rows.ts';
import { truth, truthEventFit, truthFootageFit, truthRegistration } from '../demo-truth-rows.ts';

const require = createRequire(import.meta.url);
const { WebVTTParser } = require('webvtt-parser') as { WebVTTParser: new () => { parse(s: string, mode?: string): { cues: { startTime: number; endTime: number; text: string }[]; errors: unknown[] } } };

let app: RunningApp;
const out = mkdtempSync(join(tmpdir(), 'wm-reels-out-'));
const out2 = mkdtempSync(join(tmpdir(), 'wm-reels-out2-'));
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
  rmSync(out, { recursive: true, force: true });
  rmSync(out2, { recursive: true, force: true });
});

describe('Reels screen', () => {
  it('builds a reel of all corners, exports it with sidecars, and the frame looks right', { timeout: 400_000 }, async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 200_000 });

    // Truth rows in place of the Sync/Watch results (see the header).
    const rows = { footageFit: truthFootageFit(), eventFit: truthEventFit(), registration: truthRegistration(0, truth.footage.frameCount - 1) };
    await storeDemoRows(page, await demoProject(page), rows);

    await page.keyboard.press('Alt+5');
    await page.getByRole('heading', { name: 'Reels', exact: true, level: 1 }).waitFor();
    await page.getByRole('button', { name: 'Start a reel' }).click();
    const builder = page.getByRole('region', { name: 'Build clips' });
    await builder.waitFor();
    const corners = truth.restarts.filter((r) => r.kind === 'corner').length;
    await expect.poll(() => builder.getByRole('list', { name: 'Matching events' }).getByRole('listitem').count()).toBe(corners);
    await builder.getByRole('button', { name: corners === 1 ? 'Add 1 clip' : `Add ${corners} clips` }).click();
    const list = page.getByRole('list', { name: 'Clips in order' });
    await expect.poll(() => list.getByRole('listitem').count()).toBe(corners);
    // A note and one more layer on the first clip (each an undoable step).
    await list.getByLabel('Note of clip 1').fill('Near-post run: who picks up the late runner?');
    await list.getByLabel('Title of clip 1').click();
    await list.getByRole('group', { name: 'Overlay layers of clip 1' }).getByRole('button', { name: 'Trails' }).click();
    await expect.poll(() => list.getByRole('group', { name: 'Overlay layers of clip 1' }).getByRole('button', { name: 'Trails' }).getAttribute('aria-pressed')).toBe('true');
    await page.keyboard.press('Control+z');
    await expect.poll(() => list.getByRole('group', { name: 'Overlay layers of clip 1' }).getByRole('button', { name: 'Trails' }).getAttribute('aria-pressed')).toBe('false');
    await list.getByRole('group', { name: 'Overlay layers of clip 1' }).getByRole('button', { name: 'Trails' }).click();
    await shot(page, 'reels-01-corners');

    const exp = page.getByRole('region', { name: 'Export' });
    // The built-in encoder is the default; Debian's ffmpeg is on this machine, so the native path is offered.
    await expect.poll(() => exp.getByLabel('Encoder').inputValue()).toBe('embedded');
    await exp.getByLabel('Encoder').selectOption('native');
    await exp.getByLabel('Export folder').fill(out);
    await exp.getByRole('button', { name: /Export reel/ }).click();
    const job = exp.getByRole('list', { name: 'Export queue' }).getByRole('listitem').first();
    // Progress with time left while it runs (caught when the poll sees it), then done.
    let sawProgress = false;
    await expect
      .poll(
        async () => {
          const state = await job.getAttribute('data-state');
          if (state === 'running' && !sawProgress && (await job.getByText(/s left/).count())) {
            sawProgress = true;
            await shot(page, 'reels-02-exporting');
          }
          return state === 'queued' || state === 'running' ? state : `${state}: ${await job.innerText()}`;
        },
        { timeout: 170_000, interval: 300 },
      )
      .toMatch(/^done/);
    expect(await job.innerText()).toContain('ffmpeg on this machine');
    await shot(page, 'reels-03-exported');

    const files = readdirSync(out).sort();
    expect(files.filter((f) => f.endsWith('.mp4'))).toHaveLength(corners);
    expect(files).toContain('corners.csv');
    expect(files).toContain('corners.json');
    expect(files.filter((f) => f.startsWith('.'))).toEqual([]); // no temporary leftovers
    const mp4 = join(out, files.find((f) => f.endsWith('.mp4'))!);
    const vtt = mp4.replace(/\.mp4$/, '.vtt');
    expect(existsSync(vtt)).toBe(true);
    expect(new WebVTTParser().parse(readFileSync(vtt, 'utf8'), 'metadata').errors).toEqual([]);
    const sidecar = JSON.parse(readFileSync(join(out, 'corners.json'), 'utf8'));
    expect(sidecar.clips[0].note).toBe('Near-post run: who picks up the late runner?');
    expect(sidecar.clips[0].layers).toContain('trails');
    expect(sidecar.clips[0].events.map((e: { kind: string }) => e.kind)).toContain('corner');

    // Debian's ffprobe: H.264 + audio, duration = out − in (sidecar) within one frame.
    const info = JSON.parse(execFileSync('ffprobe', ['-v', 'error', '-show_streams', '-show_format', '-of', 'json', mp4], { encoding: 'utf8' }));
    expect(info.streams.map((s: { codec_name: string }) => s.codec_name)).toEqual(expect.arrayContaining(['h264']));
    expect(info.streams.some((s: { codec_type: string }) => s.codec_type === 'audio')).toBe(true);
    expect(Math.abs(Number(info.format.duration) - sidecar.clips[0].durationS)).toBeLessThanOrEqual(1 / 25 + 1e-6);
    const frame = join(SHOTS, 'reels-04-exported-frame.png');
    execFileSync('ffmpeg', ['-v', 'error', '-y', '-ss', String(sidecar.clips[0].durationS / 2), '-i', mp4, '-frames:v', '1', frame]);
    expect(existsSync(frame)).toBe(true);

    // The same reel through the built-in encoder, with title cards: the card comes first,
    // and after it the picture is the native file's picture (both paths draw the same frame).
    await exp.getByLabel('Encoder').selectOption('embedded');
    await exp.getByLabel(/Title card before each clip/).check();
    await exp.getByLabel('Export folder').fill(out2);
    await exp.getByRole('button', { name: /Export reel/ }).click();
    const job2 = exp.getByRole('list', { name: 'Export queue' }).getByRole('listitem').first();
    await expect.poll(async () => `${await job2.getAttribute('data-state')}: ${await job2.innerText()}`, { timeout: 240_000, interval: 500 }).toMatch(/^done.*built-in encoder, title cards/s);
    const mp4b = join(out2, basename(mp4));
    const infoB = JSON.parse(execFileSync('ffprobe', ['-v', 'error', '-show_format', '-of', 'json', mp4b], { encoding: 'utf8' }));
    expect(Math.abs(Number(infoB.format.duration) - (sidecar.clips[0].durationS + 2))).toBeLessThanOrEqual(1 / 25 + 1e-6);
    const sidecarB = JSON.parse(readFileSync(join(out2, 'corners.json'), 'utf8'));
    expect(sidecarB.clips[0].durationS).toBe(sidecar.clips[0].durationS);
    const gray = (file: string, t: number) => execFileSync('ffmpeg', ['-v', 'error', '-ss', t.toFixed(3), '-i', file, '-frames:v', '1', '-f', 'rawvideo', '-pix_fmt', 'gray', '-'], { maxBuffer: 1 << 24 });
    const cardPic = gray(mp4b, 1);
    expect(cardPic.reduce((a, v) => a + v, 0) / cardPic.length).toBeLessThan(40); // the dark card
    execFileSync('ffmpeg', ['-v', 'error', '-y', '-ss', '1', '-i', mp4b, '-frames:v', '1', join(SHOTS, 'reels-05-title-card.png')]);
    const mid = Math.round((sidecar.clips[0].durationS / 2) * 25) / 25 + 0.5 / 25;
    const a = gray(mp4, mid);
    const b = gray(mp4b, mid + 2);
    let diff = 0;
    for (let i = 0; i < a.length; i++) diff += Math.abs(a[i] - b[i]);
    expect(diff / a.length).toBeLessThan(4); // two encodes of the same picture: only coding noise apart
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });
});
