/**
 * Exports and the project file in the built app, on the demo match in Debian Chromium:
 * the analysis runner's proposals accepted above a confidence as one undoable step, the corrected CSV exported and compared with the demo
 * truth, undo from the keyboard and redo from the audit trail, the project saved as a
 * .wmatch file and opened as a new project with the same content, a damaged file refused,
 * and the HTML sync report opened and photographed.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { shareWithinTruth } from '../unit/export/truth-share.ts';
import { DEMO_DIR, SHOTS, shot, startApp, type RunningApp } from './harness.ts';
import { readStores } from './setup-rows.ts';

let app: RunningApp;
const out = mkdtempSync(join(tmpdir(), 'wm-e2e-exports-'));
const truth = JSON.parse(readFileSync(join(DEMO_DIR, 'truth.json'), 'utf8'));
const THRESHOLD = 0.5;
beforeAll(async () => {
  app = await startApp();
}, 60_000);
afterAll(async () => {
  await app?.close();
  rmSync(out, { recursive: true, force: true });
});

type CsvRow = Record<string, string>;
const readCsv = (path: string) => Papa.parse<CsvRow>(readFileSync(path, 'utf8').trimEnd(), { header: true }).data;
const share = (rows: CsvRow[], col: 'logged_t_s' | 'fitted_t_s' | 'corrected_t_s') =>
  shareWithinTruth(truth, rows.map((r) => ({ row: Number(r.row), period: Number(col === 'corrected_t_s' ? r.corrected_period : r.logged_period), t: r[col] === '' ? null : Number(r[col]) })));

/** Rows per table of one project, read from the page's IndexedDB (the database the app itself uses). */
async function tableCounts(page: Page, projectId: number): Promise<Record<string, number>> {
  const bySource = ['trackingBlocks', 'trackingMeta', 'eventLogs', 'footage'];
  const byProject = ['events', 'corrections', 'clockFits', 'anchors', 'audit', 'nonLive', 'reels', 'clips'];
  const rows = (await readStores(page, ['sources', ...bySource, ...byProject])) as Record<string, { projectId?: number; sourceId?: number; id?: number }[]>;
  const sources = rows.sources.filter((s) => s.projectId === projectId);
  const ids = new Set(sources.map((s) => s.id));
  const counts: Record<string, number> = { sources: sources.length };
  for (const t of bySource) counts[t] = rows[t].filter((r) => ids.has(r.sourceId)).length;
  for (const t of byProject) counts[t] = rows[t].filter((r) => r.projectId === projectId).length;
  return counts;
}

/** Ctrl+O with no dialog open; waits until the chooser has listed its first folder (a later
 * answer to that first listing would otherwise replace the folder typed in). */
async function openChooser(page: Page) {
  await page.locator('dialog[open]').waitFor({ state: 'detached' });
  await page.keyboard.press('Control+o');
  const chooser = page.getByRole('dialog', { name: 'Open files' });
  await expect.poll(() => chooser.getByLabel('Folder path').inputValue(), { timeout: 10_000 }).not.toBe('');
  return chooser;
}

async function saveThroughDialog(page: Page, label: RegExp, fileName: string, replace = false) {
  const dlg = page.getByRole('dialog', { name: label });
  // Type only once the export is built: on a loaded machine the dialog may still be
  // preparing (and re-rendering) when it first shows.
  await dlg.getByText('Preparing…').waitFor({ state: 'hidden', timeout: 60_000 });
  await dlg.getByLabel('File name').fill(fileName);
  await dlg.getByLabel('Folder').fill(out);
  await dlg.getByRole('button', { name: 'Save', exact: true }).click();
  if (replace) await dlg.getByRole('button', { name: 'Replace it' }).click();
  await dlg.getByText(/^Saved [\d,]+ bytes to /).waitFor({ timeout: 30_000 });
  return dlg;
}

async function exportFromMenu(page: Page, item: RegExp, fileName: string, replace = false) {
  await page.getByRole('button', { name: /^Project/ }).click();
  await page.getByRole('menuitem', { name: item }).click();
  const dlg = await saveThroughDialog(page, /^Save: /, fileName, replace);
  await dlg.getByRole('button', { name: 'Close' }).click();
  return join(out, fileName);
}

