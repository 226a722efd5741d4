/**
 * Bad input through the in-app chooser: a garbled event log is refused with a located
 * problem list and nothing stored; a file that is neither source is not importable.
 */
import { closeSync, existsSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DIR, openThroughChooser, shot, startApp, type RunningApp } from './harness.ts';

let app: RunningApp;
let dir: string;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'wm-garbled-'));
  // An event log with a good header and 40 good rows, where four rows are damaged: broken
  // times on file lines 6, 15 and 24 and a row cut short on line 33. 4 of 44 rows is more
  // than the importer accepts, so the whole file must be refused.
  const rows = ['period,clock,event,team,player,x,y'];
  const kinds = ['Pass', 'Pass', 'Throw In', 'Pass', 'Goal Kick', 'Corner', 'Free Kick'];
  for (let i = 0, good = 0; rows.length < 45; i++) {
    const line = rows.length + 1;
    if (line === 6) rows.push('1,0q:1x.3,Pass,Harbour Town,6,-10,8');
    else if (line === 15) rows.push('1,??:??,Throw In,Moor Rovers,2,20,34');
    else if (line === 24) rows.push('1,x,Corner,Moor Rovers,11,52.5,-34');
    else if (line === 33) rows.push('1');
    else {
      const t = good * 7.5;
      rows.push(`1,${String(Math.floor(t / 60)).padStart(2, '0')}:${(t % 60).toFixed(1).padStart(4, '0')},${good === 0 ? 'Kick Off' : kinds[good % kinds.length]},${good % 2 ? 'Moor Rovers' : 'Harbour Town'},${(good % 11) + 1},${(good % 9) * 5 - 20},${(good % 5) * 6 - 12}`);
      good++;
    }
  }
  writeFileSync(join(dir, 'garbled-events.csv'), rows.join('\n') + '\n');
  // Bytes that are no text table at all.
  writeFileSync(join(dir, 'noise.csv'), Buffer.from(Array.from({ length: 3000 }, (_, i) => (i * 7919 + 13) % 256)));
  app = await startApp();
  await app.page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 150_000 });
});
afterAll(async () => {
  await app?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('bad input', () => {
  it('refuses a garbled event log, lists where and why, and stores nothing', async () => {
    const { page } = app;
    const before = await page.getByRole('article').count();
    await openThroughChooser(page, dir, ['garbled-events.csv']);
    const panel = page.getByRole('region', { name: 'Mapping for garbled-events.csv' });
    await panel.waitFor();
    await panel.getByRole('button', { name: /^Import/ }).click();
    const problems = panel.getByRole('region', { name: 'Problems' });
    await problems.waitFor({ timeout: 60_000 });
    await panel.getByRole('alert').filter({ hasText: 'Import refused' }).waitFor();
    await shot(page, '10-garbled-problems');
    // Each damaged line is named (file line numbers, header = line 1).
    const lineCells = await problems.locator('tbody tr td:nth-child(3)').allInnerTexts();
    for (const line of ['6', '15', '24', '33']) expect(lineCells).toContain(line);
    expect(await problems.locator('tbody tr td:nth-child(2)').first().innerText()).toBe('garbled-events.csv');

    // Rejected rows can be saved; the file reads back with papaparse (RFC 4180 CSV).
    await problems.getByRole('button', { name: /Save \d+ rejected row/ }).click();
    const status = problems.getByRole('status');
    await status.waitFor();
    const text = await status.innerText();
    const m = /Saved (\d+) rows to (.+)$/.exec(text);
    expect(m, text).not.toBeNull();
    const saved = m![2];
    expect(existsSync(saved)).toBe(true);
    const back = parse<string[]>(readFileSync(saved, 'utf8').trim()).data;
    expect(back[0]).toEqual(['line', 'reason', 'text']);
    expect(back.slice(1).map((r) => r[0])).toEqual(expect.arrayContaining(['6', '15', '24', '33']));
    rmSync(saved);

    // Nothing stored: same sources after a reload.
    await page.reload();
    await page.getByRole('article').first().waitFor();
    expect(await page.getByRole('article').count()).toBe(before);
  });

  it('does not offer to import a file that is neither tracking nor an event log', async () => {
    const { page } = app;
    // Keyboard only: O opens the chooser, Enter lists the folder, arrows move, Space picks.
    await page.locator('body').press('o');
    const dialog = page.getByRole('dialog', { name: 'Open files' });
    await dialog.getByLabel('Folder path').fill(dir);
    await dialog.getByLabel('Folder path').press('Enter');
    const list = dialog.getByRole('listbox', { name: 'Folder contents' });
    await list.getByRole('option', { name: /noise\.csv/ }).waitFor();
    await list.focus();
    const active = async () => page.locator(`#${await list.getAttribute('aria-activedescendant')}`).innerText();
    for (let i = 0; i < 10 && !(await active()).includes('noise.csv'); i++) await list.press('ArrowDown');
    await list.press(' ');
    expect(await list.getByRole('option', { name: /noise\.csv/ }).getAttribute('aria-selected')).toBe('true');
    await shot(page, '12-keyboard-chooser');
    await dialog.getByRole('button', { name: /^Open 1/ }).focus();
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'detached' });
    const panel = page.getByRole('region', { name: 'Mapping for noise.csv' });
    await panel.waitFor();
    await expect.poll(() => panel.locator('.kind-label').innerText()).toBe('not recognised');
    await panel.getByRole('region', { name: 'Problems' }).waitFor();
    expect(await panel.getByRole('button', { name: /^Import/ }).isDisabled()).toBe(true);
    await shot(page, '11-not-recognised');
    await panel.getByRole('button', { name: 'Skip this file' }).click();
    await panel.waitFor({ state: 'detached' });
  });

  it('a reload in the middle of an import leaves whole sources only (all-or-nothing)', async () => {
    const { page } = app;
    await openThroughChooser(page, DEMO_DIR, ['tracking.csv']);
    const panel = page.getByRole('region', { name: 'Mapping for tracking.csv' });
    await panel.getByRole('button', { name: 'Import tracking' }).click();
    // Reload while the worker may still be reading: whether or not it got to its one
    // transaction, the database must hold only complete sources.
    await page.reload();
    await page.getByRole('article').first().waitFor();
    const check = await page.evaluate(async () => {
      const db = await new Promise<IDBDatabase>((res, rej) => {
        const r = indexedDB.open('whistlemark');
        r.onsuccess = () => res(r.result);
        r.onerror = () => rej(r.error);
      });
      const all = <T,>(store: string) =>
        new Promise<T[]>((res, rej) => {
          const r = db.transaction(store).objectStore(store).getAll();
          r.onsuccess = () => res(r.result as T[]);
          r.onerror = () => rej(r.error);
        });
      const sources = await all<{ id: number; kind: string }>('sources');
      const metas = await all<{ sourceId: number; periods: { blockCount: number }[] }>('trackingMeta');
      const blocks = await all<{ sourceId: number }>('trackingBlocks');
      db.close();
      return sources
        .filter((s) => s.kind === 'tracking')
        .map((s) => {
          const meta = metas.find((m) => m.sourceId === s.id);
          return { expected: meta ? meta.periods.reduce((a, p) => a + p.blockCount, 0) : -1, stored: blocks.filter((b) => b.sourceId === s.id).length };
        });
    });
    expect(check.length).toBeGreaterThanOrEqual(1);
    for (const c of check) expect(c.stored).toBe(c.expected);
  });

  it('cancels a running import on request and stores nothing', async () => {
    const { page } = app;
    // A long invented tracking file (about 80 MB) so the import is still reading when
    // Cancel is pressed; the check is on what is stored, not on any duration.
    const big = join(dir, 'long-tracking.csv');
    const fd = openSync(big, 'w');
    const ids = Array.from({ length: 22 }, (_, i) => (i < 11 ? `home_${i + 1}` : `away_${i - 10}`)).concat('ball');
    writeSync(fd, ['period', 'frame', ...ids.flatMap((id) => [`${id}_x`, `${id}_y`])].join(',') + '\n');
    for (let f = 0; f < 160_000; f += 1000) {
      const lines: string[] = [];
      for (let k = f; k < f + 1000; k++) lines.push(`1,${k},` + ids.map((_, o) => `${((k + o * 37) % 1000) / 10 - 50},${((k * 3 + o) % 640) / 10 - 32}`).join(','));
      writeSync(fd, lines.join('\n') + '\n');
    }
    closeSync(fd);
    const before = await page.getByRole('article').count();
    await openThroughChooser(page, dir, ['long-tracking.csv']);
    const panel = page.getByRole('region', { name: 'Mapping for long-tracking.csv' });
    await panel.getByRole('button', { name: 'Import tracking' }).click();
    await panel.getByRole('progressbar').waitFor();
    await panel.getByRole('button', { name: 'Cancel import' }).click();
    await panel.getByRole('status').filter({ hasText: 'Import cancelled. Nothing was stored.' }).waitFor({ timeout: 60_000 });
    await shot(page, '13-cancelled');
    await page.reload();
    await page.getByRole('article').first().waitFor();
    expect(await page.getByRole('article').count()).toBe(before);
    rmSync(big);
  });
});
