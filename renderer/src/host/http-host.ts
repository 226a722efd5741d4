/**
 * The HostApi over HTTP for browser mode (electron/serve.ts answers it). Calls are
 * POST /api/<call> with the arguments as a JSON array and the launch token in the
 * `x-whistlemark-token` header; the page learned the token from a meta tag the server
 * wrote into index.html. saveFile sends the bytes as the raw body.
 *
 * Example: const host = createHttpHost({ token }); await host.listDirectory('/media')
 */
import type { HostApi, HostCall, SaveRequest } from '../../../shared-types/host-api.ts';

export const TOKEN_HEADER = 'x-whistlemark-token';
export const SAVE_HEADER = 'x-whistlemark-save';
/** nativeClipFrames: the session id rides in this header, the batch is the raw body. */
export const SESSION_HEADER = 'x-whistlemark-session';
export const TOKEN_META = 'whistlemark-token';

export interface HttpHostOptions {
  token: string;
  /** Origin of the host server; the page's own origin by default. */
  base?: string;
  /** fetch to use (tests pass one that adds the cookie a browser would send). */
  fetch?: typeof fetch;
}

/** UTF-8 JSON as base64url, for a header (headers carry ASCII only). */
export function base64UrlJson(value: unknown): string {
  const bytes = new TextEncoder().encode(JSON.stringify(value));
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/**
 * Large bodies go as a Blob, not a typed array: Chromium then streams the body from blob
 * storage, and a DevTools client (the e2e tests, the headless export) is not handed a copy of
 * every byte — a 0.9 MB upload took 230–340 ms as a Uint8Array and 30–70 ms as a Blob there.
 */
function blobBody(bytes: Uint8Array): BodyInit {
  return new Blob([bytes as Uint8Array<ArrayBuffer>], { type: 'application/octet-stream' });
}

export function createHttpHost(opts: HttpHostOptions): HostApi {
  const doFetch = opts.fetch ?? ((input: RequestInfo | URL, init?: RequestInit) => fetch(input, init));
  const base = opts.base ?? '';

  async function answer<T>(res: Response, call: HostCall): Promise<T> {
    let body: { ok?: boolean; value?: T; error?: string } | undefined;
    try {
      body = (await res.json()) as typeof body;
    } catch {
      body = undefined;
    }
    if (res.ok && body?.ok) return body.value as T;
    throw new Error(body?.error ?? `${call}: the host answered ${res.status} ${res.statusText}`);
  }

  async function call<T>(name: HostCall, args: unknown[]): Promise<T> {
    const res = await doFetch(`${base}/api/${name}`, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { 'content-type': 'application/json', [TOKEN_HEADER]: opts.token },
      body: JSON.stringify(args),
    });
    return answer<T>(res, name);
  }

  return {
    info: async () => {
      const info = await call<Awaited<ReturnType<HostApi['info']>>>('info', []);
      // The page knows best whether it really is isolated.
      const isolated = (globalThis as { crossOriginIsolated?: boolean }).crossOriginIsolated;
      return typeof isolated === 'boolean' ? { ...info, crossOriginIsolated: isolated } : info;
    },
    chooseFiles: (purpose, multiple) => call('chooseFiles', [purpose, multiple]),
    listDirectory: (path) => call('listDirectory', path === undefined ? [] : [path]),
    openPaths: (paths) => call('openPaths', [paths]),
    demoMatch: () => call('demoMatch', []),
    probeFootage: (fileId) => call('probeFootage', [fileId]),
    playableFootage: (fileId) => call('playableFootage', [fileId]),
    saveFile: async (req: SaveRequest) => {
      const { bytes, ...meta } = req;
      const res = await doFetch(`${base}/api/saveFile`, {
        method: 'POST',
        credentials: 'same-origin',
        headers: { 'content-type': 'application/octet-stream', [TOKEN_HEADER]: opts.token, [SAVE_HEADER]: base64UrlJson(meta) },
        body: blobBody(bytes),
      });
      return answer(res, 'saveFile');
    },
    nativeClipStart: (req) => call('nativeClipStart', [req]),
    nativeClipFrames: async (sessionId, batch) => {
      const res = await doFetch(`${base}/api/nativeClipFrames`, {
        method: 'POST',
        credentials: 'same-origin',
        headers: { 'content-type': 'application/octet-stream', [TOKEN_HEADER]: opts.token, [SESSION_HEADER]: sessionId },
        body: blobBody(batch),
      });
      return answer(res, 'nativeClipFrames');
    },
    nativeClipFinish: (sessionId) => call('nativeClipFinish', [sessionId]),
    nativeClipCancel: (sessionId) => call('nativeClipCancel', [sessionId]),
  };
}
