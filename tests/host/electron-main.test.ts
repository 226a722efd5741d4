import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runInNewContext } from 'node:vm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildElectronBundle } from '../../scripts/electron-binary.mjs';
import { HOST_CALLS } from '../../shared-types/host-api.ts';
import { windowOptions } from '../../electron/host/window-options.ts';

// electron/main.ts and preload.ts, bundled exactly as npm start bundles them, run against
// a recording stand-in for the electron module (the real binary cannot be installed
// here). The expectations are Electron's security checklist
// (electronjs.org/docs/latest/tutorial/security; item numbers from memory) and RFC 9110
// for the byte ranges.

interface FakeState {
  privileged: { scheme: string; privileges: Record<string, boolean> }[];
  registeredBeforeReady: boolean;
  protocols: Record<string, (r: Request) => Promise<Response>>;
  ipc: Record<string, (event: { senderFrame: { url: string } | null }, ...args: unknown[]) => Promise<unknown>>;
  windows: { options: ReturnType<typeof windowOptions>; loaded: string[] }[];
  appListeners: Record<string, ((...a: unknown[]) => void)[]>;
  permissionRequest: (wc: unknown, permission: string, cb: (granted: boolean) => void) => void;
  permissionCheck: (wc: unknown, permission: string) => boolean;
  openDialogResult: { canceled: boolean; filePaths: string[] };
  lastOpenDialog?: { properties: string[]; filters: { extensions: string[] }[] };
  menu: unknown;
}

const refDir = new URL('../../fixtures/reference/', import.meta.url).pathname;
const projectRoot = new URL('../..', import.meta.url).pathname;
let tmp: string;
let fake: FakeState;
const app = { senderFrame: { url: 'wmapp://bundle/index.html' } };

async function until(check: () => boolean): Promise<void> {
  for (let i = 0; i < 200 && !check(); i++) await new Promise((r) => setTimeout(r, 5));
}

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'wm-electron-'));
  mkdirSync(join(tmp, 'node_modules', 'electron'), { recursive: true });
  copyFileSync(new URL('./fake-electron.cjs', import.meta.url), join(tmp, 'node_modules', 'electron', 'index.js'));
  writeFileSync(join(tmp, 'node_modules', 'electron', 'package.json'), '{"name":"electron","main":"index.js"}');
  const renderer = join(tmp, 'renderer');
  mkdirSync(renderer);
  writeFileSync(join(renderer, 'index.html'), '<!doctype html><html><head></head><body>app</body></html>');
  writeFileSync(join(tmp, 'secret.txt'), 'not opened');
  process.env.WHISTLEMARK_RENDERER_DIR = renderer;
  process.env.WHISTLEMARK_DEMO_DIR = join(tmp, 'no-demo');
  const main = await buildElectronBundle(projectRoot, join(tmp, 'dist', 'electron'), { bundlePackages: true });
  await import(/* @vite-ignore */ main);
  fake = (globalThis as unknown as { __wmFakeElectron: FakeState }).__wmFakeElectron;
  await until(() => fake.windows.length > 0);
}, 120_000);

afterAll(() => {
  delete process.env.WHISTLEMARK_RENDERER_DIR;
  delete process.env.WHISTLEMARK_DEMO_DIR;
  rmSync(tmp, { recursive: true, force: true });
});

