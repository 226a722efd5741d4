/**
 * The Electron window's settings and the Content-Security-Policy of both hosts, as plain
 * data (no `electron` import) so a unit test can check them. The choices follow
 * Electron's security checklist (electronjs.org/docs/latest/tutorial/security):
 * context isolation, sandbox, no Node in the page, web security on, a strict CSP, no
 * navigation or new windows, permissions denied unless listed.
 */

/** Custom schemes: the app's own pages and the opened files (Electron only). */
export const APP_SCHEME = 'wmapp';
export const APP_HOST = 'bundle';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const FILE_SCHEME = 'wmfile';

export interface CspOptions {
  /** Extra sources allowed for media and fetch (Electron: the wmfile: scheme). */
  mediaSources?: string[];
}

/**
 * One policy for both hosts. 'wasm-unsafe-eval' lets ffmpeg.wasm compile WebAssembly
 * without allowing eval(); blob: workers are what ffmpeg.wasm and pixi start;
 * 'unsafe-inline' styles only (React style props), never inline scripts.
 */
export function contentSecurityPolicy(opts: CspOptions = {}): string {
  const extra = (opts.mediaSources ?? []).join(' ');
  const list = (...parts: string[]) => parts.filter(Boolean).join(' ');
  const directives: [string, string][] = [
    ['default-src', "'self'"],
    ['script-src', "'self' 'wasm-unsafe-eval'"],
    ['worker-src', "'self' blob:"],
    ['style-src', "'self' 'unsafe-inline'"],
    ['img-src', "'self' data: blob:"],
    ['font-src', "'self'"],
    ['media-src', list("'self'", 'blob:', extra)],
    ['connect-src', list("'self'", 'blob:', 'data:', extra)],
    ['object-src', "'none'"],
    ['frame-src', "'none'"],
    ['base-uri', "'none'"],
    ['form-action', "'none'"],
    ['frame-ancestors', "'none'"],
  ];
  return directives.map(([k, v]) => `${k} ${v}`).join('; ');
}

/** Headers on every response so the page is cross-origin isolated (SharedArrayBuffer). */
export function isolationHeaders(): Record<string, string> {
  return {
    'Cross-Origin-Opener-Policy': 'same-origin',
    'Cross-Origin-Embedder-Policy': 'require-corp',
    'Cross-Origin-Resource-Policy': 'same-origin',
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'no-referrer',
  };
}

/** The subset of Electron's BrowserWindowConstructorOptions we set (typed locally). */
export interface WindowOptions {
  width: number;
  height: number;
  minWidth: number;
  minHeight: number;
  title: string;
  show: boolean;
  backgroundColor: string;
  webPreferences: {
    preload: string;
    contextIsolation: boolean;
    sandbox: boolean;
    nodeIntegration: boolean;
    nodeIntegrationInWorker: boolean;
    nodeIntegrationInSubFrames: boolean;
    webSecurity: boolean;
    allowRunningInsecureContent: boolean;
    experimentalFeatures: boolean;
    webviewTag: boolean;
    navigateOnDragDrop: boolean;
    spellcheck: boolean;
    safeDialogs: boolean;
  };
}

export function windowOptions(preloadPath: string): WindowOptions {
  return {
    width: 1440,
    height: 900,
    minWidth: 1024,
    minHeight: 640,
    title: 'Whistlemark',
    show: false,
    backgroundColor: '#101418',
    webPreferences: {
      preload: preloadPath,
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      experimentalFeatures: false,
      webviewTag: false,
      navigateOnDragDrop: false,
      spellcheck: false,
      safeDialogs: true,
    },
  };
}

/** Permissions the page may have: none. (Clipboard writes need no permission.) */
export const ALLOWED_PERMISSIONS: readonly string[] = [];

/** True for a URL inside the app's own pages; IPC senders and navigations are checked with it. */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host === APP_HOST;
  } catch {
    return false;
  }
}
