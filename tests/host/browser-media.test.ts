import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHost, type BrowserHost } from '../../electron/serve.ts';

// The browser host seen by a real browser (Debian chromium, headless): the page must be
// cross-origin isolated (HTML Living Standard: COOP same-origin + COEP require-corp gives
// crossOriginIsolated === true and SharedArrayBuffer), and <video> must play and seek
// an opened file through /files/ under that policy. Frame times: ffprobe (Debian ffmpeg
// 5.1) says cfr25.mp4 lasts 4.000000 s (fixtures/reference/cfr25.mp4.ffprobe.json).
const chromiumPath = '/usr/bin/chromium';
const refDir = new URL('../../fixtures/reference/', import.meta.url).pathname;
let tmp: string;
let host: BrowserHost;
let browser: Browser;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'wm-browser-'));
  const renderer = join(tmp, 'renderer');
  mkdirSync(renderer);
  writeFileSync(join(renderer, 'index.html'), '<!doctype html><html><head><title>t</title></head><body></body></html>');
  host = await startBrowserHost({ rendererDir: renderer, demoDir: join(tmp, 'none'), openBrowser: false, log: () => undefined });
  if (existsSync(chromiumPath)) {
    mkdirSync(join(tmp, 'home'));
    browser = await chromium.launch({
      executablePath: chromiumPath,
      headless: true,
      env: { ...process.env, HOME: join(tmp, 'home') },
      args: ['--no-sandbox', '--disable-quic', '--no-first-run', '--disable-background-networking', '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE 127.0.0.1'],
    });
  }
}, 120_000);

afterAll(async () => {
  await browser?.close();
  await host?.close();
  rmSync(tmp, { recursive: true, force: true });
});

describe.skipIf(!existsSync(chromiumPath))('browser mode in Chromium', () => {
  it('is cross-origin isolated, plays and seeks an opened file, and refuses header-less API calls', async () => {
    const page = await browser.newPage();
    await page.goto(host.url);
    const r = await page.evaluate(async (path) => {
      const token = document.querySelector<HTMLMetaElement>('meta[name="whistlemark-token"]')!.content;
      const res = await fetch('/api/openPaths', { method: 'POST', headers: { 'x-whistlemark-token': token, 'content-type': 'application/json' }, body: JSON.stringify([[path]]) });
      const file = ((await res.json()) as { value: { url: string }[] }).value[0];
      const v = document.createElement('video');
      v.muted = true;
      v.src = file.url;
      document.body.append(v);
      await new Promise((ok, fail) => {
        v.oncanplay = ok;
        v.onerror = () => fail(new Error(`video error ${v.error?.code}`));
      });
      v.currentTime = 2.52; // a frame time: 63 × 0.04 s
      await new Promise((ok) => (v.onseeked = ok));
      const range = await fetch(file.url, { headers: { Range: 'bytes=10-19' } });
      const noHeader = (await fetch('/api/info', { method: 'POST', body: '[]' })).status;
      return {
        isolated: crossOriginIsolated,
        sab: typeof SharedArrayBuffer,
        duration: v.duration,
        time: v.currentTime,
        rangeStatus: range.status,
        rangeBytes: (await range.arrayBuffer()).byteLength,
        noHeader,
        cookieVisible: document.cookie.includes('wm_token'),
      };
    }, join(refDir, 'cfr25.mp4'));
    expect(r.isolated).toBe(true);
    expect(r.sab).toBe('function');
    expect(r.duration).toBeCloseTo(4, 3);
    expect(r.time).toBeCloseTo(2.52, 3);
    expect(r.rangeStatus).toBe(206);
    expect(r.rangeBytes).toBe(10);
    expect(r.noHeader).toBe(403);
    expect(r.cookieVisible).toBe(false); // HttpOnly: page scripts cannot read the launch cookie
    await page.close();
  });
});
