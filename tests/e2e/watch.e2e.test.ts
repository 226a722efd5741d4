/**
 * The Watch screen on the demo match in the built app: pitch registration on two keyframes
 * by clicking landmarks at their true pixel positions (fixtures/demo/truth-homography.json),
 * playback with the overlay, dot centres on the rendered players (truth positions from the
 * demo simulator projected by the truth homography), layer toggles, no overlay in the replay
 * (truth.json nonLive), and a deuteranopia simulation of the team colours.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_SIM } from '../../fixtures/sim/demo-config.ts';
import { pitchModel } from '../../engine/geometry/pitch-model.ts';
import { sampleAt, simulateMatch, type Truth } from '../../fixtures/sim/index.ts';
import { deltaE76, simulate, type Rgb } from '../unit/overlay/colour-vision.ts';
import { DEMO_DIR, ROOT, SHOTS, shot, startApp, type RunningApp } from './harness.ts';
import { truthFootageFit } from '../demo-truth-rows.ts';
import { demoProject, storeDemoRows } from './setup-rows.ts';

const truth = JSON.parse(readFileSync(join(ROOT, 'fixtures/demo/truth.json'), 'utf8')) as Truth;
const truthH = JSON.parse(readFileSync(join(ROOT, 'fixtures/demo/truth-homography.json'), 'utf8')) as { frames: number[][]; width: number; height: number };
const usingDemo = DEMO_DIR.endsWith('fixtures/demo');

function project(h: number[], x: number, y: number): [number, number] {
  const w = h[6] * x + h[7] * y + h[8];
  return [(h[0] * x + h[1] * y + h[2]) / w, (h[3] * x + h[4] * y + h[5]) / w];
}

// The footage clock fit comes from truth (tests/demo-truth-rows.ts), standing in for the
// one the Sync screen makes (covered by tests/e2e/sync.e2e.test.ts).

/** Writes the fit row and the confirmed non-live rows straight into the app's IndexedDB. */
async function writeFitAndNonLive(page: Page) {
  await storeDemoRows(page, await demoProject(page), { footageFit: truthFootageFit(), nonLive: truth.nonLive! });
}

const world = simulateMatch(DEMO_SIM);
const FPS = 25;

/** True time shown by live footage frame `index` (truth.json footage clock, live segments only). */
function trueTimeOfFrame(index: number): number | undefined {
  const t = index / FPS; // constant 25 fps footage starting at 0 (fixtures/README.md)
  const seg = truth.clocks.footage!.segments.find((s) => s.kind !== 'replay' && t >= s.fromT && t <= s.toT);
  return seg && seg.offset + seg.rate * t;
}

/** Where each player really is on footage frame `index`, in footage pixels (demo simulator + truth homography). */
function truthPlayersOnFrame(index: number): { id: string; team: 'home' | 'away'; u: number; v: number }[] {
  const tt = trueTimeOfFrame(index);
  if (tt === undefined) return [];
  const n = world.objects.length;
  const xy = new Float64Array(2 * n + 1);
  if (!sampleAt(world, tt, xy)) return [];
  const h = truthH.frames[index];
  return world.objects.flatMap((o, i) => {
    if (o.role !== 'player' || !o.team) return [];
    const [u, v] = project(h, xy[2 * i], xy[2 * i + 1]);
    return [{ id: o.id, team: o.team, u, v }];
  });
}