describe('Electron main process (against a recording electron stand-in)', () => {
  it('registers wmapp: and wmfile: as privileged before the app is ready (protocol.registerSchemesAsPrivileged docs)', () => {
    expect(fake.registeredBeforeReady).toBe(true);
    const byName = Object.fromEntries(fake.privileged.map((s) => [s.scheme, s.privileges]));
    for (const scheme of ['wmapp', 'wmfile']) {
      expect(byName[scheme]).toMatchObject({ standard: true, secure: true, supportFetchAPI: true, stream: true });
    }
    expect(Object.keys(fake.protocols).sort()).toEqual(['wmapp', 'wmfile']);
  });

  it('opens one window with the hardened options on the app scheme, no menu', () => {
    expect(fake.windows).toHaveLength(1);
    const w = fake.windows[0];
    expect(w.options.webPreferences.preload).toMatch(/preload\.cjs$/);
    expect(w.options).toEqual(windowOptions(w.options.webPreferences.preload));
    expect(w.loaded).toEqual(['wmapp://bundle/index.html']);
    expect(fake.menu).toBeNull();
  });

  it('denies every permission request and check (checklist item 5)', () => {
    for (const p of ['media', 'geolocation', 'notifications', 'clipboard-read', 'openExternal', 'fullscreen']) {
      let granted: boolean | undefined;
      fake.permissionRequest(null, p, (g) => (granted = g));
      expect(granted, p).toBe(false);
      expect(fake.permissionCheck(null, p), p).toBe(false);
    }
  });

  it('refuses navigation away, new windows and webviews (checklist items 12-14)', () => {
    const on: Record<string, (e: { preventDefault(): void }, url?: string) => void> = {};
    let openHandler: ((d: { url: string }) => { action: string }) | undefined;
    const contents = { on: (ev: string, l: (e: { preventDefault(): void }, url?: string) => void) => (on[ev] = l), setWindowOpenHandler: (h: typeof openHandler) => (openHandler = h) };
    for (const l of fake.appListeners['web-contents-created']) l({}, contents);
    const tryNavigate = (event: string, url: string) => {
      let prevented = false;
      on[event]({ preventDefault: () => (prevented = true) }, url);
      return prevented;
    };
    for (const url of ['https://example.test/', 'file:///etc/passwd', 'wmfile://file/x', 'wmapp://other/index.html', 'javascript:alert(1)']) {
      expect(tryNavigate('will-navigate', url), url).toBe(true);
      expect(tryNavigate('will-redirect', url), url).toBe(true);
    }
    expect(tryNavigate('will-navigate', 'wmapp://bundle/index.html')).toBe(false);
    expect(openHandler?.({ url: 'https://example.test/' })).toEqual({ action: 'deny' });
    let webviewPrevented = false;
    on['will-attach-webview']({ preventDefault: () => (webviewPrevented = true) });
    expect(webviewPrevented).toBe(true);
  });

  it('answers every HostApi call over IPC, and only to the app frame (checklist item 17)', async () => {
    expect(Object.keys(fake.ipc).sort()).toEqual(HOST_CALLS.map((c) => `whistlemark:${c}`).sort());
    const info = (await fake.ipc['whistlemark:info'](app)) as { mode: string; nativeDialogs: boolean };
    expect(info).toMatchObject({ mode: 'electron', nativeDialogs: true });
    for (const url of ['https://evil.test/', 'file:///tmp/x.html', 'wmfile://file/abc', '']) {
      await expect(fake.ipc['whistlemark:info']({ senderFrame: url ? { url } : null }), url).rejects.toThrow(/refused: info called from outside the app/);
    }
  });

  it('validates IPC arguments with zod and names what is wrong', async () => {
    await expect(fake.ipc['whistlemark:openPaths'](app, 'not a list')).rejects.toThrow(/openPaths: argument 1: .*expected array/);
    await expect(fake.ipc['whistlemark:probeFootage'](app, '/etc/passwd')).rejects.toThrow(/probeFootage: argument 1: is not a file id/);
    await expect(fake.ipc['whistlemark:saveFile'](app, { suggestedName: 'x', bytes: 'text' })).rejects.toThrow(/saveFile: argument 1 \.bytes/);
    await expect(fake.ipc['whistlemark:chooseFiles'](app, 'footage')).rejects.toThrow(/chooseFiles: expected 2 arguments, got 1/);
  });

  it('native open dialog: filters by purpose, cancel gives []', async () => {
    fake.openDialogResult = { canceled: true, filePaths: [] };
    expect(await fake.ipc['whistlemark:chooseFiles'](app, 'footage', true)).toEqual([]);
    expect(fake.lastOpenDialog?.properties).toEqual(['openFile', 'multiSelections']);
    expect(fake.lastOpenDialog?.filters[0].extensions).toContain('mp4');
    fake.openDialogResult = { canceled: false, filePaths: [join(refDir, 'cfr25.mp4')] };
    const files = (await fake.ipc['whistlemark:chooseFiles'](app, 'footage', false)) as { url: string }[];
    expect(files[0].url).toMatch(/^wmfile:\/\/file\/[0-9a-f]{32}\/cfr25\.mp4$/);
  });

  it('wmfile: serves opened files only, with byte ranges and CORS for the app origin only (RFC 9110 §14)', async () => {
    const [file] = (await fake.ipc['whistlemark:openPaths'](app, [join(refDir, 'ntsc.mov')])) as { url: string }[];
    const whole = readFileSync(join(refDir, 'ntsc.mov'));
    const r = await fake.protocols.wmfile(new Request(file.url, { headers: { Range: 'bytes=100-199' } }));
    expect(r.status).toBe(206);
    expect(r.headers.get('content-range')).toBe(`bytes 100-199/${whole.length}`);
    expect(Buffer.from(await r.arrayBuffer()).equals(whole.subarray(100, 200))).toBe(true);
    expect(r.headers.get('access-control-allow-origin')).toBe('wmapp://bundle');
    const full = await fake.protocols.wmfile(new Request(file.url));
    expect(full.status).toBe(200);
    expect(Buffer.from(await full.arrayBuffer()).equals(whole)).toBe(true);
    const past = await fake.protocols.wmfile(new Request(file.url, { headers: { Range: `bytes=${whole.length}-` } }));
    expect(past.status).toBe(416);
    for (const bad of ['wmfile://file/' + '0'.repeat(32), 'wmfile://file/../../etc/passwd', `wmfile://file/${encodeURIComponent(join(tmp, 'secret.txt'))}`, 'wmfile://other/' + file.url.split('/')[3]]) {
      const res = await fake.protocols.wmfile(new Request(bad));
      expect(res.status, bad).toBe(404);
      expect(await res.text(), bad).not.toMatch(/root:|not opened$/);
    }
  });

  it('wmapp: serves the renderer with CSP (wmfile: allowed for media) and isolation headers; no traversal', async () => {
    const r = await fake.protocols.wmapp(new Request('wmapp://bundle/index.html'));
    expect(r.status).toBe(200);
    expect(await r.text()).toContain('app');
    const csp = r.headers.get('content-security-policy') ?? '';
    expect(csp).toMatch(/media-src 'self' blob: wmfile:/);
    expect(r.headers.get('cross-origin-embedder-policy')).toBe('require-corp');
    expect(r.headers.get('cross-origin-opener-policy')).toBe('same-origin');
    for (const bad of ['wmapp://bundle/..%2f..%2fsecret.txt', 'wmapp://bundle/%2e%2e/secret.txt', 'wmapp://bundle/..%5csecret.txt', 'wmapp://other/index.html']) {
      const res = await fake.protocols.wmapp(new Request(bad));
      expect(res.status, bad).toBeGreaterThanOrEqual(400);
      expect(await res.text(), bad).not.toContain('not opened');
    }
  });
});

