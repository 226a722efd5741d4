/**
 * getHost(): the one HostApi the renderer talks to. In Electron the preload script has
 * put it on `window.whistlemark`; in browser mode it is the HTTP client, with the token
 * the server wrote into the page. Plus helpers to load an opened file's bytes.
 *
 * Example: const host = getHost(); const demo = await host.demoMatch();
 *          const res = await fetchFile(demo.footage[0], { range: [0, 1023] });
 */
import type { HostApi, OpenedFile } from '../../../shared-types/host-api.ts';
import { createHttpHost, TOKEN_META } from './http-host.ts';

declare global {
  interface Window {
    whistlemark?: HostApi;
  }
}

let host: HostApi | undefined;

function pageToken(): string | undefined {
  if (typeof document === 'undefined') return undefined;
  const meta = document.querySelector<HTMLMetaElement>(`meta[name="${TOKEN_META}"]`);
  return meta?.content || undefined;
}

export function getHost(): HostApi {
  if (host) return host;
  const bridged = typeof window !== 'undefined' ? window.whistlemark : undefined;
  if (bridged) {
    host = bridged;
    return host;
  }
  const token = pageToken();
  if (!token) {
    throw new Error(
      'No Whistlemark host found: this page was opened without the app. Start it with "npm start" and use the address it prints.',
    );
  }
  host = createHttpHost({ token });
  return host;
}

/** Absolute URL of an opened file, for <video src>, workers and fetch. */
export function fileUrl(file: Pick<OpenedFile, 'url'>): string {
  const base = typeof location !== 'undefined' ? location.href : 'http://127.0.0.1/';
  return new URL(file.url, base).href;
}

export interface FetchFileOptions {
  /** Inclusive byte range [first, last]; last may be omitted for "to the end". */
  range?: [number, number?];
  signal?: AbortSignal;
}

/**
 * Fetches an opened file (or a byte range of it). The browser host accepts the launch
 * cookie, which same-origin fetches send by themselves; Electron serves wmfile:// URLs.
 */
export async function fetchFile(file: Pick<OpenedFile, 'url' | 'name'>, opts: FetchFileOptions = {}): Promise<Response> {
  const headers: Record<string, string> = {};
  if (opts.range) headers.Range = `bytes=${opts.range[0]}-${opts.range[1] ?? ''}`;
  const res = await fetch(fileUrl(file), { headers, credentials: 'same-origin', signal: opts.signal });
  if (!res.ok) {
    const text = await res.text().catch(() => '');
    throw new Error(`${file.name}: could not read the file (${res.status}${text ? `: ${text.trim()}` : ''})`);
  }
  return res;
}

export { createHttpHost } from './http-host.ts';
