/**
 * The export queue across a restart, in the built app on the demo match: a reel of three
 * short clips (marked by in/out points) is exported; once the first clip's MP4 is on disk
 * and the second is being encoded the page is reloaded (the renderer restarts, its encoder
 * with it). The job must carry on by itself with the second clip, leave the first file as
 * it was, and end with exactly the clips' MP4 + WebVTT files and the reel's CSV + JSON,
 * each MP4 decodable by Debian's ffprobe at its planned length. Then a cancel in the middle
 * of a clip: only whole files stay, the job says cancelled, and the reel exports again.
 *
 * Set-up: the clock fits and pitch registration come from the simulator's truth
 * (tests/demo-truth-rows.ts) through tests/e2e/setup-rows.ts, standing in for Sync and Watch.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { truth, truthEventFit, truthFootageFit, truthRegistration } from '../demo-truth-rows.ts';
import { shot, startApp, type RunningApp } from './harness.ts';
import { demoProject, storeDemoRows } from './setup-rows.ts';

let app: RunningApp;
const scratch = mkdtempSync(join(tmpdir(), 'wm-e2e-resume-'));
beforeAll(async () => {
  app = await startApp();
}, 60_000);
afterAll(async () => {
  await app?.close();
  rmSync(scratch, { recursive: true, force: true });
});

// Three short clips in the first period (match clock); the second is the longest, so the
// screen change and the reload both land while it is being encoded.
const MARKS = [
  { inT: '0:20', outT: '0:23' },
  { inT: '0:40', outT: '0:48' },
  { inT: '1:10', outT: '1:13' },
];
const FRAME_S = 1 / truth.footage.fps;

const listing = (dir: string) => readdirSync(dir).sort();
const jobRow = (page: Page) => page.getByRole('region', { name: 'Export' }).getByRole('list', { name: 'Export queue' }).getByRole('listitem').first();
const stateOf = async (job: Locator) => `${await job.getAttribute('data-state')}: ${await job.innerText()}`;

/** Debian's ffprobe: the file decodes (video stream counted frame by frame) and its length. */
function probe(path: string): { codec: string; frames: number; durationS: number } {
  const info = JSON.parse(execFileSync('ffprobe', ['-v', 'error', '-count_frames', '-select_streams', 'v:0', '-show_entries', 'stream=codec_name,nb_read_frames:format=duration', '-of', 'json', path], { encoding: 'utf8' }));
  return { codec: info.streams[0].codec_name, frames: Number(info.streams[0].nb_read_frames), durationS: Number(info.format.duration) };
}

async function exportInto(page: Page, dir: string) {
  const exp = page.getByRole('region', { name: 'Export' });
  await exp.getByLabel('Export folder').fill(dir);
  await exp.getByRole('button', { name: /Export reel/ }).click();
}

