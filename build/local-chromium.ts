/**
 * Debian's Chromium for the e2e tests and the browser benchmarks: headless, no outside
 * lookups, caches and crash dumps under a folder of the run's own (../shared/MACHINE.md),
 * and a tiny loopback server for a folder of built bench pages.
 */
import { readFileSync } from 'node:fs';
import { createServer, type OutgoingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  // Outside host names resolve to nothing: nothing here may need the network.
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE 127.0.0.1',
];

/** Chromium writes caches and crash dumps under HOME even with a fresh profile. */
export function chromiumEnv(home: string): Record<string, string | undefined> {
  return {
    ...process.env,
    HOME: home,
    XDG_CONFIG_HOME: join(home, '.config'),
    XDG_CACHE_HOME: join(home, '.cache'),
    XDG_DATA_HOME: join(home, '.local/share'),
  };
}

/** `await launchLocalChromium('/tmp/run/home')` -> a headless Browser whose HOME is that folder. */
export function launchLocalChromium(home: string): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS, env: chromiumEnv(home) });
}

export interface ServedFolder {
  server: Server;
  /** http://127.0.0.1:PORT/ */
  url: string;
}

/**
 * Serves the flat files of `dir` on 127.0.0.1 (index.html at /), with `headers` on every
 * answer and `routes` answered from memory first.
 * `await serveFolder(dir, { routes: { '/data.csv': { type: 'text/csv', body } } })`
 */
export async function serveFolder(
  dir: string,
  opts: { headers?: OutgoingHttpHeaders; routes?: Record<string, { type: string; body: Buffer }> } = {},
): Promise<ServedFolder> {
  const headers = opts.headers ?? {};
  const server = createServer((req, res) => {
    const route = opts.routes?.[req.url ?? ''];
    if (route) return res.writeHead(200, { 'content-type': route.type, 'content-length': route.body.length, ...headers }).end(route.body);
    const name = req.url === '/' ? 'index.html' : (req.url ?? '').slice(1);
    if (!/^[\w.-]+$/.test(name)) return res.writeHead(404).end();
    let file: Buffer;
    try {
      file = readFileSync(join(dir, name));
    } catch {
      return res.writeHead(404).end();
    }
    res.writeHead(200, { 'content-type': name.endsWith('.js') ? 'text/javascript' : 'text/html', ...headers }).end(file);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return { server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/` };
}
