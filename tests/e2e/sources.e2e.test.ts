/**
 * The Sources workflow in the built app: first start seeds the demo, a new project takes
 * the three demo sources through the mapping screen, the summary matches outside readings
 * of the same files, and everything survives a reload and a browser restart.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'papaparse';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DIR, escapeRe, openThroughChooser, shot, startApp, type RunningApp } from './harness.ts';

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

const card = (page: Page, kind: 'Tracking' | 'Event log' | 'Footage', file: string) => page.getByRole('article', { name: `${kind} ${file}` });
const stat = (c: Locator, name: string) => c.locator('dt', { hasText: new RegExp(`^${escapeRe(name)}$`) }).locator('xpath=following-sibling::dd[1]');
const num = async (l: Locator) => Number((await l.innerText()).replace(/[^\d.]/g, ''));

/** Data rows per period of a delimited file, read by papaparse (the outside reference). */
function rowsByPeriod(file: string, periodCol: string): Map<string, number> {
  const { data } = parse<Record<string, string>>(readFileSync(file, 'utf8'), { header: true, skipEmptyLines: true });
  const m = new Map<string, number>();
  for (const r of data) m.set(r[periodCol], (m.get(r[periodCol]) ?? 0) + 1);
  return m;
}
function headerOf(file: string): string[] {
  return readFileSync(file, 'utf8').slice(0, 4096).split(/\r?\n/)[0].split(',');
}

async function expectThreeSources(page: Page) {
  await expect.poll(() => page.getByRole('article').count(), { timeout: 30_000 }).toBe(3);
  for (const [kind, file] of [['Tracking', 'tracking.csv'], ['Event log', 'events.csv'], ['Footage', 'footage.mp4']] as const) {
    await card(page, kind, file).waitFor();
  }
}

