import { describe, expect, it } from 'vitest';
import { resolveInside } from '../../electron/host/static-files.ts';
import { parseRange } from '../../electron/host/byte-range.ts';
import { unwrapIpcError } from '../../electron/host/ipc-channels.ts';

// Path confinement (OWASP Path Traversal: encoded dot-segments and separators) and
// RFC 9110 §14.1.1 range syntax, checked on the pure helpers both hosts share.
describe('resolveInside', () => {
  const root = '/srv/app';
  it('maps normal paths into the folder', () => {
    expect(resolveInside(root, '/')).toBe('/srv/app/index.html');
    expect(resolveInside(root, '/assets/index-abc.js')).toBe('/srv/app/assets/index-abc.js');
    expect(resolveInside(root, '/assets/a%20b.css')).toBe('/srv/app/assets/a b.css');
  });
  it('refuses every traversal spelling, NUL, backslashes and dot files', () => {
    for (const p of ['/../etc/passwd', '/%2e%2e/etc/passwd', '/..%2fetc%2fpasswd', '/assets/..%2f..%2f..%2fetc', '/..%5cetc', '/a%00.js', '/%E0%A4%A', '/.env', '/assets/.hidden', '/%2e%2e%2f']) {
      expect(resolveInside(root, p), p).toBeNull();
    }
  });
});

describe('parseRange (RFC 9110 §14.1.1 examples)', () => {
  const size = 10000;
  it('reads the RFC examples', () => {
    expect(parseRange('bytes=0-499', size)).toEqual({ kind: 'partial', start: 0, end: 499 }); // first 500 bytes
    expect(parseRange('bytes=500-999', size)).toEqual({ kind: 'partial', start: 500, end: 999 });
    expect(parseRange('bytes=-500', size)).toEqual({ kind: 'partial', start: 9500, end: 9999 }); // final 500 bytes
    expect(parseRange('bytes=9500-', size)).toEqual({ kind: 'partial', start: 9500, end: 9999 });
  });
  it('clamps past-the-end last positions, and answers unsatisfiable ranges with 416', () => {
    expect(parseRange('bytes=9990-20000', size)).toEqual({ kind: 'partial', start: 9990, end: 9999 });
    expect(parseRange('bytes=10000-', size)).toEqual({ kind: 'unsatisfiable' });
    expect(parseRange('bytes=-0', size)).toEqual({ kind: 'unsatisfiable' });
    expect(parseRange('bytes=0-', 0)).toEqual({ kind: 'unsatisfiable' });
  });
  it('ignores what it may ignore: no header, other units, invalid or multiple ranges', () => {
    for (const h of [undefined, '', 'items=0-5', 'bytes=5-1', 'bytes=abc', 'bytes=0-1,4-5', 'bytes=-']) {
      expect(parseRange(h, size), String(h)).toEqual({ kind: 'full' });
    }
  });
});

describe('unwrapIpcError (Electron wraps handler errors as "Error invoking remote method …")', () => {
  it('gives the renderer the host message only', () => {
    expect(unwrapIpcError(new Error("Error invoking remote method 'whistlemark:saveFile': Error: /x exists"))).toBe('/x exists');
    expect(unwrapIpcError(new Error("Error invoking remote method 'whistlemark:info': HostArgumentError: info: expected 0 arguments, got 1"))).toBe('info: expected 0 arguments, got 1');
    expect(unwrapIpcError('plain')).toBe('plain');
  });
});
