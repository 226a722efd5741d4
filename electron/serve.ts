/**
 * Browser mode: the same HostApi as Electron, over HTTP on 127.0.0.1 only.
 *
 * Access: a random token per launch. The printed address carries it once (`/?t=…`); the
 * server answers with an HttpOnly SameSite=Strict cookie and a redirect to `/`, then
 * writes the token into the page (<meta name="whistlemark-token">) so API calls can send
 * it as `x-whistlemark-token` too. Every request needs the cookie; API calls also need
 * the header (a foreign page can set neither). The Host header must be our loopback
 * address (stops DNS rebinding) and a foreign Origin is refused.
 *
 * Routes: GET / and the built renderer (dist/renderer); GET/HEAD /files/<fileId>[/name]
 * for opened files only, with byte ranges; POST /api/<call> with a JSON array of
 * arguments (validated by zod); POST /api/saveFile with the raw bytes as the body and the
 * rest of the request in the `x-whistlemark-save` header (base64url JSON).
 *
 * Run directly: `tsx electron/serve.ts [--port 8710] [--no-open] [--demo dir] [--renderer dir]`.
 */
import { spawn } from 'node:child_process';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { existsSync } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { delimiter, extname, join, resolve, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import { HostArgumentError, isHostCall, saveMetaSchema, validateArgs } from './host/api-schemas.ts';
import { contentTypeFor, fileResponse } from './host/byte-range.ts';
import { createHostService } from './host/host-service.ts';
import { rendererContentType, resolveInside } from './host/static-files.ts';
import { contentSecurityPolicy, isolationHeaders } from './host/window-options.ts';

export interface BrowserHostOptions {
  port?: number;
  rendererDir: string;
  demoDir?: string;
  openBrowser?: boolean;
  log?: (line: string) => void;
}

export interface BrowserHost {
  /** The address to open, token included. */
  url: string;
  origin: string;
  token: string;
  close(): Promise<void>;
}

export const TOKEN_COOKIE = 'wm_token';
export const TOKEN_HEADER = 'x-whistlemark-token';
export const SAVE_HEADER = 'x-whistlemark-save';
const MAX_JSON_BODY = 1 << 20;
/** saveFile bodies are held in memory before the atomic write; cap them. */
const MAX_SAVE_BODY = 1 << 30;
/** nativeClipFrames: the session id header, and a cap on one batch of overlay frames. */
export const SESSION_HEADER = 'x-whistlemark-session';
const MAX_FRAME_BATCH = 256 << 20;

class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

function sameToken(given: string | undefined, token: string): boolean {
  if (!given) return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

function cookieValue(req: IncomingMessage, name: string): string | undefined {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const [k, ...v] = part.trim().split('=');
    if (k === name) return v.join('=');
  }
  return undefined;
}

async function readJsonBody(req: IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req as AsyncIterable<Buffer>) {
    size += chunk.length;
    if (size > MAX_JSON_BODY) throw new HttpError(413, 'request body too large (more than 1 MB of arguments)');
    chunks.push(chunk);
  }
  const text = Buffer.concat(chunks).toString('utf8');
  if (text.trim() === '') return [];
  try {
    return JSON.parse(text) as unknown;
  } catch (e) {
    throw new HttpError(400, `arguments are not valid JSON (${(e as Error).message})`);
  }
}

/** Opens the system browser unless under CI or told not to; says what it did. */
function openInBrowser(url: string, log: (line: string) => void): void {
  const candidates = [process.env.BROWSER, process.platform === 'darwin' ? 'open' : process.platform === 'win32' ? undefined : 'xdg-open'].filter(
    (c): c is string => Boolean(c),
  );
  const onPath = (cmd: string) =>
    cmd.includes(sep) ? existsSync(cmd) : (process.env.PATH ?? '').split(delimiter).some((d) => d && existsSync(join(d, cmd)));
  const cmd = candidates.find(onPath);
  if (!cmd) {
    log('No system browser command found ($BROWSER or xdg-open); open the address above yourself.');
    return;
  }
  try {
    const child = spawn(cmd, [url], { detached: true, stdio: 'ignore' });
    child.on('error', () => log(`Could not start ${cmd}; open the address above yourself.`));
    child.unref();
    log(`Opened the address with ${cmd}.`);
  } catch {
    log(`Could not start ${cmd}; open the address above yourself.`);
  }
}