describe('exports and the match project file', () => {
  let demoId = 0;

  it('takes the analysis runner\'s proposals for the demo and accepts those above a confidence as one undoable step', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 200_000 });
    // The app analyses the demo by itself after the import (renderer/src/analysis): wait
    // for its proposals and fit, then accept those above the confidence as the Review
    // screen's "accept all above" would — one commit of renderer/src/history/history.ts,
    // written here in the page's own IndexedDB in the shape commit() writes. It reads and
    // writes in one transaction (not through tests/e2e/setup-rows.ts), so the rows it accepts are
    // the rows it read.
    const accept = () =>
      page.evaluate(async (threshold) => {
        const db: IDBDatabase = await new Promise((res, rej) => {
          const r = indexedDB.open('whistlemark');
          r.onsuccess = () => res(r.result);
          r.onerror = () => rej(r.error);
        });
        const req = <T,>(r: IDBRequest<T>) => new Promise<T>((res, rej) => ((r.onsuccess = () => res(r.result)), (r.onerror = () => rej(r.error))));
        const tx = db.transaction(['projects', 'clockFits', 'corrections', 'audit'], 'readwrite');
        const projects = (await req(tx.objectStore('projects').getAll())) as { id: number; demo?: boolean }[];
        const projectId = projects.find((p) => p.demo)!.id;
        const fits = ((await req(tx.objectStore('clockFits').getAll())) as { projectId: number }[]).filter((f) => f.projectId === projectId);
        const rows = ((await req(tx.objectStore('corrections').getAll())) as { id: number; projectId: number; status: string; proposal: { confidence: number; placed: boolean } }[]).filter(
          (c) => c.projectId === projectId,
        );
        if (!fits.length || !rows.length) {
          db.close();
          return null;
        }
        const audit = (await req(tx.objectStore('audit').getAll())) as { projectId: number; stamp?: number }[];
        const stamp = Math.max(Date.now(), ...audit.filter((a) => a.projectId === projectId).map((a) => (a.stamp ?? 0) + 1));
        const changes = [];
        for (const before of rows.filter((c) => c.status === 'proposed' && c.proposal.placed && c.proposal.confidence >= threshold)) {
          const after = { ...before, status: 'accepted' };
          await req(tx.objectStore('corrections').put(after));
          changes.push({ table: 'corrections', key: before.id, before, after });
        }
        await req(tx.objectStore('audit').add({ projectId, at: Date.now(), user: 'analyst', what: `accept ${changes.length} corrections at confidence ≥ ${threshold}`, subject: 'correction', changes, state: 'done', stamp }));
        await new Promise((res) => (tx.oncomplete = res));
        db.close();
        return { projectId, proposals: rows.length, accepted: changes.length };
      }, THRESHOLD);
    let done: Awaited<ReturnType<typeof accept>> = null;
    await expect.poll(async () => (done = await accept()), { timeout: 120_000, interval: 1000 }).not.toBeNull();
    console.log(`analysis runner: ${done!.proposals} proposals on the demo, ${done!.accepted} accepted at confidence ≥ ${THRESHOLD}`);
    demoId = done!.projectId;
    expect(done!.accepted).toBeGreaterThan(0);
  }, 240_000);

  let firstCsv: CsvRow[] = [];
  it('exports the corrected CSV; against the demo truth it beats the raw log', async () => {
    const { page } = app;
    const path = await exportFromMenu(page, /Corrected event log \(CSV\)/, 'demo-corrected.csv');
    const rows = readCsv(path);
    firstCsv = rows;
    expect(rows.length).toBe(truth.events.length);
    const accepted = rows.filter((r) => r.status === 'accepted').length;
    const raw = share(rows, 'logged_t_s');
    const fitted = share(rows, 'fitted_t_s');
    const corrected = share(rows, 'corrected_t_s');
    console.log(
      `demo CSV from the app: ${accepted}/${rows.length} accepted at confidence ≥ ${THRESHOLD}; share within 0.2 s of truth: raw log ${(raw * 100).toFixed(1)} %, log through the fit ${(fitted * 100).toFixed(1)} %, corrected ${(corrected * 100).toFixed(1)} %`,
    );
    expect(corrected).toBeGreaterThan(raw);
    expect(corrected).toBeGreaterThan(fitted);
    expect(Object.keys(rows[0])).toEqual(expect.arrayContaining(['logged_t_s', 'corrected_t_s', 'status', 'confidence']));
  }, 60_000);

  it('Ctrl+Z takes the acceptance back (the export says so), the audit trail redoes it', async () => {
    const { page } = app;
    await page.locator('main').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Control+z');
    await page.getByRole('status').filter({ hasText: /Undone: accept \d+ corrections/ }).waitFor();
    const path = await exportFromMenu(page, /Corrected event log \(CSV\)/, 'demo-corrected.csv', true);
    const undone = readCsv(path);
    expect(undone.filter((r) => r.status === 'accepted')).toEqual([]);
    expect(undone.filter((r) => r.status === 'proposed').length).toBeGreaterThan(0);
    await page.keyboard.press('Control+Shift+H');
    const panel = page.getByRole('dialog', { name: 'Audit trail' });
    const redoButton = panel.getByRole('button', { name: /^Redo “accept \d+ corrections/ });
    await redoButton.waitFor();
    await shot(page, 'exports-01-audit-trail-before-redo');
    await redoButton.click();
    await panel.getByRole('button', { name: /^Undo “accept \d+ corrections/ }).waitFor();
    await panel.getByLabel('Filter by kind').selectOption('correction');
    await shot(page, 'exports-02-audit-trail-corrections');
    await panel.getByRole('button', { name: 'Close' }).click();
    const again = readCsv(await exportFromMenu(page, /Corrected event log \(CSV\)/, 'demo-corrected.csv', true));
    expect(again).toEqual(firstCsv);
  }, 60_000);

  it('saves the project file and opens it as a new project with the same content', async () => {
    const { page } = app;
    await page.keyboard.press('Control+s');
    await saveThroughDialog(page, /Save: Match project file/, 'demo.wmatch');
    await shot(page, 'exports-03-project-saved');
    await page.getByRole('dialog').getByRole('button', { name: 'Close' }).click();
    const before = await tableCounts(page, demoId);
    const options = await page.getByRole('combobox', { name: 'Match project' }).locator('option').count();

    const chooser = await openChooser(page);
    await chooser.getByLabel('Folder path').fill(out);
    await chooser.getByRole('button', { name: 'Go', exact: true }).click();
    await chooser.getByRole('option', { name: /demo\.wmatch/ }).click();
    await chooser.getByRole('button', { name: /^Open \d+/ }).click();
    await expect.poll(() => page.getByRole('combobox', { name: 'Match project' }).locator('option').count(), { timeout: 60_000 }).toBe(options + 1);
    await page.locator('dialog[open]').waitFor({ state: 'detached', timeout: 30_000 });
    const openedId = Number(await page.getByRole('combobox', { name: 'Match project' }).inputValue());
    expect(openedId).not.toBe(demoId);
    expect(await tableCounts(page, openedId)).toEqual(before);
    // The opened project exports the same corrected log, field for field.
    const opened = readCsv(await exportFromMenu(page, /Corrected event log \(CSV\)/, 'opened-corrected.csv'));
    expect(opened).toEqual(firstCsv);
    await shot(page, 'exports-04-opened-project');
  }, 120_000);

  it('refuses a truncated project file with a message and changes nothing', async () => {
    const { page } = app;
    const bytes = readFileSync(join(out, 'demo.wmatch'));
    writeFileSync(join(out, 'cut.wmatch'), bytes.subarray(0, Math.floor(bytes.length * 0.6)));
    const options = await page.getByRole('combobox', { name: 'Match project' }).locator('option').count();
    const chooser = await openChooser(page);
    await chooser.getByLabel('Folder path').fill(out);
    await chooser.getByRole('button', { name: 'Go', exact: true }).click();
    await chooser.getByRole('option', { name: /cut\.wmatch/ }).click();
    await chooser.getByRole('button', { name: /^Open \d+/ }).click();
    const dlg = page.getByRole('dialog', { name: 'Open match project' });
    await dlg.getByRole('alert').filter({ hasText: /cut\.wmatch is damaged or truncated/ }).waitFor({ timeout: 30_000 });
    await dlg.getByText('Nothing was changed in your projects.').waitFor();
    await shot(page, 'exports-05-truncated-refused');
    await dlg.getByRole('button', { name: 'Close' }).click();
    expect(await page.getByRole('combobox', { name: 'Match project' }).locator('option').count()).toBe(options);
  }, 60_000);

  it('exports the HTML sync report; it opens on its own and is photographed', async () => {
    const { page, context } = app;
    await page.getByRole('combobox', { name: 'Match project' }).selectOption(String(demoId));
    const path = await exportFromMenu(page, /Sync report \(HTML\)/, 'demo-sync-report.html');
    const html = readFileSync(path, 'utf8');
    expect(html).toMatch(/Personal data\./);
    const report = await context.newPage();
    const outside: string[] = [];
    report.on('request', (r) => {
      if (!r.url().startsWith('file:') && !r.url().startsWith('data:')) outside.push(r.url());
    });
    await report.goto(`file://${path}`);
    await report.getByRole('heading', { name: 'Sync report' }).waitFor();
    expect(await report.locator('svg.chart').count()).toBeGreaterThanOrEqual(2);
    await report.screenshot({ path: join(SHOTS, 'exports-06-sync-report.png'), fullPage: true });
    await report.emulateMedia({ media: 'print' });
    await report.screenshot({ path: join(SHOTS, 'exports-07-sync-report-print.png'), fullPage: true });
    const pdf = await report.pdf({ format: 'A4' });
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    await report.close();
    expect(outside).toEqual([]);
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  }, 60_000);
});
