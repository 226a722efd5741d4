/**
 * Electron main process: one hardened window on the app's own scheme, the HostApi over
 * IPC (every sender checked, every argument validated with zod), and opened files served
 * through the privileged `wmfile://` scheme with byte ranges.
 *
 * Security checklist (electronjs.org/docs/latest/tutorial/security): context isolation,
 * sandbox, no Node integration, web security on, strict CSP sent with every page, no
 * navigation, no new windows, no webviews, all permission requests denied, custom
 * protocols instead of file://, IPC senders validated.
 *
 * This file is bundled by scripts/start.mjs (esbuild) to dist/electron/main.mjs; the
 * `electron` module is loaded at run time (never imported for types: the package may be
 * absent, see electron/host/electron-shapes.ts).
 */
import { stat } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { basename, dirname, join } from 'node:path';
import { Readable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { HOST_CALLS, type HostApi } from '../shared-types/host-api.ts';
import { validateArgs } from './host/api-schemas.ts';
import { contentTypeFor, fileResponse } from './host/byte-range.ts';
import { filtersFor } from './host/dialog-filters.ts';
import type { BrowserWindowLike, ElectronMainLike } from './host/electron-shapes.ts';
import { createHostService } from './host/host-service.ts';
import { channelFor } from './host/ipc-channels.ts';
import { rendererContentType, resolveInside } from './host/static-files.ts';
import {
  ALLOWED_PERMISSIONS,
  APP_HOST,
  APP_ORIGIN,
  APP_SCHEME,
  contentSecurityPolicy,
  FILE_SCHEME,
  isAppUrl,
  isolationHeaders,
  windowOptions,
} from './host/window-options.ts';

const electron = createRequire(import.meta.url)('electron') as ElectronMainLike;
const { app, BrowserWindow, protocol, ipcMain, dialog, session, Menu } = electron;

// Bundled: dist/electron/main.mjs (two levels below the project root); unbundled:
// electron/main.ts (one level below).
const here = fileURLToPath(new URL('.', import.meta.url));
const projectRoot = basename(dirname(here)) === 'dist' ? join(here, '..', '..') : join(here, '..');
const rendererDir = process.env.WHISTLEMARK_RENDERER_DIR ?? join(projectRoot, 'dist', 'renderer');
const demoDir = process.env.WHISTLEMARK_DEMO_DIR ?? join(projectRoot, 'fixtures', 'demo');
const preloadPath = join(here, 'preload.cjs');

const csp = contentSecurityPolicy({ mediaSources: [`${FILE_SCHEME}:`] });
const pageHeaders = { ...isolationHeaders(), 'Content-Security-Policy': csp, 'Cache-Control': 'no-store' };

// Must run before the app is ready: the schemes behave like https (secure, standard),
// may be fetched, and stream (so <video> can seek with ranges).
protocol.registerSchemesAsPrivileged([
  { scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true, stream: true, codeCache: true } },
  { scheme: FILE_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true, stream: true, corsEnabled: true } },
]);

let mainWindow: BrowserWindowLike | undefined;

const service = createHostService({
  mode: 'electron',
  appVersion: app.getVersion(),
  fileUrl: (fileId, name) => `${FILE_SCHEME}://file/${fileId}/${encodeURIComponent(name)}`,
  demoDir,
  crossOriginIsolated: true,
  pickPaths: async (purpose, multiple) => {
    if (!mainWindow) return [];
    const r = await dialog.showOpenDialog(mainWindow, {
      title: `Open ${purpose === 'any' ? 'files' : purpose}`,
      properties: multiple ? ['openFile', 'multiSelections'] : ['openFile'],
      filters: filtersFor(purpose),
    });
    return r.canceled ? [] : r.filePaths;
  },
  pickSavePath: async (suggestedName, directory) => {
    if (!mainWindow) return null;
    const r = await dialog.showSaveDialog(mainWindow, { title: 'Save', defaultPath: directory ? join(directory, suggestedName) : suggestedName });
    return r.canceled || !r.filePath ? null : r.filePath;
  },
});

