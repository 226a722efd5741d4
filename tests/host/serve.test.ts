import { mkdtempSync, mkdirSync, readFileSync, rmSync, writeFileSync, copyFileSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHost, type BrowserHost } from '../../electron/serve.ts';
import { createHttpHost } from '../../renderer/src/host/http-host.ts';
import type { OpenedFile } from '../../shared-types/host-api.ts';

// Browser-mode host over real loopback HTTP. Status codes and range semantics are checked
// against RFC 9110 (HTTP Semantics: §14 Range requests, §15.3.7 206, §15.5.17 416).

const refDir = new URL('../../fixtures/reference/', import.meta.url).pathname;
let tmp: string;
let host: BrowserHost;
let hostHeader: string;
let cookie: string;

interface Reply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: Buffer;
}

function raw(path: string, opts: { method?: string; headers?: Record<string, string>; body?: Buffer | string } = {}): Promise<Reply> {
  const { port } = new URL(host.origin);
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port: Number(port), path, method: opts.method ?? 'GET', headers: { host: hostHeader, ...opts.headers } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
    });
    req.on('error', reject);
    if (opts.body !== undefined) req.write(opts.body);
    req.end();
  });
}

/** Requests as the app page would make them: cookie, token header, our Origin. */
const asPage = (extra: Record<string, string> = {}) => ({ cookie, 'x-whistlemark-token': host.token, origin: host.origin, ...extra });

async function api(call: string, args: unknown, headers: Record<string, string> = asPage()) {
  const r = await raw(`/api/${call}`, { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body: JSON.stringify(args) });
  return { status: r.status, json: JSON.parse(r.body.toString('utf8')) as { ok: boolean; value?: unknown; error?: string } };
}

/** A fetch for the HTTP client that behaves like the browser: sends cookie + Origin. */
const pageFetch: typeof fetch = (input, init) => {
  const headers = new Headers(init?.headers);
  headers.set('cookie', cookie);
  headers.set('origin', host.origin);
  return fetch(new URL(String(input), host.origin), { ...init, headers, duplex: 'half' } as RequestInit);
};

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'wm-serve-'));
  const renderer = join(tmp, 'renderer');
  mkdirSync(join(renderer, 'assets'), { recursive: true });
  writeFileSync(join(renderer, 'index.html'), '<!doctype html><html><head><title>t</title></head><body>app</body></html>');
  writeFileSync(join(renderer, 'assets', 'app.js'), 'console.log(1)');
  const demo = join(tmp, 'demo');
  mkdirSync(demo);
  writeFileSync(join(demo, 'tracking.csv'), 'frame,id,x,y\n0,1,0,0\n');
  writeFileSync(join(demo, 'events.csv'), 'period,time,kind\n1,00:00.0,kick_off\n');
  copyFileSync(join(refDir, 'cfr25.mp4'), join(demo, 'footage.mp4'));
  writeFileSync(join(demo, 'truth.json'), JSON.stringify({ title: 'Demo: invented friendly' }));
  writeFileSync(join(tmp, 'secret.txt'), 'not opened');
  host = await startBrowserHost({ rendererDir: renderer, demoDir: demo, openBrowser: false, log: () => undefined });
  hostHeader = new URL(host.origin).host;
  const enter = await raw(new URL(host.url).pathname + new URL(host.url).search);
  const setCookie = enter.headers['set-cookie']?.[0] ?? '';
  cookie = setCookie.split(';')[0];
});

afterAll(async () => {
  await host?.close();
  rmSync(tmp, { recursive: true, force: true });
});

