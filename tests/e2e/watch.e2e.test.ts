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
import { sampleAt, simulateMatch, type Truth } from '../../fixtures/sim/index.ts';
import { DEMO_DIR, ROOT, shot, startApp, type RunningApp } from './harness.ts';

const truth = JSON.parse(readFileSync(join(ROOT, 'fixtures/demo/truth.json'), 'utf8')) as Truth;
const truthH = JSON.parse(readFileSync(join(ROOT, 'fixtures/demo/truth-homography.json'), 'utf8')) as { frames: number[][]; width: number; height: number };
const usingDemo = DEMO_DIR.endsWith('fixtures/demo');

function project(h: number[], x: number, y: number): [number, number] {
  const w = h[6] * x + h[7] * y + h[8];
  return [(h[0] * x + h[1] * y + h[2]) / w, (h[3] * x + h[4] * y + h[5]) / w];
}

/**
 * The footage clock fit the e2e needs, written from truth in the test set-up because the
 * Sync screen (which makes it in the app) is another module: per live footage segment,
 * tracking time = (true - tracking offset) / tracking rate with true = footage offset + rate * t.
 */
function fitFromTruth() {
  const trk = truth.clocks.tracking!.segments;
  const segments = truth.clocks.footage!.segments
    .filter((s) => s.kind !== 'replay')
    .map((s) => {
      const ts = trk.find((q) => q.period === s.period)!;
      const offset = (s.offset - ts.offset) / ts.rate;
      const rate = s.rate / ts.rate;
      return { period: s.period, fromT: s.fromT, toT: s.toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] };
    });
  return { source: 'footage', method: 'huber', segments };
}

/** Writes the fit row and the confirmed non-live rows straight into the app's IndexedDB. */
async function writeFitAndNonLive(page: Page) {
  const fit = fitFromTruth();
  const nonLive = truth.nonLive!;
  await page.evaluate(
    async ({ fit, nonLive }) => {
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
      const tx = db.transaction(['clockFits', 'nonLive'], 'readwrite');
      tx.objectStore('clockFits').add({ projectId: footage.projectId, sourceId: footage.id, fit, createdAt: Date.now() });
      for (const n of nonLive) tx.objectStore('nonLive').add({ projectId: footage.projectId, footageSourceId: footage.id, fromT: n.fromT, toT: n.toT, kind: n.kind, status: 'confirmed' });
      await new Promise((res, rej) => {
        tx.oncomplete = res;
        tx.onerror = () => rej(tx.error);
      });
      db.close();
    },
    { fit, nonLive },
  );
}

let app: RunningApp;
beforeAll(async () => {
  app = await startApp();
});
afterAll(async () => {
  await app?.close();
});

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
});