function text(status: number, message: string): Response {
  return new Response(message, { status, headers: { ...pageHeaders, 'Content-Type': 'text/plain; charset=utf-8' } });
}

/** wmapp://bundle/<path>: the built renderer, nothing else. */
async function serveApp(request: Request): Promise<Response> {
  const url = new URL(request.url);
  if (url.host !== APP_HOST) return text(404, 'not found');
  const file = resolveInside(rendererDir, url.pathname);
  if (!file) return text(400, 'refused: the address leaves the app folder');
  const info = await stat(file).catch(() => null);
  if (!info?.isFile()) return text(404, `not found${url.pathname === '/index.html' ? ': the app is not built (npm run build)' : ''}`);
  const r = fileResponse(file, info.size, request.headers.get('range'), rendererContentType(file), request.method === 'HEAD');
  return new Response(r.body ? (Readable.toWeb(r.body) as ReadableStream) : null, { status: r.status, headers: { ...pageHeaders, ...r.headers } });
}

/** wmfile://file/<fileId>/<name>: opened files only, with byte ranges. */
async function serveOpenedFile(request: Request): Promise<Response> {
  const url = new URL(request.url);
  const fileId = url.pathname.split('/')[1] ?? '';
  const file = url.host === 'file' ? service.files.get(fileId) : undefined;
  if (!file) return text(404, 'no such opened file; open it in the app first');
  const info = await stat(file.path).catch(() => null);
  if (!info?.isFile()) return text(410, `${file.path} is no longer there; relink the file`);
  const r = fileResponse(file.path, info.size, request.headers.get('range'), contentTypeFor(file.name), request.method === 'HEAD');
  const headers = {
    ...pageHeaders,
    ...r.headers,
    // The page (wmapp://bundle) is another origin: allow it, and only it, to read.
    'Access-Control-Allow-Origin': APP_ORIGIN,
    'Access-Control-Expose-Headers': 'Content-Range, Content-Length, Accept-Ranges',
    'Cross-Origin-Resource-Policy': 'cross-origin',
  };
  return new Response(r.body ? (Readable.toWeb(r.body) as ReadableStream) : null, { status: r.status, headers });
}

function registerIpc(): void {
  for (const call of HOST_CALLS) {
    ipcMain.handle(channelFor(call), async (event, ...args) => {
      const from = event.senderFrame?.url ?? '';
      if (!isAppUrl(from)) throw new Error(`refused: ${call} called from outside the app (${from || 'unknown frame'})`);
      const valid = validateArgs(call, args);
      return (service.api[call] as (...a: unknown[]) => ReturnType<HostApi[typeof call]>)(...valid);
    });
  }
}

function lockDown(): void {
  session.defaultSession.setPermissionRequestHandler((_wc, permission, callback) => callback(ALLOWED_PERMISSIONS.includes(permission)));
  session.defaultSession.setPermissionCheckHandler((_wc, permission) => ALLOWED_PERMISSIONS.includes(permission));
  app.on('web-contents-created', (_event, contents) => {
    const refuse = (event: { preventDefault(): void }, url: string) => {
      if (!isAppUrl(url)) event.preventDefault();
    };
    contents.on('will-navigate', refuse);
    contents.on('will-redirect', refuse);
    contents.on('will-attach-webview', (event) => event.preventDefault());
    contents.setWindowOpenHandler(() => ({ action: 'deny' }));
  });
}

function createWindow(): void {
  const win = new BrowserWindow(windowOptions(preloadPath));
  mainWindow = win;
  win.once('ready-to-show', () => win.show());
  void win.loadURL(`${APP_ORIGIN}/index.html`);
}

lockDown();
registerIpc();
app.on('window-all-closed', () => app.quit());
// A native clip export still running: stop its ffmpeg and remove its temporary file.
app.on('will-quit', () => void service.exports.cancelAll());
void app.whenReady().then(() => {
  Menu.setApplicationMenu(null);
  protocol.handle(APP_SCHEME, serveApp);
  protocol.handle(FILE_SCHEME, serveOpenedFile);
  createWindow();
  app.on('activate', () => {
    if (!mainWindow) createWindow();
  });
});
