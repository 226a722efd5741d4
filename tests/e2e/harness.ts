/**
 * E2E harness: the built renderer (dist/renderer; `npm test` builds it first) served by
 * the browser host from electron/serve.ts, in Debian Chromium through playwright-core.
 * Each app gets its own temporary HOME and browser profile; relaunching on the same
 * profile keeps IndexedDB, which is how "still there after a restart" is tested.
 *
 * Run: npx vite build --config build/vite.config.ts && npx vitest run --config build/vitest.e2e.config.ts
 * Screenshots land in test-results/ (git-ignored).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH, chromiumEnv } from '../../build/local-chromium.ts';
import { startBrowserHost } from '../../electron/serve.ts';
import { standinEventsCsv, standinTrackingCsv } from '../unit/renderer/standins.ts';

export const ROOT = resolve(new URL('../..', import.meta.url).pathname);
const FIXTURE_DEMO = join(ROOT, 'fixtures/demo');
const DEMO_FILES = ['tracking.csv', 'events.csv', 'footage.mp4'];

/**
 * The demo folder the tests use: fixtures/demo when it holds the three demo files, else
 * small invented stand-ins (footage made by Debian's ffmpeg from its lavfi test source).
 */
function demoDir(): string {
  if (DEMO_FILES.every((f) => existsSync(join(FIXTURE_DEMO, f)))) return FIXTURE_DEMO;
  const dir = join(tmpdir(), `wm-e2e-standin-demo-${process.pid}`);
  if (!existsSync(join(dir, 'footage.mp4'))) {
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'tracking.csv'), standinTrackingCsv(20));
    writeFileSync(join(dir, 'events.csv'), standinEventsCsv());
    execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc=size=320x180:rate=25', '-t', '4', '-c:v', 'libx264', '-pix_fmt', 'yuv420p', join(dir, 'footage.mp4')]);
  }
  return dir;
}
export const DEMO_DIR = demoDir();
export const SHOTS = join(ROOT, 'test-results');


export interface RunningApp {
  page: Page;
  context: BrowserContext;
  url: string;
  /** Requests the page made to anything but the local host. */
  outsideRequests: string[];
  /** Uncaught errors in the page. */
  pageErrors: string[];
  /** Close the browser (profile kept) and start it again on the same profile. */
  relaunch(): Promise<void>;
  close(): Promise<void>;
}

export async function startApp(): Promise<RunningApp> {
  const scratch = mkdtempSync(join(tmpdir(), 'wm-e2e-'));
  const profileDir = join(scratch, 'profile');
  const home = join(scratch, 'home');
  const host = await startBrowserHost({ rendererDir: join(ROOT, 'dist/renderer'), demoDir: DEMO_DIR, openBrowser: false });
  const origin = new URL(host.url).origin;
  const outsideRequests: string[] = [];
  const pageErrors: string[] = [];

  const launch = async () => {
    const context = await chromium.launchPersistentContext(profileDir, {
      executablePath: CHROMIUM_PATH,
      headless: true,
      args: CHROMIUM_ARGS,
      viewport: { width: 1440, height: 900 },
      env: chromiumEnv(home),
    });
    const page = context.pages()[0] ?? (await context.newPage());
    page.on('request', (r) => {
      const u = r.url();
      if (!u.startsWith(origin) && !u.startsWith('data:') && !u.startsWith('blob:')) outsideRequests.push(u);
    });
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(host.url);
    return { context, page };
  };

  let current = await launch();
  const app: RunningApp = {
    get page() {
      return current.page;
    },
    get context() {
      return current.context;
    },
    url: host.url,
    outsideRequests,
    pageErrors,
    async relaunch() {
      await current.context.close();
      current = await launch();
    },
    async close() {
      await current.context.close().catch(() => {});
      await host.close();
      rmSync(scratch, { recursive: true, force: true });
    },
  };
  return app;
}

/**
 * Screenshot of the whole app: the main area scrolls inside the window, so the window is
 * made as tall as the content for the shot (unless a dialog is open), then restored.
 */
export async function shot(page: Page, name: string): Promise<void> {
  const size = page.viewportSize() ?? { width: 1440, height: 900 };
  const tall = await page.evaluate(() => {
    if (document.querySelector('dialog[open]')) return 0;
    const main = document.querySelector('main');
    return main ? main.scrollHeight + (document.querySelector('header')?.clientHeight ?? 0) + 2 : 0;
  });
  if (tall > size.height) await page.setViewportSize({ width: size.width, height: Math.min(tall, 6000) });
  await page.screenshot({ path: join(SHOTS, `${name}.png`) });
  if (tall > size.height) await page.setViewportSize(size);
}

/** Open files through the in-app chooser: type the folder, pick the files by name, Open. */
export async function openThroughChooser(page: Page, folder: string, names: string[], shotName?: string): Promise<void> {
  await page.getByRole('button', { name: /Open files/ }).click();
  const dialog = page.getByRole('dialog', { name: 'Open files' });
  await dialog.getByLabel('Folder path').fill(folder);
  await dialog.getByRole('button', { name: 'Go', exact: true }).click();
  for (const n of names) await dialog.getByRole('option', { name: new RegExp(`^\\W*${escapeRe(n)}`) }).click();
  if (shotName) await shot(page, shotName);
  await dialog.getByRole('button', { name: /^Open \d+/ }).click();
  await dialog.waitFor({ state: 'detached' });
}

export function escapeRe(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
