import { describe, expect, it } from 'vitest';
import { ALLOWED_PERMISSIONS, contentSecurityPolicy, isAppUrl, isolationHeaders, windowOptions } from '../../electron/host/window-options.ts';

// Reference: Electron's security checklist (electronjs.org/docs/latest/tutorial/security)
// — checklist item numbers from memory — and CSP Level 3 (W3C) for the directive names;
// COOP/COEP values from the HTML
// Living Standard (cross-origin isolation).

function directives(csp: string): Map<string, string[]> {
  return new Map(csp.split(';').map((d) => d.trim().split(/\s+/)).map(([name, ...values]) => [name, values]));
}

describe('BrowserWindow options (Electron security checklist items 2-4, 6, 9-10)', () => {
  const o = windowOptions('/app/dist/electron/preload.cjs');
  it('isolates and sandboxes the page, with no Node anywhere', () => {
    expect(o.webPreferences.contextIsolation).toBe(true); // item 3
    expect(o.webPreferences.sandbox).toBe(true); // item 4
    expect(o.webPreferences.nodeIntegration).toBe(false); // item 2
    expect(o.webPreferences.nodeIntegrationInWorker).toBe(false);
    expect(o.webPreferences.nodeIntegrationInSubFrames).toBe(false);
  });
  it('keeps web security on and insecure content, experimental features and webviews off', () => {
    expect(o.webPreferences.webSecurity).toBe(true); // item 6
    expect(o.webPreferences.allowRunningInsecureContent).toBe(false); // item 8
    expect(o.webPreferences.experimentalFeatures).toBe(false); // item 9
    expect(o.webPreferences.webviewTag).toBe(false); // item 12
    expect(o.webPreferences.navigateOnDragDrop).toBe(false);
  });
  it('uses the given preload and nothing else from outside', () => {
    expect(o.webPreferences.preload).toBe('/app/dist/electron/preload.cjs');
  });
  it('grants no permissions (item 5)', () => {
    expect(ALLOWED_PERMISSIONS).toEqual([]);
  });
});

describe('Content-Security-Policy (checklist item 7; CSP Level 3 directives)', () => {
  const browser = directives(contentSecurityPolicy());
  const electron = directives(contentSecurityPolicy({ mediaSources: ['wmfile:'] }));
  it("defaults to 'self' and never allows eval or inline scripts", () => {
    for (const d of [browser, electron]) {
      expect(d.get('default-src')).toEqual(["'self'"]);
      expect(d.get('script-src')).toEqual(["'self'", "'wasm-unsafe-eval'"]);
      const all = [...d.values()].flat();
      expect(all).not.toContain("'unsafe-eval'");
      expect(d.get('script-src')).not.toContain("'unsafe-inline'");
      expect(all).not.toContain('*');
      expect(all.some((v) => /^https?:/.test(v))).toBe(false); // no remote hosts at all
    }
  });
  it('shuts plugins, frames, base and form targets', () => {
    for (const d of [browser, electron]) {
      expect(d.get('object-src')).toEqual(["'none'"]);
      expect(d.get('frame-src')).toEqual(["'none'"]);
      expect(d.get('frame-ancestors')).toEqual(["'none'"]);
      expect(d.get('base-uri')).toEqual(["'none'"]);
      expect(d.get('form-action')).toEqual(["'none'"]);
    }
  });
  it('lets media and fetch reach opened files: same origin in the browser, wmfile: in Electron', () => {
    expect(browser.get('media-src')).toEqual(["'self'", 'blob:']);
    expect(electron.get('media-src')).toEqual(["'self'", 'blob:', 'wmfile:']);
    expect(electron.get('connect-src')).toContain('wmfile:');
    expect(browser.get('connect-src')).not.toContain('wmfile:');
  });
});

describe('cross-origin isolation headers (HTML Living Standard: COOP same-origin + COEP require-corp)', () => {
  it('sets COOP, COEP and CORP', () => {
    expect(isolationHeaders()).toMatchObject({
      'Cross-Origin-Opener-Policy': 'same-origin',
      'Cross-Origin-Embedder-Policy': 'require-corp',
      'Cross-Origin-Resource-Policy': 'same-origin',
      'X-Content-Type-Options': 'nosniff',
    });
  });
});

describe('isAppUrl (IPC sender and navigation check, checklist items 13 and 17)', () => {
  it('accepts only the app scheme and host', () => {
    expect(isAppUrl('wmapp://bundle/index.html')).toBe(true);
    expect(isAppUrl('wmapp://bundle/')).toBe(true);
    for (const url of ['wmapp://bundle.evil/index.html', 'wmapp://other/', 'https://bundle/', 'file:///index.html', 'wmfile://file/x', 'not a url', '']) {
      expect(isAppUrl(url), url).toBe(false);
    }
  });
});