describe('export queue across a restart', () => {
  let names: string[] = [];

  it('builds a reel of three marked clips on the demo', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 200_000 });
    await storeDemoRows(page, await demoProject(page), { footageFit: truthFootageFit(), eventFit: truthEventFit(), registration: truthRegistration(0, truth.footage.frameCount - 1) });
    await page.keyboard.press('Alt+5');
    await page.getByRole('heading', { name: 'Reels', exact: true, level: 1 }).waitFor();
    await page.getByRole('button', { name: 'Start a reel' }).click();
    const title = page.getByLabel('Reel title');
    await title.fill('Resume check');
    await title.press('Enter');
    for (const m of MARKS) {
      await page.getByLabel('In point').fill(m.inT);
      await page.getByLabel('Out point').fill(m.outT);
      await page.getByRole('button', { name: 'Add marked clip' }).click();
    }
    const list = page.getByRole('list', { name: 'Clips in order' });
    await expect.poll(() => list.getByRole('listitem').count()).toBe(3);
    await expect.poll(() => page.getByRole('button', { name: 'Export reel (3 clips)' }).isEnabled(), { timeout: 30_000 }).toBe(true);
  }, 240_000);

  it('resumes after a reload in the second clip, keeps the first file and writes only whole files', async () => {
    const { page } = app;
    const dir = join(scratch, 'resume');
    execFileSync('mkdir', ['-p', dir]);
    await exportInto(page, dir);
    const job = jobRow(page);
    // Wait for the first clip's MP4 on disk and the job on the second clip.
    let first = '';
    await expect
      .poll(
        async () => {
          first = listing(dir).find((f) => /-01-.*\.mp4$/.test(f)) ?? '';
          const text = await stateOf(job);
          return first && /-02-.*\.mp4/.test(text) ? 'second clip' : text;
        },
        { timeout: 180_000, interval: 200 },
      )
      .toBe('second clip');
    // Leaving Reels and coming back is not a restart: the job stays running on the second
    // clip, is not called resumed, and its live progress still shows.
    await page.keyboard.press('Alt+4');
    await page.getByRole('heading', { name: 'Reels', exact: true, level: 1 }).waitFor({ state: 'detached' });
    await page.keyboard.press('Alt+5');
    await expect.poll(async () => ((await stateOf(job)).match(/^running: [\s\S]*s left · .*-02-/) ? 'still on the second clip' : stateOf(job)), { timeout: 30_000, interval: 200 }).toBe('still on the second clip');
    expect(await job.innerText()).not.toMatch(/resumed/);
    const before = statSync(join(dir, first));
    // (the native encoder writes the clip under a hidden temporary name until it is whole)
    expect(listing(dir).some((f) => /-02-/.test(f) && !f.startsWith('.'))).toBe(false);
    await page.reload();

    // After the restart: the job carries on by itself and says so (the app's status line
    // on any screen, the job's row on Reels).
    await page.getByRole('status').filter({ hasText: 'An export cut off by the restart resumes with its next clip' }).waitFor({ timeout: 60_000 });
    const resumed = jobRow(page);
    await expect.poll(() => stateOf(resumed), { timeout: 60_000, interval: 200 }).toMatch(/^running: [\s\S]*resumed after a restart: 2 of 3 clips left/);
    await expect.poll(() => resumed.getByText(/s left · .*-02-/).count(), { timeout: 60_000, interval: 200 }).toBe(1);
    await shot(page, 'export-resume-01-resumed');
    await expect.poll(() => stateOf(resumed), { timeout: 240_000, interval: 500 }).toMatch(/^done/);
    await shot(page, 'export-resume-02-done');
    expect(await resumed.innerText()).toMatch(/3 clips written to .*whole-reel file was left out after the resume/);

    names = listing(dir);
    const mp4 = names.filter((f) => f.endsWith('.mp4'));
    expect(mp4.map((f) => f.replace(/-\d\d-.*/, '')).every((s) => s === 'resume-check')).toBe(true);
    expect(names).toEqual([...mp4.flatMap((f) => [f, f.replace(/\.mp4$/, '.vtt')]), 'resume-check.csv', 'resume-check.json'].sort());
    expect(mp4).toHaveLength(3);
    expect(names.filter((f) => f.startsWith('.') || f.includes('partial'))).toEqual([]);
    const after = statSync(join(dir, first));
    expect({ ino: after.ino, mtimeMs: after.mtimeMs, size: after.size }).toEqual({ ino: before.ino, mtimeMs: before.mtimeMs, size: before.size });

    // Each clip decodes in full and lasts as planned (the reel's JSON sidecar) within one frame.
    const sidecar = JSON.parse(readFileSync(join(dir, 'resume-check.json'), 'utf8')) as { clips: { durationS: number }[] };
    expect(sidecar.clips).toHaveLength(3);
    mp4.forEach((f, i) => {
      const p = probe(join(dir, f));
      console.log(`${f}: ${p.codec}, ${p.frames} frames, ${p.durationS.toFixed(3)} s (planned ${sidecar.clips[i].durationS.toFixed(3)} s)`);
      expect(p.codec).toBe('h264');
      expect(Math.abs(p.durationS - sidecar.clips[i].durationS)).toBeLessThanOrEqual(FRAME_S + 1e-6);
      expect(Math.abs(p.frames * FRAME_S - sidecar.clips[i].durationS)).toBeLessThanOrEqual(FRAME_S + 1e-6);
    });
  }, 480_000);

  it('cancel in the middle of a clip leaves only whole files; the reel exports again', async () => {
    const { page } = app;
    const dir = join(scratch, 'cancel');
    execFileSync('mkdir', ['-p', dir]);
    await exportInto(page, dir);
    const job = jobRow(page);
    await expect.poll(async () => ((await stateOf(job)).match(/^running: [\s\S]*s left · .*-02-/) ? 'in clip 2' : stateOf(job)), { timeout: 180_000, interval: 200 }).toBe('in clip 2');
    await job.getByRole('button', { name: 'Cancel' }).click();
    await expect.poll(() => stateOf(job), { timeout: 60_000, interval: 200 }).toMatch(/^cancelled: [\s\S]*the clip being encoded was not written/);
    await shot(page, 'export-resume-03-cancelled');
    // Only the first clip, whole: no second clip, no temporary names.
    const left = listing(dir);
    expect(left).toEqual(names.filter((f) => /-01-/.test(f)));
    const p = probe(join(dir, left.find((f) => f.endsWith('.mp4'))!));
    expect(p.frames).toBeGreaterThan(0);

    // Start again: the first clip's files exist, so the app asks before replacing them.
    await page.getByRole('button', { name: 'Export reel (3 clips)' }).click();
    await page.getByRole('dialog', { name: 'Replace files?' }).getByRole('button', { name: 'Replace' }).click();
    const again = jobRow(page);
    await expect.poll(() => stateOf(again), { timeout: 300_000, interval: 500 }).toMatch(/^done: [\s\S]*3 clips written/);
    const all = listing(dir);
    // A run without a restart also writes the whole reel as one file.
    expect(all).toEqual([...names, 'resume-check.mp4', 'resume-check.vtt'].sort());
    expect(all.filter((f) => f.startsWith('.'))).toEqual([]);
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  }, 480_000);

  it('with ffmpeg on this machine: a reload mid-clip stops the abandoned encode (no temporary file stays) and the job resumes', async () => {
    const { page } = app;
    const dir = join(scratch, 'resume-native');
    execFileSync('mkdir', ['-p', dir]);
    const exp = page.getByRole('region', { name: 'Export' });
    await exp.getByLabel('Encoder').selectOption('native');
    await exportInto(page, dir);
    const job = jobRow(page);
    await expect
      .poll(async () => (listing(dir).some((f) => /-01-.*\.mp4$/.test(f)) && listing(dir).some((f) => f.startsWith('.') && /-02-/.test(f)) ? 'second clip encoding' : stateOf(job)), { timeout: 180_000, interval: 100 })
      .toBe('second clip encoding');
    await page.reload();
    await page.getByRole('status').filter({ hasText: 'An export cut off by the restart resumes with its next clip' }).waitFor({ timeout: 60_000 });
    const resumed = jobRow(page);
    await expect.poll(() => stateOf(resumed), { timeout: 240_000, interval: 500 }).toMatch(/^done: [\s\S]*ffmpeg on this machine/);
    // The abandoned encode was stopped on resume; left alone, the host would keep its
    // temporary file until its 120 s idle timeout, long after this job is done.
    const files = listing(dir);
    expect(files.filter((f) => f.startsWith('.') || f.includes('partial'))).toEqual([]);
    expect(files.filter((f) => f.endsWith('.mp4'))).toHaveLength(3);
    const sidecar = JSON.parse(readFileSync(join(dir, 'resume-check.json'), 'utf8')) as { clips: { durationS: number }[] };
    files.filter((f) => f.endsWith('.mp4')).forEach((f, i) => expect(Math.abs(probe(join(dir, f)).durationS - sidecar.clips[i].durationS)).toBeLessThanOrEqual(FRAME_S + 1e-6));
    expect(app.pageErrors).toEqual([]);
  }, 480_000);
});
