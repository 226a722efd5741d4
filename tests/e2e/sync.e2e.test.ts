/**
 * The Sync screen on the demo match in Debian Chromium. Reference: the simulator's truth
 * (fixtures/demo/truth.json). The analyst marks each period's kick-off at the frame the
 * truth puts the kick in, marks the whistles at their true onsets (first test) or has the
 * app's detector find them (Find candidates, second describe), accepts the proposed pairings,
 * and the footage ↔ tracking map stored in IndexedDB must be within one footage frame
 * (40 ms) of the truth at every truth anchor (every whistle and every restart in live
 * footage). Then: still there after a relaunch; Ctrl+Z takes back the last change.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { footageToTracking } from '../../engine/fit/footage-map.ts';
import type { ClockFit } from '../../shared-types/index.ts';
import { demoTruth, FPS, firstFrameAfter, truthAnchors } from '../unit/footage-sync/demo-case.ts';
import { shot, startApp, type RunningApp } from './harness.ts';
import { readStores } from './setup-rows.ts';

interface Stored { fits: ClockFit[]; footageAnchors: { kind: string; t: number; paired: boolean }[]; tracking: number }
async function stored(page: Page): Promise<Stored> {
  const { anchors, clockFits } = (await readStores(page, ['anchors', 'clockFits'])) as {
    anchors: { anchor: { source: string; kind: string; t: number }; pairedAnchorId?: string }[];
    clockFits: { fit: ClockFit }[];
  };
  return {
    fits: clockFits.map((r) => r.fit).filter((x) => x.source === 'footage'),
    footageAnchors: anchors.filter((r) => r.anchor.source === 'footage').map((r) => ({ kind: r.anchor.kind, t: r.anchor.t, paired: !!r.pairedAnchorId })),
    tracking: anchors.filter((r) => r.anchor.source === 'tracking').length,
  };
}

async function goToFrame(page: Page, frame: number) {
  const player = page.getByRole('region', { name: 'Footage player (Sync)' });
  await player.getByRole('combobox', { name: 'Clock' }).selectOption('frame');
  const field = player.getByRole('form', { name: 'Go to a moment' }).locator('input');
  await field.fill(String(frame));
  await field.press('Enter');
  await page.waitForFunction((f) => document.querySelector('[data-testid="readout-frame"]')?.textContent?.startsWith(`${f} /`), frame, { timeout: 20_000 });
}

/** Mark at a footage frame with a key; `count` is how many footage anchors are stored after. */
async function markAt(page: Page, frame: number, key: string, count: number) {
  await goToFrame(page, frame);
  await page.keyboard.press(key);
  await expect.poll(async () => (await stored(page)).footageAnchors.length, { timeout: 10_000 }).toBe(count);
  // Marked on the frame on screen (the demo's frames are at n / 25 s: footage.ffprobe.json).
  const last = (await stored(page)).footageAnchors.sort((a, b) => a.t - b.t).find((a) => Math.abs(a.t - frame / FPS) < 1e-6);
  expect(last, `anchor at frame ${frame}`).toBeDefined();
}

function errors(fit: ClockFit) {
  return truthAnchors().map((a) => {
    const m = footageToTracking(fit, a.tFootage);
    return { what: a.what, e: m && m.period === a.period ? m.t - a.tTracking : Infinity };
  });
}

/** Demo loaded, Sync open, the automatic analysis's tracking anchors stored, a frame on screen. */
async function openSync(page: Page) {
  await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 120_000 });
  await page.keyboard.press('Alt+2');
  await page.getByRole('region', { name: 'Sync', exact: true }).waitFor();
  // The automatic analysis stores the tracking restarts the kick-offs pair with.
  await expect.poll(async () => (await stored(page)).tracking, { timeout: 120_000 }).toBeGreaterThan(10);
  await page.waitForFunction(() => /^\d+ \//.test(document.querySelector('[data-testid="readout-frame"]')?.textContent ?? ''), null, { timeout: 60_000 });
}

/** Each period's kick-off: the first frame showing the ball played (from the truth). */
const kickFrames = () => demoTruth.periods.map((p) => firstFrameAfter(demoTruth.restarts.find((r) => r.kind === 'kick_off' && r.period === p.period)!.playedT));