/** Image pixels per pitch metre at image point (u, v) of homography h (inverse mapped, then 1 m along x). */
function localScale(h: number[], u: number, v: number): number {
  // Invert h by its adjugate (the scale does not matter for a homography).
  const [a, b, c, d, e, f, g, hh, i] = h;
  const inv = [e * i - f * hh, c * hh - b * i, b * f - c * e, f * g - d * i, a * i - c * g, c * d - a * f, d * hh - e * g, b * g - a * hh, a * e - b * d];
  const [x, y] = project(inv, u, v);
  const p = project(h, x - 0.5, y);
  const q = project(h, x + 0.5, y);
  return Math.hypot(q[0] - p[0], q[1] - p[1]);
}

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** RGBA pixels of the footage stage (the video with the overlay canvas on it). */
async function stagePixels(page: Page, name?: string): Promise<{ png: Buffer; box: Box; rgba: Uint8ClampedArray; w: number; h: number }> {
  const stage = page.locator('.watch-stage');
  const box = (await stage.boundingBox())!;
  const png = await stage.screenshot(name ? { path: join(SHOTS, `${name}.png`) } : {});
  const { rgba, w, h } = await decodePng(page, png);
  return { png, box, rgba, w, h };
}

/** Decodes a PNG in the page (the browser's own decoder) to RGBA. */
async function decodePng(page: Page, png: Buffer): Promise<{ rgba: Uint8ClampedArray; w: number; h: number }> {
  const r = await page.evaluate(async (b64) => {
    const bmp = await createImageBitmap(await (await fetch(`data:image/png;base64,${b64}`)).blob());
    const c = new OffscreenCanvas(bmp.width, bmp.height);
    const ctx = c.getContext('2d')!;
    ctx.drawImage(bmp, 0, 0);
    const px = ctx.getImageData(0, 0, bmp.width, bmp.height).data;
    // Back as base64 text: far cheaper to hand over than an array of numbers.
    let bin = '';
    for (let i = 0; i < px.length; i += 0x8000) bin += String.fromCharCode(...px.subarray(i, i + 0x8000));
    return { b64: btoa(bin), w: bmp.width, h: bmp.height };
  }, png.toString('base64'));
  return { rgba: new Uint8ClampedArray(Buffer.from(r.b64, 'base64')), w: r.w, h: r.h };
}

/** Pixels that differ between two shots of the same frame (the overlay), as a mask. */
function diffMask(a: Uint8ClampedArray, b: Uint8ClampedArray): Uint8Array {
  const m = new Uint8Array(a.length / 4);
  for (let i = 0; i < m.length; i++) {
    const d = Math.abs(a[4 * i] - b[4 * i]) + Math.abs(a[4 * i + 1] - b[4 * i + 1]) + Math.abs(a[4 * i + 2] - b[4 * i + 2]);
    m[i] = d > 60 ? 1 : 0;
  }
  return m;
}

/** Centroid of mask pixels within radius r of (cx, cy) in shot pixels. */
function centroidNear(mask: Uint8Array, w: number, h: number, cx: number, cy: number, r: number): { x: number; y: number; n: number } {
  let sx = 0;
  let sy = 0;
  let n = 0;
  for (let y = Math.max(0, Math.floor(cy - r)); y <= Math.min(h - 1, Math.ceil(cy + r)); y++)
    for (let x = Math.max(0, Math.floor(cx - r)); x <= Math.min(w - 1, Math.ceil(cx + r)); x++) {
      if ((x - cx) ** 2 + (y - cy) ** 2 > r * r || !mask[y * w + x]) continue;
      sx += x;
      sy += y;
      n++;
    }
  return { x: sx / n, y: sy / n, n };
}

async function goToFrame(page: Page, index: number) {
  // The footage player's go-to field, on the footage frame clock.
  const form = page.getByRole('form', { name: 'Go to a moment' });
  await form.getByLabel('Clock').selectOption('frame');
  await form.getByLabel('Moment (Footage frame)').fill(String(index));
  await form.getByLabel('Moment (Footage frame)').press('Enter');
  await page.getByTestId('watch-frame').filter({ hasText: new RegExp(`^frame ${index} `) }).waitFor({ timeout: 20_000 });
  await page.locator('.watch-stage').hover();
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  await page.waitForTimeout(150);
}

/** Toggles a layer with its key and waits until the checkbox shows the new state. */
async function toggleLayer(page: Page, key: string, layer: string, on: boolean) {
  const box = page.getByLabel(`${layer} for Home`);
  if ((await box.isChecked()) === on) return;
  await page.keyboard.press(key);
  await expect.poll(() => box.isChecked()).toBe(on);
  await page.waitForTimeout(150);
}

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