describe('Sources screen', () => {
  it('sets up the demo match on first start, with visible progress', async () => {
    const { page } = app;
    await page.getByRole('region', { name: 'Demo match set-up' }).waitFor({ timeout: 30_000 });
    await shot(page, '01-first-start-progress');
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 150_000 });
    await expectThreeSources(page);
    await expect.poll(() => page.getByLabel('Match project').locator('option:checked').innerText()).toMatch(/demo/i);
    await shot(page, '02-demo-ready');
  });

  it('imports the three demo sources into a new project through the mapping screen', async () => {
    const { page } = app;
    await page.getByRole('button', { name: 'New match project' }).click();
    const dlg = page.getByRole('dialog', { name: 'New match project' });
    await dlg.getByLabel('Title').fill('Evening friendly, second look');
    await dlg.getByRole('button', { name: 'Create' }).click();
    await page.getByText('No sources in this match project yet.').waitFor();

    await openThroughChooser(page, DEMO_DIR, ['tracking.csv', 'events.csv', 'footage.mp4'], '03-file-chooser');

    const trackingPanel = page.getByRole('region', { name: 'Mapping for tracking.csv' });
    await trackingPanel.waitFor();
    await expect.poll(() => trackingPanel.locator('.kind-label').innerText()).toBe('tracking');
    await shot(page, '04-mapping-tracking');
    await trackingPanel.getByRole('button', { name: 'Import tracking' }).click();

    const eventsPanel = page.getByRole('region', { name: 'Mapping for events.csv' });
    await eventsPanel.waitFor({ timeout: 120_000 });
    await expect.poll(() => eventsPanel.locator('.kind-label').innerText()).toBe('event log');
    // An edit the analyst makes here is what mapping memory must give back later.
    await eventsPanel.getByRole('group', { name: 'Coordinates' }).getByLabel('Pitch width').fill('67');
    await shot(page, '05-mapping-events');
    await eventsPanel.getByRole('button', { name: 'Import event log' }).click();

    const footagePanel = page.getByRole('region', { name: 'Footage footage.mp4' });
    await footagePanel.waitFor({ timeout: 120_000 });
    await footagePanel.getByRole('button', { name: 'Import footage' }).click();
    await footagePanel.waitFor({ state: 'detached', timeout: 120_000 });
    await expectThreeSources(page);
    await shot(page, '06-sources-summary');
  });

  it('shows summaries that agree with outside readings of the files', async () => {
    const { page } = app;
    // Tracking: rows per period as papaparse reads them; frames = rows + missing frames.
    const trkFile = join(DEMO_DIR, 'tracking.csv');
    const periodCol = headerOf(trkFile).find((h) => /^period$/i.test(h.trim())) ?? 'period';
    const trkRows = rowsByPeriod(trkFile, periodCol);
    const trk = card(page, 'Tracking', 'tracking.csv');
    const totalRows = [...trkRows.values()].reduce((a, b) => a + b, 0);
    expect(await num(stat(trk, 'Rows read'))).toBe(totalRows);
    // 25 frames a second (common practice tracking rate; the demo writes 25 Hz).
    expect(await stat(trk, 'Rate').innerText()).toBe('25 Hz');
    const periodRows = trk.locator('table.periods tbody tr');
    expect(await periodRows.count()).toBe(trkRows.size);
    for (let i = 0; i < trkRows.size; i++) {
      const cells = await periodRows.nth(i).locator('td').allInnerTexts();
      const frames = Number(cells[4].replace(/,/g, ''));
      const missing = Number(cells[5].replace(/,/g, ''));
      expect(frames - missing).toBe([...trkRows.values()][i]);
    }

    // Events: one event per data row (papaparse count), unless the card lists rejected rows.
    const evFile = join(DEMO_DIR, 'events.csv');
    const evRows = parse<Record<string, string>>(readFileSync(evFile, 'utf8'), { header: true, skipEmptyLines: true }).data.length;
    const ev = card(page, 'Event log', 'events.csv');
    const rejected = (await stat(ev, 'Rows rejected').count()) ? await num(stat(ev, 'Rows rejected')) : 0;
    expect(await num(stat(ev, 'Events'))).toBe(evRows - rejected);
    const byKind = await ev.getByRole('list', { name: 'Events by kind' }).locator('strong').allInnerTexts();
    expect(byKind.map(Number).reduce((a, b) => a + b, 0)).toBe(evRows - rejected);

    // Footage: codec, size and frame count as Debian's ffprobe reads the container.
    const probe = JSON.parse(
      execFileSync('ffprobe', ['-v', 'error', '-select_streams', 'v:0', '-show_entries', 'stream=codec_name,nb_frames,width,height', '-of', 'json', join(DEMO_DIR, 'footage.mp4')], { encoding: 'utf8' }),
    ) as { streams: { codec_name: string; nb_frames: string; width: number; height: number }[] };
    const ft = card(page, 'Footage', 'footage.mp4');
    const v = probe.streams[0];
    expect(await stat(ft, 'Video').innerText()).toBe(`${v.codec_name} ${v.width}×${v.height}`);
    expect(await num(stat(ft, 'Frames'))).toBe(Number(v.nb_frames));
  });

  // Which way home attacks, per period, as the demo's generator recorded it (fixtures/demo/truth.json).
  it.runIf(existsSync(join(DEMO_DIR, 'truth.json')))('shows the attack direction the demo truth records', async () => {
    const truth = JSON.parse(readFileSync(join(DEMO_DIR, 'truth.json'), 'utf8')) as { periods: { period: number; homeAttacks: string }[] };
    const rows = card(app.page, 'Tracking', 'tracking.csv').locator('table.periods tbody tr');
    const shown = await rows.evaluateAll((trs) => trs.map((tr) => [Number(tr.children[0].textContent), tr.children[6].textContent]));
    expect(shown).toEqual(truth.periods.map((p) => [p.period, p.homeAttacks === 'positive_x' ? 'towards +x' : 'towards −x']));
  });

  it('keeps both projects and all sources after a reload and a browser restart', async () => {
    const read = async (page: Page) => ({
      projects: await page.getByLabel('Match project').locator('option').allInnerTexts(),
      cards: await page.getByRole('article').evaluateAll((els) => els.map((e) => e.getAttribute('aria-label'))),
      stats: await page.locator('article dl.stats').allInnerTexts(),
    });
    await expectThreeSources(app.page);
    const before = await read(app.page);
    expect(before.projects).toHaveLength(2);

    await app.page.reload();
    await expectThreeSources(app.page);
    expect(await read(app.page)).toEqual(before);

    await app.relaunch();
    await expectThreeSources(app.page);
    expect(await read(app.page)).toEqual(before);
    // The demo is made once: a restart must not add a second one.
    expect((await read(app.page)).projects.filter((p) => /demo/i.test(p))).toHaveLength(1);
    await shot(app.page, '07-after-restart');
  });

  it('offers the remembered mapping for the next file with the same columns', async () => {
    const { page } = app;
    await openThroughChooser(page, DEMO_DIR, ['events.csv']);
    const panel = page.getByRole('region', { name: 'Mapping for events.csv' });
    await panel.waitFor();
    await panel.getByText('mapping remembered from an earlier file').waitFor();
    await panel.getByRole('note').filter({ hasText: 'already in this match project' }).waitFor();
    // Detection alone would say 68 m (DEFAULT_PITCH); 67 is the analyst's own edit.
    expect(await panel.getByRole('group', { name: 'Coordinates' }).getByLabel('Pitch width').inputValue()).toBe('67');
    await panel.getByRole('button', { name: 'Skip this file' }).click();
    await panel.waitFor({ state: 'detached' });
    expect(await page.getByRole('article').count()).toBe(3);
  });

  it('asks before removing a source, and the removal lasts', async () => {
    const { page } = app;
    const footage = card(page, 'Footage', 'footage.mp4');
    await footage.getByRole('button', { name: 'Remove footage.mp4' }).click();
    const dlg = page.getByRole('dialog', { name: 'Remove this source?' });
    await dlg.getByRole('button', { name: 'Keep it' }).click();
    await dlg.waitFor({ state: 'detached' });
    expect(await page.getByRole('article').count()).toBe(3);
    await footage.getByRole('button', { name: 'Remove footage.mp4' }).click();
    await dlg.getByRole('button', { name: 'Remove source' }).click();
    await expect.poll(() => page.getByRole('article').count()).toBe(2);
    await page.reload();
    await card(page, 'Tracking', 'tracking.csv').waitFor();
    expect(await page.getByRole('article').count()).toBe(2);
    // The removal was this project's only: the demo project still has its footage.
    const demoOption = await page.getByLabel('Match project').locator('option', { hasText: /demo/i }).getAttribute('value');
    await page.getByLabel('Match project').selectOption(demoOption!);
    await card(page, 'Footage', 'footage.mp4').waitFor();
    expect(await page.getByRole('article').count()).toBe(3);
  });

  it('made no request to anything but the local host, and threw no page errors', () => {
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });
});