describe('preload (bundled CommonJS, run in a bare context as Electron sandboxes it)', () => {
  it('exposes exactly the HostApi as window.whistlemark and unwraps IPC errors', async () => {
    const code = readFileSync(join(tmp, 'dist', 'electron', 'preload.cjs'), 'utf8');
    const exposed: Record<string, unknown> = {};
    const invoked: unknown[][] = [];
    const electron = {
      contextBridge: { exposeInMainWorld: (key: string, api: unknown) => (exposed[key] = api) },
      ipcRenderer: {
        invoke: async (channel: string, ...args: unknown[]) => {
          invoked.push([channel, ...args]);
          if (channel === 'whistlemark:probeFootage') throw new Error("Error invoking remote method 'whistlemark:probeFootage': Error: probeFootage: no opened file has id x");
          return { ok: channel };
        },
      },
    };
    const required: string[] = [];
    const module = { exports: {} };
    runInNewContext(code, { require: (name: string) => (required.push(name), name === 'electron' ? electron : undefined), module, exports: module.exports });
    expect(required).toEqual(['electron']);
    expect(Object.keys(exposed)).toEqual(['whistlemark']);
    const api = exposed.whistlemark as Record<string, (...a: unknown[]) => Promise<unknown>>;
    expect(Object.keys(api).sort()).toEqual([...HOST_CALLS].sort());
    expect(await api.listDirectory('/media')).toEqual({ ok: 'whistlemark:listDirectory' });
    expect(invoked[0]).toEqual(['whistlemark:listDirectory', '/media']);
    await expect(api.probeFootage('x')).rejects.toThrow(/^probeFootage: no opened file has id x$/);
  });
});
