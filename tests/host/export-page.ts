/**
 * Runs the renderer's export code in Debian Chromium for host tests and the benchmark: the
 * entry (tests/host/export-embedded-entry.ts) bundled by esbuild, served on 127.0.0.1 with
 * the media files as routes.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import type { Browser, Page } from 'playwright-core';
import { launchLocalChromium, serveFolder, type ServedFolder } from '../../build/local-chromium.ts';

export interface ExportPage {
  page: Page;
  dir: string;
  close(): Promise<void>;
}

export async function openExportPage(files: Record<string, string>): Promise<ExportPage> {
  const dir = mkdtempSync(join(tmpdir(), 'wm-export-page-'));
  mkdirSync(join(dir, 'site'));
  await build({
    entryPoints: [new URL('./export-embedded-entry.ts', import.meta.url).pathname],
    bundle: true,
    format: 'esm',
    outfile: join(dir, 'site/entry.js'),
    logLevel: 'error',
  });
  writeFileSync(join(dir, 'site/index.html'), '<!doctype html><meta charset="utf-8"><body><script type="module" src="entry.js"></script>');
  const routes: Record<string, { type: string; body: Buffer }> = {};
  for (const [route, path] of Object.entries(files)) routes[route] = { type: path.endsWith('.mp4') ? 'video/mp4' : 'text/plain', body: readFileSync(path) };
  const served: ServedFolder = await serveFolder(join(dir, 'site'), { routes });
  const browser: Browser = await launchLocalChromium(join(dir, 'home'));
  const page = await browser.newPage();
  const outside: string[] = [];
  page.on('request', (r) => {
    if (!r.url().startsWith(served.url) && !r.url().startsWith('data:') && !r.url().startsWith('blob:')) outside.push(r.url());
  });
  await page.goto(served.url);
  await page.waitForFunction(() => (window as unknown as { wm?: unknown }).wm);
  return {
    page,
    dir,
    async close() {
      await browser.close();
      served.server.close();
      rmSync(dir, { recursive: true, force: true });
      if (outside.length) throw new Error(`the export page asked outside hosts: ${outside.join(', ')}`);
    },
  };
}

/** Moves bytes out of the page as base64 (page.evaluate returns JSON). */
export const PAGE_B64 = `(bytes) => { let s = ''; for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000)); return btoa(s); }`;