export async function startBrowserHost(opts: BrowserHostOptions): Promise<BrowserHost> {
  const log = opts.log ?? ((line: string) => console.log(line));
  const token = randomBytes(32).toString('base64url');
  const rendererDir = resolve(opts.rendererDir);
  const csp = contentSecurityPolicy();
  const common = { ...isolationHeaders(), 'Content-Security-Policy': csp, 'Cache-Control': 'no-store' };
  const service = createHostService({
    mode: 'browser',
    fileUrl: (fileId, name) => `/files/${fileId}/${encodeURIComponent(name)}`,
    demoDir: opts.demoDir,
    crossOriginIsolated: true,
  });

  let port = 0;
  const allowedHosts = () => new Set([`127.0.0.1:${port}`, `localhost:${port}`]);
  const allowedOrigins = () => new Set([`http://127.0.0.1:${port}`, `http://localhost:${port}`]);

  function send(res: ServerResponse, status: number, body: string | Buffer, type = 'text/plain; charset=utf-8', extra: Record<string, string> = {}) {
    res.writeHead(status, { ...common, 'Content-Type': type, 'Content-Length': String(Buffer.byteLength(body)), ...extra });
    res.end(body);
  }

  function sendJson(res: ServerResponse, status: number, value: unknown) {
    send(res, status, JSON.stringify(value), 'application/json; charset=utf-8');
  }

  async function serveRenderer(res: ServerResponse, pathname: string, head: boolean) {
    const file = resolveInside(rendererDir, pathname);
    if (!file) throw new HttpError(400, 'refused: the address leaves the app folder');
    const info = await stat(file).catch(() => null);
    if (!info?.isFile()) {
      if (file === join(rendererDir, 'index.html')) {
        throw new HttpError(503, `The app is not built: ${file} is missing. Run "npm run build" (or "npm start", which builds it).`);
      }
      throw new HttpError(404, 'not found');
    }
    if (extname(file) === '.html') {
      // The page learns the token for API calls from a meta tag (never from the URL).
      const html = (await readFile(file, 'utf8')).replace(/<head>/i, `<head><meta name="whistlemark-token" content="${token}">`);
      if (head) {
        res.writeHead(200, { ...common, 'Content-Type': 'text/html; charset=utf-8' });
        res.end();
        return;
      }
      send(res, 200, html, 'text/html; charset=utf-8');
      return;
    }
    const r = fileResponse(file, info.size, undefined, rendererContentType(file), head);
    res.writeHead(r.status, { ...common, ...r.headers });
    if (r.body) r.body.pipe(res);
    else res.end();
  }

  async function serveOpenedFile(req: IncomingMessage, res: ServerResponse, rest: string, head: boolean) {
    const fileId = rest.split('/')[0] ?? '';
    const file = service.files.get(fileId);
    if (!file) throw new HttpError(404, 'no such opened file; open it in the app first');
    const info = await stat(file.path).catch(() => null);
    if (!info?.isFile()) throw new HttpError(410, `${file.path} is no longer there; relink the file`);
    const r = fileResponse(file.path, info.size, req.headers.range, contentTypeFor(file.name), head);
    res.writeHead(r.status, { ...common, ...r.headers });
    if (r.body) {
      r.body.on('error', () => res.destroy());
      r.body.pipe(res);
    } else res.end();
  }

  async function callApi(req: IncomingMessage, res: ServerResponse, call: string) {
    if (!isHostCall(call)) throw new HttpError(404, `no such call: ${call}`);
    let value: unknown;
    if (call === 'saveFile') {
      const meta = req.headers[SAVE_HEADER];
      if (typeof meta !== 'string') throw new HttpError(400, `saveFile: the ${SAVE_HEADER} header (file name, folder, overwrite) is missing`);
      let parsed: unknown;
      try {
        parsed = JSON.parse(Buffer.from(meta, 'base64url').toString('utf8'));
      } catch {
        throw new HttpError(400, `saveFile: the ${SAVE_HEADER} header is not base64url JSON`);
      }
      const m = saveMetaSchema.safeParse(parsed);
      if (!m.success) {
        throw new HttpError(400, `saveFile: argument 1 ${m.error.issues.map((i) => `.${i.path.join('.')}: ${i.message}`).join('; ')}`);
      }
      const chunks: Buffer[] = [];
      let size = 0;
      for await (const chunk of req as AsyncIterable<Buffer>) {
        size += chunk.length;
        if (size > MAX_SAVE_BODY) throw new HttpError(413, 'saveFile: more than 1 GB in one save; export large clips through the export writer instead');
        chunks.push(chunk);
      }
      const bytes = new Uint8Array(Buffer.concat(chunks));
      value = await service.api.saveFile(validateArgs('saveFile', [{ ...m.data, bytes }])[0]);
    } else if (call === 'nativeClipFrames') {
      const sessionId = req.headers[SESSION_HEADER];
      const chunks: Buffer[] = [];
      let size = 0;
      for await (const chunk of req as AsyncIterable<Buffer>) {
        size += chunk.length;
        if (size > MAX_FRAME_BATCH) throw new HttpError(413, `nativeClipFrames: more than ${MAX_FRAME_BATCH >> 20} MB in one batch; send fewer frames per call`);
        chunks.push(chunk);
      }
      // The frames are read as 32-bit words; wordsOf copies the batch if this view is not aligned.
      const body = Buffer.concat(chunks);
      const batch = new Uint8Array(body.buffer, body.byteOffset, body.byteLength);
      value = await service.api.nativeClipFrames(...validateArgs('nativeClipFrames', [sessionId, batch]));
    } else {
      const args = validateArgs(call, await readJsonBody(req));
      value = await (service.api[call] as (...a: unknown[]) => Promise<unknown>)(...args);
    }
    sendJson(res, 200, { ok: true, value: value ?? null });
  }

  async function handle(req: IncomingMessage, res: ServerResponse) {
    // 1. Only our own loopback address (a rebinding DNS name would carry its own Host).
    if (!allowedHosts().has(req.headers.host ?? '')) throw new HttpError(421, 'refused: wrong Host header');
    // 2. No foreign pages: Origin, when sent, must be ours; Fetch Metadata likewise.
    const origin = req.headers.origin;
    if (origin !== undefined && !allowedOrigins().has(origin)) throw new HttpError(403, 'refused: request from another site');
    const site = req.headers['sec-fetch-site'];
    if (site !== undefined && site !== 'same-origin' && site !== 'none') throw new HttpError(403, 'refused: request from another site');

    const url = new URL(req.url ?? '/', `http://127.0.0.1:${port}`);
    const method = req.method ?? 'GET';
    // 3. The token: once in the address, then the cookie.
    const fromQuery = url.searchParams.get('t') ?? undefined;
    if (fromQuery !== undefined) {
      if (!sameToken(fromQuery, token) || (method !== 'GET' && method !== 'HEAD')) throw new HttpError(403, 'refused: wrong or missing access token');
      res.writeHead(303, {
        ...common,
        Location: '/',
        'Set-Cookie': `${TOKEN_COOKIE}=${token}; HttpOnly; SameSite=Strict; Path=/`,
        'Content-Length': '0',
      });
      res.end();
      return;
    }
    if (!sameToken(cookieValue(req, TOKEN_COOKIE), token)) {
      throw new HttpError(403, 'refused: wrong or missing access token; open the address the app printed when it started');
    }

    const path = url.pathname;
    if (path.startsWith('/api/')) {
      if (method !== 'POST') throw new HttpError(405, 'API calls are POST');
      const header = req.headers[TOKEN_HEADER];
      if (!sameToken(typeof header === 'string' ? header : undefined, token)) throw new HttpError(403, `refused: API calls need the ${TOKEN_HEADER} header`);
      if (origin === undefined) throw new HttpError(403, 'refused: API calls must come from the app page (no Origin header)');
      await callApi(req, res, path.slice('/api/'.length));
      return;
    }
    if (method !== 'GET' && method !== 'HEAD') throw new HttpError(405, 'method not allowed');
    if (path.startsWith('/files/')) {
      await serveOpenedFile(req, res, path.slice('/files/'.length), method === 'HEAD');
      return;
    }
    await serveRenderer(res, path, method === 'HEAD');
  }

  const server = createServer((req, res) => {
    handle(req, res).catch((e: unknown) => {
      const status = e instanceof HttpError ? e.status : e instanceof HostArgumentError ? 400 : 500;
      const message = e instanceof Error ? e.message : String(e);
      if (res.headersSent) {
        res.destroy();
        return;
      }
      if ((req.url ?? '').startsWith('/api/')) sendJson(res, status, { ok: false, error: message });
      else send(res, status, `Whistlemark: ${message}\n`);
    });
  });

  await new Promise<void>((resolveListen, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolveListen());
  });
  port = (server.address() as AddressInfo).port;
  const origin = `http://127.0.0.1:${port}`;
  const url = `${origin}/?t=${token}`;
  log(`Whistlemark (browser mode) is at ${url}`);
  if (opts.openBrowser !== false && !process.env.CI) openInBrowser(url, log);
  else log(process.env.CI ? 'CI is set: not opening a browser.' : 'Not opening a browser (asked not to).');

  return {
    url,
    origin,
    token,
    close: () =>
      new Promise<void>((resolveClose) => {
        void service.exports.cancelAll();
        server.closeAllConnections();
        server.close(() => resolveClose());
      }),
  };
}

function argValue(args: string[], name: string): string | undefined {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
}

// Run directly: tsx electron/serve.ts
if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const args = process.argv.slice(2);
  const root = new URL('..', import.meta.url).pathname;
  const portArg = argValue(args, '--port');
  const host = await startBrowserHost({
    port: portArg ? Number(portArg) : undefined,
    rendererDir: argValue(args, '--renderer') ?? join(root, 'dist/renderer'),
    demoDir: argValue(args, '--demo'),
    openBrowser: !args.includes('--no-open'),
  });
  const stop = () => {
    void host.close().then(() => process.exit(0));
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}
