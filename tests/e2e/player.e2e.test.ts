/**
 * The footage player in Debian Chromium on the built renderer (the #footage-check page).
 * Smoke: the demo footage opens, the readouts follow steps and seeks, keys work.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DIR, shot, startApp, type RunningApp } from './harness.ts';

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

async function openCheck(page: Page, path: string) {
  const origin = new URL(app.url).origin;
  await page.goto(`${origin}/#footage-check?path=${encodeURIComponent(path)}`);
  await page.reload();
  await expect.poll(() => page.getByTestId('readout-frame').innerText(), { timeout: 60_000 }).toMatch(/^0 \/ \d+$/);
}
const frameText = (page: Page) => page.getByTestId('readout-frame').innerText();

describe('footage player', () => {
  it('opens the demo footage and follows steps, jumps and typed moments', async () => {
    const { page } = app;
    await openCheck(page, join(DEMO_DIR, 'footage.mp4'));
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => frameText(page)).toMatch(/^1 \//);
    await page.keyboard.press('Shift+ArrowRight');
    await expect.poll(() => frameText(page)).toMatch(/^126 \//);
    await page.keyboard.press('Comma');
    await expect.poll(() => frameText(page)).toMatch(/^125 \//);
    await page.getByLabel('Clock').selectOption('frame');
    await page.getByLabel(/^Moment/).fill('1500');
    await page.getByLabel(/^Moment/).press('Enter');
    await expect.poll(() => frameText(page)).toMatch(/^1500 \//);
    await expect.poll(() => page.getByTestId('readout-timecode').innerText()).toBe('00:01:00:00');
    await expect.poll(() => page.getByTestId('readout-footage').innerText()).toBe('01:00.000');
    await shot(page, 'player-demo');
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });
});