describe('Sync on the demo match', () => {
  let app: RunningApp;
  beforeAll(async () => {
    app = await startApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('two kick-offs marked and the proposals accepted: the stored fit is within one frame of the truth everywhere; it survives a relaunch; undo takes back the last step', async () => {
    const { page } = app;
    await openSync(page);

    // 1. Each period's kick-off: the first frame showing the ball played (from the truth).
    let n = 0;
    for (const f of kickFrames()) await markAt(page, f, '1', ++n);
    let s = await stored(page);
    expect(s.footageAnchors.every((a) => a.paired)).toBe(true);
    expect(s.fits.length).toBe(1);
    const afterKicks = errors(s.fits[0]);
    console.log(`kick-offs only: worst |error| ${(Math.max(...afterKicks.map((x) => Math.abs(x.e))) * 1000).toFixed(1)} ms over ${afterKicks.length} truth anchors`);

    // 2. Whistles marked at their onsets (frame on screen at the onset), outside non-live footage.
    const whistles = (demoTruth.whistles ?? []).filter((w) => !(demoTruth.nonLive ?? []).some((x) => w.footageT >= x.fromT && w.footageT < x.toT));
    for (const w of whistles) await markAt(page, Math.floor(w.footageT * FPS + 1e-9), 'w', ++n);
    const list = page.getByTestId('proposals').locator('li');
    // Six on the demo (as in tests/unit/footage-sync): two penalties, three free kicks, the kick-off after the goal.
    await expect.poll(() => list.count(), { timeout: 10_000 }).toBe(6);
    const proposed = await list.allTextContents();
    console.log(`proposed pairings:\n  ${proposed.join('\n  ')}`);
    await shot(page, 'sync-proposals');

    // 3. Accept all shown (Shift+A).
    await page.keyboard.press('Shift+A');
    await expect.poll(async () => (await stored(page)).footageAnchors.filter((a) => a.paired).length, { timeout: 10_000 }).toBe(2 + proposed.length);
    s = await stored(page);
    expect(s.fits.length).toBe(1);
    const errs = errors(s.fits[0]);
    const worst = errs.reduce((a, b) => (Math.abs(b.e) > Math.abs(a.e) ? b : a));
    console.log(`after accepting ${proposed.length} pairings: worst ${(worst.e * 1000).toFixed(1)} ms (${worst.what}), rms ${(Math.sqrt(errs.reduce((q, x) => q + x.e * x.e, 0) / errs.length) * 1000).toFixed(1)} ms over ${errs.length} truth anchors`);
    for (const x of errs) expect(Math.abs(x.e), x.what).toBeLessThanOrEqual(1 / FPS);
    expect(await page.getByTestId('footage-fit').locator('tbody tr').count()).toBe(2);
    await shot(page, 'sync-fitted');

    // 4. Relaunch on the same profile: anchors and fit are still there and shown.
    await app.relaunch();
    const p2 = app.page;
    await p2.getByRole('region', { name: 'Sync', exact: true }).waitFor({ timeout: 60_000 });
    const again = await stored(p2);
    expect(again.footageAnchors.length).toBe(n);
    expect(again.fits).toEqual(s.fits);
    await p2.getByTestId('footage-fit').waitFor();

    // 5. Ctrl+Z: the acceptance is undone (only the two kick-offs stay paired), and the fit with it.
    await p2.locator('body').click({ position: { x: 5, y: 5 } });
    await p2.keyboard.press('Control+z');
    await expect.poll(async () => (await stored(p2)).footageAnchors.filter((a) => a.paired).length, { timeout: 10_000 }).toBe(2);
    const undone = await stored(p2);
    expect(undone.fits[0].segments.flatMap((x) => x.points).length).toBe(2);
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });

  it('Find candidates (F) shows progress and Escape cancels it with nothing stored', async () => {
    const page = app.page;
    const before = await stored(page);
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('f');
    await page.getByRole('status', { name: 'Finding candidates' }).waitFor({ timeout: 10_000 });
    await page.keyboard.press('Escape');
    await page.getByTestId('sync-message').getByText('Finding candidates was cancelled; nothing was stored.').waitFor({ timeout: 120_000 });
    expect((await stored(page)).footageAnchors).toEqual(before.footageAnchors);
    expect(app.pageErrors).toEqual([]);
  });
});


/**
 * The same, with the whistles from the app's own detector (Find candidates, F: the footage's
 * audio decoded by the embedded ffmpeg.wasm core, renderer/src/candidates/scanFootage)
 * instead of marks at the truth's onsets. Reference: fixtures/demo/truth.json as above; the
 * bar is the issue's: within one footage frame (40 ms) at every truth anchor.
 */
describe('Sync on the demo match with detected whistles', () => {
  let app: RunningApp;
  beforeAll(async () => {
    app = await startApp();
  });
  afterAll(async () => {
    await app?.close();
  });

  it('Find candidates, mark the two kick-offs, accept all proposed pairings: the stored fit is within one frame of the truth everywhere', async () => {
    const { page } = app;
    await openSync(page);

    // 1. F: find whistles and cuts, and wait for the scan to finish and store them.
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('f');
    await page.getByRole('status', { name: 'Finding candidates' }).waitFor({ timeout: 10_000 });
    const message = page.getByTestId('sync-message');
    await message.getByText(/^Found \d+ whistles and \d+ cuts/).waitFor({ timeout: 300_000 });
    console.log(`detector: ${await message.innerText()}`);
    const detected = (await stored(page)).footageAnchors.filter((a) => a.kind === 'whistle');
    // The truth's whistles the detector found (onset within 0.25 s, as in tests/e2e/candidates.e2e.test.ts).
    const truthWhistles = demoTruth.whistles ?? [];
    const near = (t: number) => truthWhistles.some((w) => Math.abs(w.footageT - t) < 0.25);
    console.log(`${detected.length} whistles stored, ${detected.filter((a) => near(a.t)).length} of them at a truth whistle; truth has ${truthWhistles.length}`);
    expect(detected.length).toBeGreaterThan(0);
    let n = (await stored(page)).footageAnchors.length;

    // 2. The two kick-offs, marked by the analyst (key 1) at the frame the kick is first seen.
    for (const f of kickFrames()) await markAt(page, f, '1', ++n);
    let s = await stored(page);
    expect(s.footageAnchors.filter((a) => a.paired).length).toBe(2);
    expect(s.fits.length).toBe(1);
    const kicksOnly = errors(s.fits[0]);
    console.log(`kick-offs only: worst |error| ${(Math.max(...kicksOnly.map((x) => Math.abs(x.e))) * 1000).toFixed(1)} ms over ${kicksOnly.length} truth anchors`);

    // 3. The proposals the detected whistles give; accept all shown (Shift+A).
    const list = page.getByTestId('proposals').locator('li');
    await expect.poll(() => list.count(), { timeout: 10_000 }).toBeGreaterThan(0);
    const proposed = await list.allTextContents();
    console.log(`proposed pairings (${proposed.length}):\n  ${proposed.join('\n  ')}`);
    // With the truth's whistles the demo gives six (two penalties, three free kicks, the kick-off
    // after the goal: tests/unit/footage-sync/fit.test.ts); the detector may miss one.
    expect(proposed.length).toBeGreaterThanOrEqual(5);
    await shot(page, 'sync-detected-proposals');
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Shift+A');
    await expect.poll(async () => (await stored(page)).footageAnchors.filter((a) => a.paired).length, { timeout: 10_000 }).toBe(2 + proposed.length);
    s = await stored(page);
    const accepted = s.footageAnchors.filter((a) => a.paired && a.kind === 'whistle');
    console.log(`accepted ${accepted.length} of ${proposed.length} proposed; ${accepted.filter((a) => near(a.t)).length} of them at a truth whistle`);
    expect(accepted.length).toBe(proposed.length);
    for (const a of accepted) expect(near(a.t), `accepted whistle at ${a.t.toFixed(2)} s is a truth whistle`).toBe(true);

    // 4. The stored footage ↔ tracking fit against the truth at every truth anchor.
    expect(s.fits.length).toBe(1);
    const errs = errors(s.fits[0]);
    const worst = errs.reduce((a, b) => (Math.abs(b.e) > Math.abs(a.e) ? b : a));
    console.log(
      `detected whistles, kick-offs + ${accepted.length} accepted pairings: worst ${(worst.e * 1000).toFixed(1)} ms (${worst.what}), ` +
        `rms ${(Math.sqrt(errs.reduce((q, x) => q + x.e * x.e, 0) / errs.length) * 1000).toFixed(1)} ms over ${errs.length} truth anchors\n  ` +
        errs.map((x) => `${x.what}: ${(x.e * 1000).toFixed(1)} ms`).join('\n  '),
    );
    for (const x of errs) expect(Math.abs(x.e), x.what).toBeLessThanOrEqual(1 / FPS);
    // The stored tracking anchors carry the ball's moment of rest, so free-kick whistles are
    // paired with it (engine/footage-sync/lag-model.ts), not with the kick's vaguer fallback.
    const lags = (s.fits[0] as ClockFit & { model?: { lags: { kind: string; ref: string; lagS: number; sdS: number; n: number }[] } }).model?.lags ?? [];
    console.log(`whistle lags: ${lags.map((l) => `${l.kind} (${l.ref}) ${l.lagS.toFixed(2)} ± ${l.sdS.toFixed(2)} s, n ${l.n}`).join('; ')}`);
    expect(lags.find((l) => l.kind === 'free_kick')?.ref).toBe('still');
    await shot(page, 'sync-detected-fitted');
    expect(app.outsideRequests).toEqual([]);
    expect(app.pageErrors).toEqual([]);
  });
});
