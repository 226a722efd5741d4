/**
 * The Review screen on the demo match in Debian Chromium: the automatic first analysis
 * (analysis worker on the stored sources) fills the queue.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { shot, startApp, type RunningApp } from './harness.ts';

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

describe('Review on the demo match', () => {
  it('analyses the demo by itself once it is imported and shows the queue counts', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 120_000 });
    await page.keyboard.press('Alt+3');
    await page.getByText(/Analysed .* \(automatic\): \d+ open proposals/).waitFor({ timeout: 120_000 });
    const counts = await page.getByTestId('review-counts').textContent();
    const left = Number(/(\d+) left/.exec(counts ?? '')?.[1]);
    expect(left).toBeGreaterThan(20);
    await shot(page, 'review-analysed');
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });
});
