/**
 * Runs the native export's renderer half (bench/export-native-entry.ts) in Debian's Chromium
 * launched as the app would open it — not driven over the DevTools protocol, which copies
 * every request body into its own events and would make the frame hand-over look ten times
 * slower than it is — against a small host answering the app's nativeClip* calls with the
 * app's own NativeSessions. Returns the seconds per size.
 */
import { spawn } from 'node:child_process';
import { mkdirSync, readFileSync } from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { build } from 'esbuild';
import { CHROMIUM_ARGS, CHROMIUM_PATH, chromiumEnv } from '../build/local-chromium.ts';
import { NativeSessions } from '../electron/host/export/native-sessions.ts';
import type { NativeClipStart } from '../shared-types/host-api.ts';

const ROOT = new URL('../', import.meta.url).pathname;
const DEMO = join(ROOT, 'fixtures/demo');

export async function runNativeInPlainChromium(scratch: string, job: unknown): Promise<Record<string, any>> {
  const site = join(scratch, 'native-site');
  mkdirSync(site, { recursive: true });
  await build({ entryPoints: [join(ROOT, 'bench/export-native-entry.ts')], bundle: true, format: 'esm', outfile: join(site, 'entry.js'), logLevel: 'error' });
  const entry = readFileSync(join(site, 'entry.js'));
  const csv = readFileSync(join(DEMO, 'tracking.csv'));
  const sessions = new NativeSessions();
  let finish: (r: Record<string, any>) => void = () => undefined;
  let fail: (e: Error) => void = () => undefined;
  const result = new Promise<Record<string, any>>((r, j) => ((finish = r), (fail = j)));
  const body = async (req: import('node:http').IncomingMessage) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    return Buffer.concat(chunks);
  };
  const server = createServer(async (req, res) => {
    const url = req.url ?? '/';
    const json = (v: unknown) => res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ ok: true, value: v ?? null }));
    try {
      if (url === '/result') {
        const r = JSON.parse((await body(req)).toString());
        res.writeHead(204).end();
        return r.error ? fail(new Error(r.error)) : finish(r);
      }
      if (url === '/api/nativeClipStart') {
        const [r] = JSON.parse((await body(req)).toString()) as [NativeClipStart];
        return json(await sessions.start(join(DEMO, 'footage.mp4'), { ...r, directory: scratch }));
      }
      if (url === '/api/nativeClipFrames') {
        const b = await body(req);
        return json(await sessions.frames(String(req.headers['x-whistlemark-session']), new Uint8Array(b.buffer, b.byteOffset, b.byteLength)));
      }
      if (url === '/api/nativeClipFinish') return json(await sessions.finish((JSON.parse((await body(req)).toString()) as [string])[0]));
      if (url === '/api/nativeClipCancel') return json(await sessions.cancel((JSON.parse((await body(req)).toString()) as [string])[0]));
      if (url === '/job.json') return res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(job));
      if (url === '/tracking.csv') return res.writeHead(200).end(csv);
      if (url === '/entry.js') return res.writeHead(200, { 'content-type': 'text/javascript' }).end(entry);
      res.writeHead(200, { 'content-type': 'text/html' }).end('<!doctype html><meta charset="utf-8"><script type="module" src="/entry.js"></script>');
    } catch (e) {
      res.writeHead(500, { 'content-type': 'application/json' }).end(JSON.stringify({ ok: false, error: (e as Error).message }));
    }
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const home = join(scratch, 'native-home');
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
  const child = spawn(CHROMIUM_PATH, ['--headless', ...CHROMIUM_ARGS, `--user-data-dir=${join(home, 'profile')}`, '--remote-debugging-port=0', url], { stdio: 'ignore', env: chromiumEnv(home) });
  try {
    return await result;
  } finally {
    child.kill();
    server.close();
    await sessions.cancelAll();
  }
}
