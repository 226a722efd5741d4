/**
 * In/out marks on the demo match in the built app: mark in on Watch, step frames, mark
 * out, add the marked clip to the reel last used on Reels; the clip is there with the
 * marked frames (the Reels screen's export plan maps its span back to footage frames);
 * Ctrl+Z takes it away; after a reload the marks are still shown (and clicking one goes
 * there), on Watch and on Sync,
 * where a reversed pair gets its message and Shift+U clears.
 *
 * Set-up (said plainly): the footage and event-log clock fits are written from the
 * simulator's truth (fixtures/demo/truth.json through tests/demo-truth-rows.ts) straight into
 * the app's IndexedDB, standing in for the ones the Sync screen makes (tests/e2e/sync.e2e.test.ts).
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DIR, shot, startApp, type RunningApp } from './harness.ts';
import { truth, truthEventFit, truthFootageFit } from '../demo-truth-rows.ts';

const usingDemo = DEMO_DIR.endsWith('fixtures/demo');
const FPS = truth.footage.fps;
const IN_FRAME = 1750;
// Five single frames and two 5 s jumps forward (player keys → and Shift+→).
const OUT_FRAME = IN_FRAME + 5 + 2 * 5 * FPS;

/**
 * Match clock (event log clock, whole seconds) of footage time t in period 1, straight from
 * truth.json: footage -> true time -> event clock. Independent of the app's conversions.
 */
function truthMatchClock(tFootage: number): string {
  const f = truth.clocks.footage.segments.find((s) => s.kind !== 'replay' && tFootage >= s.fromT && tFootage <= s.toT)!;
  const e = truth.clocks.events.segments.find((s) => s.period === f.period)!;
  const trueT = f.offset + f.rate * tFootage;
  const s = Math.floor((trueT - e.offset) / e.rate + (f.period === 2 ? 45 * 60 : 0));
  return `${String(Math.floor(s / 60)).padStart(2, '0')}:${String(s % 60).padStart(2, '0')}`;
}

async function writeTruthFits(page: Page) {
  const rows = { footageFit: truthFootageFit(), eventFit: truthEventFit() };
  await page.evaluate(async (rows) => {
    const db: IDBDatabase = await new Promise((res, rej) => {
      const r = indexedDB.open('whistlemark');
      r.onsuccess = () => res(r.result);
      r.onerror = () => rej(r.error);
    });
    const all = <T,>(store: string): Promise<T[]> =>
      new Promise((res, rej) => {
        const r = db.transaction(store).objectStore(store).getAll();
        r.onsuccess = () => res(r.result as T[]);
        r.onerror = () => rej(r.error);
      });
    const sources = await all<{ id: number; projectId: number; kind: string }>('sources');
    const footage = sources.find((s) => s.kind === 'footage')!;
    const events = sources.find((s) => s.kind === 'events')!;
    const tx = db.transaction(['clockFits'], 'readwrite');
    const now = Date.now();
    tx.objectStore('clockFits').add({ projectId: footage.projectId, sourceId: footage.id, fit: rows.footageFit, createdAt: now });
    tx.objectStore('clockFits').add({ projectId: events.projectId, sourceId: events.id, fit: rows.eventFit, createdAt: now });
    await new Promise((res, rej) => ((tx.oncomplete = res), (tx.onerror = () => rej(tx.error))));
    db.close();
  }, rows);
}

const frameText = (page: Page) => page.getByTestId('readout-frame').innerText();

/** The player's go-to field on the footage frame clock; focus is handed back to the page so keys reach the screen. */
async function goToFrame(page: Page, index: number) {
  const form = page.getByRole('form', { name: 'Go to a moment' });
  await form.getByLabel('Clock').selectOption('frame');
  await form.getByLabel('Moment (Footage frame)').fill(String(index));
  await form.getByLabel('Moment (Footage frame)').press('Enter');
  await expect.poll(() => frameText(page), { timeout: 20_000 }).toMatch(new RegExp(`^${index} /`));
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
}

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