/** Keyframes of the registration: one second apart while the camera pans. */
const KEYFRAMES = [1750, 1775];

describe.runIf(usingDemo)('Watch screen on the demo match', () => {
  it('opens with the demo, a fit from truth and the overlay canvases', async () => {
    const { page } = app;
    await page.getByRole('heading', { name: 'The demo match is ready' }).waitFor({ timeout: 200_000 });
    await writeFitAndNonLive(page);
    await page.reload();
    await page.getByRole('navigation', { name: 'Screens' }).waitFor();
    await page.keyboard.press('Alt+4');
    await page.getByRole('region', { name: 'Watch' }).waitFor({ timeout: 30_000 }).catch(async (e) => {
      await shot(page, 'watch-00-failed');
      throw e;
    });
    await page.getByTestId('watch-frame').filter({ hasText: /^frame \d+/ }).waitFor({ timeout: 60_000 });
    await shot(page, 'watch-01-opened');
    expect(app.outsideRequests).toEqual([]);
  });

  it('registers the pitch on two keyframes by clicking landmarks at their true pixel positions', async () => {
    const { page } = app;
    const landmarks = pitchModel({ length: 105, width: 68 }).landmarks;
    // Tall enough that the picture and the registration panel are both in view (no scrolling between choosing and clicking).
    await page.setViewportSize({ width: 1440, height: 1300 });
    for (const [k, F] of KEYFRAMES.entries()) {
      await goToFrame(page, F);
      await page.keyboard.press('r');
      const panel = page.getByRole('region', { name: 'Pitch registration' });
      await panel.getByRole('button', { name: 'Clear points' }).click();
      const box = (await page.locator('.watch-stage').boundingBox())!;
      const scale = box.width / truthH.width;
      const h = truthH.frames[F];
      // In front of the camera (w > 0), inside the picture and below the stands and score graphic.
      const inFront = (x: number, y: number) => h[6] * x + h[7] * y + h[8] > 0;
      const seen = landmarks
        .filter((l) => inFront(l.at[0], l.at[1]))
        .map((l) => ({ l, p: project(h, l.at[0], l.at[1]) }))
        .filter(({ p }) => p[0] > 8 && p[1] > 40 && p[0] < truthH.width - 8 && p[1] < truthH.height - 8);
      expect(seen.length, `landmarks in view on frame ${F}`).toBeGreaterThanOrEqual(4);
      for (const { l, p } of seen.slice(0, 8)) {
        await panel.getByLabel('Landmark to place').selectOption(l.id);
        // Choosing in the side panel may scroll the screen: measure the picture again.
        const b = (await page.locator('.watch-stage').boundingBox())!;
        await page.mouse.click(b.x + p[0] * scale, b.y + p[1] * scale);
      }
      await shot(page, `watch-02-registering-${k + 1}`);
      await expect.poll(() => panel.getByTestId('fit-summary').innerText()).toMatch(/^Fit: RMS/);
      const errors = (await panel.getByTestId('pair-error').allInnerTexts()).map(Number);
      console.log(`keyframe ${F}: ${seen.slice(0, 8).map((x) => x.l.id).join(', ')}; reprojection errors ${errors.map((e) => e.toFixed(2)).join(' ')} px`);
      // Clicks land on whole CSS pixels (${(1 / scale).toFixed(2)} footage px each): a fit through them stays within about a pixel.
      expect(Math.max(...errors)).toBeLessThan(2);
      await shot(page, `watch-02-registering-${k + 1}`);
      await panel.getByRole('button', { name: /Save keyframe/ }).click();
      await expect.poll(() => page.getByRole('table', { name: 'Keyframes' }).locator('tbody tr').filter({ hasText: String(F) }).count()).toBe(1);
    }
    // Undoable: Ctrl+Z takes the second keyframe away, Ctrl+Shift+Z brings it back.
    const rows = page.getByRole('table', { name: 'Keyframes' }).locator('tbody tr');
    await page.locator('.watch-stage').hover();
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press('Control+z');
    await expect.poll(() => rows.count()).toBe(1);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(() => rows.count()).toBe(2);
  });

  it('draws the dots on the rendered players (truth positions through the truth homography)', async () => {
    const { page } = app;
    // Between the two keyframes: the homography is interpolated there.
    const F = KEYFRAMES[0] + 12;
    await goToFrame(page, F);
    await toggleLayer(page, 't', 'Trails', false);
    await toggleLayer(page, 'b', 'Ball', false);
    await toggleLayer(page, 'd', 'Dots', true);
    const on = await stagePixels(page, 'watch-03-dots-on');
    await toggleLayer(page, 'd', 'Dots', false);
    const off = await stagePixels(page, 'watch-04-dots-off');
    const mask = diffMask(on.rgba, off.rgba);
    const scale = on.w / truthH.width;
    const players = truthPlayersOnFrame(F).filter((p) => p.u > 10 && p.v > 10 && p.u < truthH.width - 10 && p.v < truthH.height - 10);
    // Only players well apart from every other one: overlapping markers have no single centre.
    const apart = players.filter((p) => players.every((q) => q === p || Math.hypot(q.u - p.u, q.v - p.v) * scale > 40));
    const errs: number[] = [];
    const h = truthH.frames[F];
    for (const p of apart) {
      const c = centroidNear(mask, on.w, on.h, p.u * scale, p.v * scale, 16);
      expect(c.n, `overlay pixels near ${p.id}`).toBeGreaterThan(40);
      const err = Math.hypot(c.x - p.u * scale, c.y - p.v * scale) / scale;
      errs.push(err);
      // Tolerance: the tracking file carries 0.12 m of position noise (fixtures/README.md), so
      // 3 sd of it at this point's image scale, plus 2 px for the marker's label and outline.
      const xy = world.objects.findIndex((o) => o.id === p.id);
      const pxPerM = localScale(h, p.u, p.v);
      expect(err, `${p.id} (object ${xy})`).toBeLessThan(2 + 3 * 0.12 * pxPerM);
    }
    console.log(`frame ${F}: ${apart.length} of ${players.length} visible players checked; dot centre - truth: max ${Math.max(...errs).toFixed(2)} px, mean ${(errs.reduce((a, b) => a + b, 0) / errs.length).toFixed(2)} px (footage pixels, 640x360)`);
    expect(apart.length).toBeGreaterThanOrEqual(5);
    expect(errs.reduce((a, b) => a + b, 0) / errs.length).toBeLessThan(3);
    await toggleLayer(page, 'd', 'Dots', true);

    // Colour-blind check on the same shot: mean colour of each team's marker pixels,
    // simulated for deuteranopia and protanopia (Machado et al. 2009), CIE 1976 ΔE*ab apart.
    const meanOf = (team: 'home' | 'away') => {
      const acc = [0, 0, 0];
      let n = 0;
      for (const p of apart.filter((q) => q.team === team)) {
        const cx = p.u * scale;
        const cy = p.v * scale;
        for (let y = Math.floor(cy - 6); y <= cy + 6; y++)
          for (let x = Math.floor(cx - 6); x <= cx + 6; x++) {
            const i = y * on.w + x;
            if (x < 0 || y < 0 || x >= on.w || y >= on.h || !mask[i]) continue;
            for (let k = 0; k < 3; k++) acc[k] += on.rgba[4 * i + k];
            n++;
          }
      }
      return acc.map((v) => v / n) as Rgb;
    };
    const home = meanOf('home');
    const away = meanOf('away');
    const deut = deltaE76(simulate(home, 'deuteranopia'), simulate(away, 'deuteranopia'));
    const prot = deltaE76(simulate(home, 'protanopia'), simulate(away, 'protanopia'));
    console.log(`screenshot marker colours: home rgb(${home.map((v) => v.toFixed(0))}), away rgb(${away.map((v) => v.toFixed(0))}); ΔE*ab normal ${deltaE76(home, away).toFixed(1)}, deuteranopia ${deut.toFixed(1)}, protanopia ${prot.toFixed(1)}`);
    expect(deut).toBeGreaterThan(25);
    expect(prot).toBeGreaterThan(25);
  });

  it('layer toggles change the picture, per team', async () => {
    const { page } = app;
    const both = await stagePixels(page, 'watch-05-both-teams');
    await page.getByLabel('Dots for Away').click();
    await expect.poll(() => page.getByLabel('Dots for Away').isChecked()).toBe(false);
    await page.waitForTimeout(200);
    const homeOnly = await stagePixels(page, 'watch-06-home-dots-only');
    const changed = diffMask(both.rgba, homeOnly.rgba);
    const scale = both.w / truthH.width;
    const players = truthPlayersOnFrame(KEYFRAMES[0] + 12).filter((p) => p.u > 10 && p.v > 10 && p.u < truthH.width - 10 && p.v < truthH.height - 10);
    const near = (team: 'home' | 'away') => players.filter((p) => p.team === team && players.every((q) => q === p || Math.hypot(q.u - p.u, q.v - p.v) * scale > 40)).map((p) => centroidNear(changed, both.w, both.h, p.u * scale, p.v * scale, 14).n);
    // Away markers went, home markers stayed.
    expect(Math.min(...near('away'))).toBeGreaterThan(30);
    expect(Math.max(...near('home'))).toBe(0);
    await page.getByLabel('Dots for Away').click();
    await expect.poll(() => page.getByLabel('Dots for Away').isChecked()).toBe(true);
    await toggleLayer(page, 't', 'Trails', true);
    const trails = await stagePixels(page, 'watch-07-trails');
    expect(diffMask(both.rgba, trails.rgba).reduce((a, b) => a + b, 0)).toBeGreaterThan(200);
  });

  it('plays through with the overlay following the footage', async () => {
    const { page } = app;
    await goToFrame(page, KEYFRAMES[0] - 25);
    await page.getByRole('button', { name: 'Play', exact: true }).click();
    await page.waitForTimeout(1500);
    await shot(page, 'watch-08-playing');
    await page.getByRole('button', { name: 'Pause', exact: true }).click();
    const text = await page.getByTestId('watch-frame').innerText();
    const index = Number(/frame (\d+)/.exec(text)![1]);
    expect(index).toBeGreaterThan(KEYFRAMES[0] - 25 + 10);
  });

  it('draws no overlay on the footage in a replay, with a quiet indicator; the pitch view keeps the live moment', async () => {
    const { page } = app;
    const replay = truth.nonLive!.find((n) => n.kind === 'replay')!;
    const F = Math.round(((replay.fromT + replay.toT) / 2) * FPS);
    await goToFrame(page, F);
    await toggleLayer(page, 'd', 'Dots', true);
    const on = await stagePixels(page, 'watch-09-replay');
    await toggleLayer(page, 'd', 'Dots', false);
    const off = await stagePixels(page);
    const footageDiff = diffMask(on.rgba, off.rgba).reduce((a, b) => a + b, 0);
    await toggleLayer(page, 'd', 'Dots', true);
    await shot(page, 'watch-10-replay-screen');
    // The indicator tag says why (top-left of the overlay); dots never appear on the replay.
    expect(footageDiff).toBe(0);
    const pitch = page.getByTestId('pitch-view');
    const a = await decodePng(page, await pitch.screenshot());
    await toggleLayer(page, 'd', 'Dots', false);
    const b = await decodePng(page, await pitch.screenshot());
    await toggleLayer(page, 'd', 'Dots', true);
    expect(diffMask(a.rgba, b.rgba).reduce((x, y) => x + y, 0)).toBeGreaterThan(100);
  });
});
