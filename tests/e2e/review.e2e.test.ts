/**
 * The Review screen on the demo match in Debian Chromium: the automatic first analysis
 * (analysis worker on the stored sources) fills the queue; accept, reject and edit by keys,
 * undo, reload; then the whole review finished from the keyboard, keystrokes counted.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { trackingToFootage } from '../../engine/fit/footage-map.ts';
import { truthFootageFit } from '../demo-truth-rows.ts';
import { DEMO_DIR, shot, startApp, type RunningApp } from './harness.ts';
import { demoProject, readStore, storeDemoRows } from './setup-rows.ts';

const usingDemo = DEMO_DIR.endsWith('fixtures/demo');

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});


interface Corr { id: number; eventId: string; status: string; proposal: { trackingTime: number; predictedTime: number; x?: number; y?: number }; edited?: { t: number } }
interface Ev { eventId: string; logged: { t: number; x?: number }; current: { t: number; x?: number } }

async function counts(page: Page) {
  const text = (await page.getByTestId('review-counts').textContent()) ?? '';
  return { done: Number(/(\d+)\s*done/.exec(text)?.[1]), left: Number(/(\d+)\s*left/.exec(text)?.[1]) };
}

async function selectedEventId(page: Page): Promise<string> {
  const label = (await page.getByTestId('review-detail').getAttribute('aria-label')) ?? '';
  return /(\S+)$/.exec(label)![1];
}

describe('Review on the demo match', () => {
  it('analyses the demo by itself once it is imported and shows the queue', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 120_000 });
    await page.keyboard.press('Alt+3');
    await page.getByText(/Analysed .* \(automatic\): \d+ open proposals/).waitFor({ timeout: 120_000 });
    await page.getByTestId('review-detail').waitFor();
    const c = await counts(page);
    expect(c.done).toBe(0);
    expect(c.left).toBeGreaterThan(20);
    await shot(page, 'review-opened');
  });

  it('accepts and rejects with keys, edits one by frames, undoes, and keeps the state over a reload', async () => {
    const { page } = app;
    const rate = 25; // demo tracking rate (fixtures/README.md)
    // The queue has focus on arrival: A accepts the one shown and moves on.
    const first = await selectedEventId(page);
    await page.keyboard.press('a');
    await page.waitForFunction(() => /1\s*done/.test(document.querySelector('[data-testid="review-counts"]')?.textContent ?? ''));
    const second = await selectedEventId(page);
    expect(second).not.toBe(first);
    await page.keyboard.press('r');
    await page.waitForFunction(() => /2\s*done/.test(document.querySelector('[data-testid="review-counts"]')?.textContent ?? ''));
    const third = await selectedEventId(page);
    // Edit the third: +1, +1, +5 frames, then undo the +5.
    await page.keyboard.press(']');
    await page.getByTestId('review-detail').and(page.locator('[data-status="edited"]')).waitFor();
    await page.keyboard.press(']');
    await page.keyboard.press('Shift+]');
    await page.waitForFunction(() => /7 frames/.test(document.querySelector('.review-message')?.textContent ?? '') || true);
    const waitEdited = async (frames: number) => {
      for (let k = 0; k < 100; k++) {
        const c = (await readStore<Corr>(page, 'corrections')).find((r) => r.eventId === third)!;
        if (c.edited && Math.abs(c.edited.t - (Math.round(c.proposal.trackingTime * rate) + frames) / rate) < 1e-9) return c;
        await page.waitForTimeout(50);
      }
      throw new Error(`the edit of ${third} never reached ${frames} frames`);
    };
    await waitEdited(7);
    await page.keyboard.press('Control+z');
    const edited = await waitEdited(2);
    await shot(page, 'review-edited');

    const corr = await readStore<Corr>(page, 'corrections');
    const events = await readStore<Ev>(page, 'events');
    const byId = (id: string) => ({ c: corr.find((r) => r.eventId === id)!, e: events.find((r) => r.eventId === id)! });
    const a = byId(first), r = byId(second), ed = byId(third);
    expect(a.c.status).toBe('accepted');
    // Accepted: the event's current copy moved by the proposal's shift (event clock; rate ≈ 1 within 300 ppm).
    expect(a.e.current.t - a.e.logged.t).toBeCloseTo(a.c.proposal.trackingTime - a.c.proposal.predictedTime, 2);
    expect(r.c.status).toBe('rejected');
    expect(r.e.current.t).toBe(r.e.logged.t);
    expect(ed.c.status).toBe('edited');
    expect(ed.e.current.t - ed.e.logged.t).toBeCloseTo(edited.edited!.t - ed.c.proposal.predictedTime, 2);

    // Reload: the same state, the same counts.
    const before = await counts(page);
    await page.reload();
    await page.getByTestId('review-detail').waitFor({ timeout: 60_000 });
    expect(await counts(page)).toEqual(before);
    const again = await readStore<Corr>(page, 'corrections');
    expect(again.map((c) => [c.eventId, c.status, c.edited?.t])).toEqual(corr.map((c) => [c.eventId, c.status, c.edited?.t]));
    // Undo still works after the reload: the edit goes back one more step (+2 -> +1 frame).
    await page.keyboard.press('Control+z');
    await waitEdited(1);
  });

  it('can be finished from the keyboard alone (keystrokes counted)', async () => {
    const { page } = app;
    await page.keyboard.press('?');
    await page.getByRole('complementary', { name: 'Review keys' }).waitFor();
    await shot(page, 'review-keys-help');
    await page.keyboard.press('Escape');
    await page.getByRole('complementary', { name: 'Review keys' }).waitFor({ state: 'detached' });
    // A newcomer's run from here: Shift+A takes every confident one, then A / R through the rest.
    let keys = 0;
    const press = async (k: string) => {
      keys++;
      await page.keyboard.press(k);
    };
    await press('Shift+A');
    await page.getByText(/Accepted \d+ proposals/).waitFor();
    for (let guard = 0; guard < 200; guard++) {
      const c = await counts(page);
      if (c.left === 0) break;
      const conf = Number((await page.getByRole('meter', { name: 'Confidence' }).getAttribute('aria-valuenow')) ?? 0);
      const leftBefore = c.left;
      await press(conf >= 50 ? 'a' : 'r');
      await page.waitForFunction((n) => {
        const m = /(\d+)\s*left/.exec(document.querySelector('[data-testid="review-counts"]')?.textContent ?? '');
        return m && Number(m[1]) < n;
      }, leftBefore);
    }
    const c = await counts(page);
    expect(c.left).toBe(0);
    console.log(`review of the demo finished from the keyboard: ${keys} keystrokes for ${c.done} corrections (plus Alt+3 to open the screen)`);
    await shot(page, 'review-finished');
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });

  it.runIf(usingDemo)('cues the footage at the moment under review when a footage fit exists', async () => {
    const { page } = app;
    const fit = truthFootageFit(); // the fit the Sync screen would make, from truth (tests/demo-truth-rows.ts)
    await storeDemoRows(page, await demoProject(page), { footageFit: fit });
    // Written past Dexie, so the page sees it after a reload.
    await page.reload();
    await page.getByTestId('review-footage').waitFor({ timeout: 30_000 });
    // The one selected; its proposed moment through the fit gives the footage frame to expect.
    const id = await selectedEventId(page);
    const c = (await readStore<Corr & { proposal: { trackingPeriod: number } }>(page, 'corrections')).find((r) => r.eventId === id)!;
    const t = c.edited?.t ?? c.proposal.trackingTime;
    const tf = trackingToFootage(fit, c.proposal.trackingPeriod, t, 1)!;
    await page.waitForFunction(() => document.querySelector('[data-testid="review-footage"]')?.getAttribute('data-frame') !== '', undefined, { timeout: 30_000 });
    const frame = Number(await page.getByTestId('review-footage').getAttribute('data-frame'));
    // Demo footage: constant 25 fps from 0 (fixtures/README.md), so footage time tf is frame floor(tf * 25).
    expect(Math.abs(frame - Math.floor(tf * 25 + 1e-6))).toBeLessThanOrEqual(1);
    await page.waitForTimeout(300);
    await shot(page, 'review-with-footage');
  });
});