describe.runIf(usingDemo)('in/out marks on Watch and Sync', () => {
  it('marks on Watch, adds the clip to the last used reel, undoes it, and keeps the marks over a reload', { timeout: 400_000 }, async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 200_000 });
    await writeTruthFits(page);
    await page.reload();
    await page.getByRole('navigation', { name: 'Screens' }).waitFor();

    // Two reels on Reels; the second is the one open there, so it is the last used.
    await page.keyboard.press('Alt+5');
    await page.getByRole('button', { name: 'Start a reel' }).click();
    await page.getByRole('button', { name: 'New reel' }).click();
    await page.getByRole('button', { name: 'Reel 2', exact: true }).waitFor();
    await expect.poll(() => page.getByRole('button', { name: 'Reel 2', exact: true }).getAttribute('aria-current')).toBe('true');

    await page.keyboard.press('Alt+4');
    await page.getByRole('region', { name: 'Watch' }).waitFor({ timeout: 90_000 }).catch(async (e) => {
      await shot(page, 'marks-00-failed');
      throw e;
    });
    await expect.poll(() => frameText(page), { timeout: 60_000 }).toMatch(/^\d+ \//);
    const bar = page.getByRole('region', { name: 'In and out marks' });
    await expect(bar.getByRole('button', { name: /Add marked clip to reel/ }).isDisabled()).resolves.toBe(true);

    await goToFrame(page, IN_FRAME);
    await page.keyboard.press('y');
    await expect.poll(() => bar.getByTestId('mark-in').innerText()).toMatch(new RegExp(`frame ${IN_FRAME}$`));
    for (let i = 0; i < 5; i++) {
      await page.keyboard.press('ArrowRight');
      await expect.poll(() => frameText(page)).toMatch(new RegExp(`^${IN_FRAME + i + 1} /`));
    }
    for (let i = 1; i <= 2; i++) {
      await page.keyboard.press('Shift+ArrowRight');
      await expect.poll(() => frameText(page)).toMatch(new RegExp(`^${IN_FRAME + 5 + i * 5 * FPS} /`));
    }
    await page.keyboard.press('u');
    await expect.poll(() => bar.getByTestId('mark-out').innerText()).toMatch(new RegExp(`frame ${OUT_FRAME}$`));

    // The marked span runs from the start of the in-frame to the end of the out-frame.
    const title = `Marked ${truthMatchClock(IN_FRAME / FPS)}–${truthMatchClock((OUT_FRAME + 1) / FPS)}`;
    const seconds = ((OUT_FRAME + 1 - IN_FRAME) / FPS).toFixed(1); // tracking runs within 100 ppm of footage here (truth.json drift)
    await expect.poll(() => bar.getByTestId('marks-readout').innerText()).toMatch(new RegExp(`^P1 in .* · out .* · ${seconds} s$`));
    await expect(page.getByTestId('scrub-marks').locator('.fp-mark').count()).resolves.toBe(2);
    await shot(page, 'marks-01-watch-marked');

    const onWatch: string[] = [];
    for (const name of ['Dots', 'Ball', 'Trails', 'Offside line', 'Shape']) if (await page.getByLabel(`${name} for Home`).isChecked()) onWatch.push(name);
    expect(onWatch).toEqual(['Dots', 'Ball', 'Trails', 'Offside line']);
    await bar.getByRole('button', { name: /Add marked clip to reel/ }).click();
    const form = page.getByRole('form', { name: 'Add marked clip to reel' });
    await expect(form.getByLabel('Reel to add to').locator('option:checked').innerText()).resolves.toBe('Reel 2 (last used)');
    await expect(form.getByLabel('Clip title').getAttribute('placeholder')).resolves.toBe(title);
    await shot(page, 'marks-02-add-form');
    await form.getByRole('button', { name: 'Add', exact: true }).click();
    await expect.poll(() => bar.getByTestId('marks-status').innerText()).toBe(`Added to reel ‘Reel 2’ — ${seconds} s (Ctrl+Z takes it back)`);

    await page.keyboard.press('Alt+5');
    const list = page.getByRole('list', { name: 'Clips in order' });
    await expect.poll(() => list.getByRole('listitem').count(), { timeout: 20_000 }).toBe(1);
    await expect.poll(() => page.getByRole('button', { name: 'Reel 2', exact: true }).getAttribute('aria-current')).toBe('true');
    await expect(list.getByLabel('Title of clip 1').inputValue()).resolves.toBe(title);
    // The export plan maps the stored span back onto exactly the marked frames.
    await expect.poll(() => list.getByRole('listitem').first().innerText(), { timeout: 20_000 }).toContain(`frames ${IN_FRAME}–${OUT_FRAME}`);
    await expect(list.getByRole('listitem').first().innerText()).resolves.toContain(`${seconds} s`);
    // The clip shows the layers that were on on Watch (checkboxes there), not just the Reels default.
    const layerGroup = list.getByRole('group', { name: 'Overlay layers of clip 1' });
    for (const name of onWatch) await expect(layerGroup.getByRole('button', { name, exact: true }).getAttribute('aria-pressed')).resolves.toBe('true');
    await expect(layerGroup.getByRole('button', { name: 'Shape', exact: true }).getAttribute('aria-pressed')).resolves.toBe('false');
    await shot(page, 'marks-03-reels-clip');

    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press('Control+z');
    await page.getByText('No clips yet').waitFor();

    await page.keyboard.press('Alt+4');
    await page.reload();
    await page.getByRole('region', { name: 'Watch' }).waitFor({ timeout: 60_000 });
    const after = page.getByRole('region', { name: 'In and out marks' });
    await expect.poll(() => after.getByTestId('mark-in').innerText(), { timeout: 30_000 }).toMatch(new RegExp(`frame ${IN_FRAME}$`));
    await expect.poll(() => after.getByTestId('mark-out').innerText()).toMatch(new RegExp(`frame ${OUT_FRAME}$`));
    await expect.poll(() => page.getByTestId('scrub-marks').locator('.fp-mark').count(), { timeout: 30_000 }).toBe(2);
    // A mark's readout takes the player there.
    await expect.poll(() => frameText(page), { timeout: 60_000 }).toMatch(/^\d+ \//);
    await after.getByTestId('mark-in').click();
    await expect.poll(() => frameText(page), { timeout: 20_000 }).toMatch(new RegExp(`^${IN_FRAME} /`));
    await shot(page, 'marks-04-watch-after-reload');
    expect(app.outsideRequests).toEqual([]);
  });

  it('shares the marks with Sync: a reversed pair is refused with a message, Shift+U clears, Y+U at once keeps both', { timeout: 200_000 }, async () => {
    const { page } = app;
    await page.keyboard.press('Alt+2');
    await page.getByRole('region', { name: 'Sync' }).waitFor({ timeout: 30_000 });
    const bar = page.getByRole('region', { name: 'In and out marks' });
    await expect.poll(() => bar.getByTestId('mark-in').innerText(), { timeout: 30_000 }).toMatch(new RegExp(`frame ${IN_FRAME}$`));
    await expect.poll(() => frameText(page), { timeout: 60_000 }).toMatch(/^\d+ \//);
    await goToFrame(page, IN_FRAME - 50);
    await page.keyboard.press('u');
    await expect.poll(() => bar.getByTestId('marks-readout').innerText()).toMatch(new RegExp(`out point \\(frame ${IN_FRAME - 50}\\) is before the in point \\(frame ${IN_FRAME}\\)`));
    await expect(bar.getByRole('button', { name: /Add marked clip to reel/ }).isDisabled()).resolves.toBe(true);
    await shot(page, 'marks-05-sync-reversed');
    await page.keyboard.press('Shift+U');
    await expect.poll(() => bar.getByTestId('mark-in').innerText()).toBe('not marked');
    await expect(bar.getByTestId('marks-readout').count()).resolves.toBe(0);
    // Y and U straight after each other (no wait for the database between): both are kept, a one-frame clip.
    await page.keyboard.press('y');
    await page.keyboard.press('u');
    await expect.poll(() => bar.getByTestId('mark-in').innerText()).toMatch(new RegExp(`frame ${IN_FRAME - 50}$`));
    await expect.poll(() => bar.getByTestId('mark-out').innerText()).toMatch(new RegExp(`frame ${IN_FRAME - 50}$`));
    await expect.poll(() => bar.getByTestId('marks-readout').innerText()).toMatch(/ · 0\.04 s$/);
    expect(app.pageErrors).toEqual([]);
  });
});