describe('launch token (our design: address once, then HttpOnly SameSite=Strict cookie + header)', () => {
  it('listens on loopback only and hands out a long random token', () => {
    expect(new URL(host.origin).hostname).toBe('127.0.0.1');
    expect(host.token.length).toBeGreaterThanOrEqual(40);
  });
  it('the address with the token sets the cookie and redirects away from the token', async () => {
    const r = await raw(new URL(host.url).pathname + new URL(host.url).search);
    expect(r.status).toBe(303);
    expect(r.headers.location).toBe('/');
    const c = String(r.headers['set-cookie']);
    expect(c).toMatch(/HttpOnly/);
    expect(c).toMatch(/SameSite=Strict/);
  });
  it('refuses the page, files and API without the token', async () => {
    expect((await raw('/')).status).toBe(403);
    expect((await raw('/assets/app.js')).status).toBe(403);
    expect((await api('info', [], { origin: host.origin })).status).toBe(403);
  });
  it('refuses a wrong token in the address, cookie or header', async () => {
    expect((await raw('/?t=' + 'x'.repeat(host.token.length))).status).toBe(403);
    expect((await raw('/', { headers: { cookie: 'wm_token=wrong' } })).status).toBe(403);
    expect((await api('info', [], asPage({ 'x-whistlemark-token': 'wrong' }))).status).toBe(403);
    // Cookie alone is not enough for the API (a cross-site form could not add the header).
    expect((await api('info', [], { cookie, origin: host.origin })).status).toBe(403);
  });
  it('serves the page with the token in a meta tag, isolation headers and a CSP', async () => {
    const r = await raw('/', { headers: { cookie } });
    expect(r.status).toBe(200);
    expect(r.body.toString()).toContain(`<meta name="whistlemark-token" content="${host.token}">`);
    // COOP/COEP values that make a page cross-origin isolated (HTML Living Standard, §7.1.3).
    expect(r.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(r.headers['cross-origin-embedder-policy']).toBe('require-corp');
    expect(r.headers['cross-origin-resource-policy']).toBe('same-origin');
    expect(String(r.headers['content-security-policy'])).toMatch(/default-src 'self'/);
    expect(String(r.headers['content-security-policy'])).not.toContain("'unsafe-eval'");
  });
});

describe('Host and Origin checks (DNS rebinding and cross-site requests)', () => {
  it('refuses a non-loopback Host header', async () => {
    for (const h of ['evil.example', `attacker.test:${new URL(host.origin).port}`, '127.0.0.1:1', '0.0.0.0']) {
      const r = await raw('/', { headers: { cookie, host: h } });
      expect(r.status, h).toBe(421);
    }
  });
  it('accepts localhost with our port', async () => {
    const r = await raw('/', { headers: { cookie, host: `localhost:${new URL(host.origin).port}` } });
    expect(r.status).toBe(200);
  });
  it('refuses a foreign Origin, also with a valid token', async () => {
    expect((await api('info', [], asPage({ origin: 'http://evil.example' }))).status).toBe(403);
    expect((await api('info', [], asPage({ origin: 'null' }))).status).toBe(403);
    expect((await raw('/', { headers: { cookie, origin: 'http://127.0.0.1:1' } })).status).toBe(403);
    expect((await raw('/', { headers: { cookie, 'sec-fetch-site': 'cross-site' } })).status).toBe(403);
  });
  it('API calls without any Origin are refused', async () => {
    expect((await api('info', [], { cookie, 'x-whistlemark-token': host.token })).status).toBe(403);
  });
});

describe('files: only opened ones, no traversal', () => {
  let opened: OpenedFile;
  beforeAll(async () => {
    const r = await api('openPaths', [[join(refDir, 'vfr.mkv')]]);
    opened = (r.json.value as OpenedFile[])[0];
  });
  it('refuses traversal in every spelling, and never leaks /etc/passwd', async () => {
    const attempts = [
      '/files/../../etc/passwd', '/files/..%2f..%2fetc%2fpasswd', '/files/%2e%2e/%2e%2e/etc/passwd', '/%2e%2e/%2e%2e/etc/passwd',
      '/assets/..%2f..%2f..%2fetc%2fpasswd', '/..%5c..%5cetc%5cpasswd', '/files/%252e%252e%252fetc%252fpasswd', '/assets/%00', '/../secret.txt',
      '/..%2fsecret.txt', `/files/${'../'.repeat(8)}${tmp.slice(1)}/secret.txt`,
    ];
    for (const path of attempts) {
      const r = await raw(path, { headers: { cookie } });
      expect(r.status, path).toBeGreaterThanOrEqual(400);
      expect(r.body.toString(), path).not.toMatch(/root:|not opened/);
    }
  });
  it('refuses a file that was not opened, and ids that are not ids', async () => {
    expect((await raw('/files/' + '0'.repeat(32), { headers: { cookie } })).status).toBe(404);
    expect((await raw('/files/' + encodeURIComponent(join(tmp, 'secret.txt')), { headers: { cookie } })).status).toBe(404);
  });
  it('serves the whole opened file with Content-Length and Accept-Ranges (RFC 9110 §14.3)', async () => {
    const whole = readFileSync(join(refDir, 'vfr.mkv'));
    const r = await raw(opened.url, { headers: { cookie } });
    expect(r.status).toBe(200);
    expect(r.headers['accept-ranges']).toBe('bytes');
    expect(Number(r.headers['content-length'])).toBe(whole.length);
    expect(r.body.equals(whole)).toBe(true);
  });
  it('byte ranges: closed, open-ended, suffix; 416 past the end (RFC 9110 §14.1.2, §15.5.17)', async () => {
    const whole = readFileSync(join(refDir, 'vfr.mkv'));
    const n = whole.length;
    const cases: [string, number, number][] = [
      ['bytes=0-0', 0, 0], ['bytes=100-1099', 100, 1099], ['bytes=5000-', 5000, n - 1], ['bytes=-500', n - 500, n - 1],
      [`bytes=${n - 10}-${n + 1000}`, n - 10, n - 1], [`bytes=-${n + 50}`, 0, n - 1],
    ];
    for (const [range, first, last] of cases) {
      const r = await raw(opened.url, { headers: { cookie, range } });
      expect(r.status, range).toBe(206);
      expect(r.headers['content-range'], range).toBe(`bytes ${first}-${last}/${n}`);
      expect(Number(r.headers['content-length']), range).toBe(last - first + 1);
      expect(r.body.equals(whole.subarray(first, last + 1)), range).toBe(true);
    }
    for (const range of [`bytes=${n}-`, `bytes=${n + 5}-${n + 9}`, 'bytes=-0']) {
      const r = await raw(opened.url, { headers: { cookie, range } });
      expect(r.status, range).toBe(416);
      expect(r.headers['content-range'], range).toBe(`bytes */${n}`);
    }
    // Several ranges or an unknown unit: the whole file (allowed by RFC 9110 §14.2).
    for (const range of ['bytes=0-1,5-6', 'frames=0-10']) {
      const r = await raw(opened.url, { headers: { cookie, range } });
      expect(r.status, range).toBe(200);
      expect(r.body.length).toBe(n);
    }
  });
  it('HEAD gives the length without a body', async () => {
    const r = await raw(opened.url, { method: 'HEAD', headers: { cookie } });
    expect(r.status).toBe(200);
    expect(Number(r.headers['content-length'])).toBe(readFileSync(join(refDir, 'vfr.mkv')).length);
    expect(r.body.length).toBe(0);
  });
});

describe('API arguments are validated (zod) with a clear message', () => {
  it('names the call, the argument and what was wrong', async () => {
    const bad: [string, unknown, RegExp][] = [
      ['listDirectory', [42], /listDirectory: argument 1: .*expected string/],
      ['openPaths', ['not-a-list'], /openPaths: argument 1: .*expected array/],
      ['openPaths', [[]], /openPaths: argument 1: needs at least one path/],
      ['probeFootage', ['../../etc/passwd'], /probeFootage: argument 1: is not a file id/],
      ['chooseFiles', ['video', true], /chooseFiles: argument 1: /],
      ['info', [1], /info: expected 0 arguments, got 1/],
      ['demoMatch', { a: 1 }, /demoMatch: arguments: expected a list/],
    ];
    for (const [call, args, message] of bad) {
      const r = await api(call, args);
      expect(r.status, call).toBe(400);
      expect(r.json.error, call).toMatch(message);
    }
  });
  it('refuses unknown calls and malformed JSON', async () => {
    expect((await api('deleteEverything', [])).status).toBe(404);
    const r = await raw('/api/info', { method: 'POST', headers: asPage({ 'content-type': 'application/json' }), body: '[1,' });
    expect(r.status).toBe(400);
    expect(r.body.toString()).toMatch(/not valid JSON/);
  });
  it('openPaths is all-or-nothing and names the missing file', async () => {
    const r = await api('openPaths', [[join(refDir, 'cfr25.mp4'), join(tmp, 'missing.csv')]]);
    expect(r.status).toBe(500);
    expect(r.json.error).toMatch(/Nothing was opened.*missing\.csv: file not found/);
  });
});

describe('the renderer HTTP client against the real server', () => {
  it('info, demoMatch, probeFootage, listDirectory, saveFile round-trip', async () => {
    const client = createHttpHost({ token: host.token, base: host.origin, fetch: pageFetch });
    const info = await client.info();
    expect(info.mode).toBe('browser');
    expect(info.nativeDialogs).toBe(false);
    const demo = await client.demoMatch();
    expect(demo?.title).toBe('Demo: invented friendly');
    expect(demo?.footage).toHaveLength(1);
    // ffprobe (Debian ffmpeg 5.1): cfr25.mp4 has 100 video frames (fixtures/reference/cfr25.mp4.ffprobe.json).
    const probe = await client.probeFootage(demo!.footage[0].fileId);
    const ref = JSON.parse(readFileSync(join(refDir, 'cfr25.mp4.ffprobe.json'), 'utf8')) as { frames: { media_type: string }[] };
    expect(probe.frameCount).toBe(ref.frames.filter((f) => f.media_type === 'video').length);
    const listing = await client.listDirectory(tmp);
    expect(listing.entries.map((e) => e.name)).toEqual(['demo', 'renderer', 'secret.txt']);
    const bytes = new Uint8Array([0, 1, 2, 255, 254, 10, 13]);
    const saved = await client.saveFile({ suggestedName: 'räksmörgås report.bin', directory: tmp, bytes });
    expect(saved.bytesWritten).toBe(7);
    expect(new Uint8Array(readFileSync(saved.path))).toEqual(bytes);
    await expect(client.saveFile({ suggestedName: 'räksmörgås report.bin', directory: tmp, bytes })).rejects.toThrow(/already exists/);
    await expect(client.saveFile({ suggestedName: '../escape.bin', directory: tmp, bytes })).rejects.toThrow(/not a usable file name/);
    await expect(client.chooseFiles('footage', false)).rejects.toThrow(/no native file dialog/);
  });
});
