import { chmodSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { findElectronBinary } from '../../scripts/electron-binary.mjs';

// The electron npm package's own layout (from memory: its install script writes path.txt and
// the binary under dist/; confirmed on this machine in the shared MACHINE notes). Since Electron 42,
// require('electron') starts a download, so the launcher must find the binary without it
// (shared MACHINE notes). Each case builds a fake layout in a temp project.
let root: string;
let pkg: string;
let requiredMarker: string;

beforeEach(() => {
  root = mkdtempSync(join(tmpdir(), 'wm-launch-'));
  writeFileSync(join(root, 'package.json'), '{"name":"fake-project","type":"module"}');
  pkg = join(root, 'node_modules', 'electron');
  requiredMarker = join(root, 'required');
});
afterEach(() => rmSync(root, { recursive: true, force: true }));

function fakePackage(opts: { pathTxt?: string; binary?: 'exec' | 'plain' | 'dir' }) {
  mkdirSync(join(pkg, 'dist'), { recursive: true });
  writeFileSync(join(pkg, 'package.json'), '{"name":"electron","version":"41.7.1","main":"index.js"}');
  // If anything requires the package, this leaves a mark (and would start a download for real).
  writeFileSync(join(pkg, 'index.js'), `require('fs').writeFileSync(${JSON.stringify(requiredMarker)}, 'x'); throw new Error('download');`);
  if (opts.pathTxt !== undefined) writeFileSync(join(pkg, 'path.txt'), opts.pathTxt);
  const bin = join(pkg, 'dist', 'electron');
  if (opts.binary === 'exec' || opts.binary === 'plain') {
    writeFileSync(bin, '#!/bin/sh\n');
    chmodSync(bin, opts.binary === 'exec' ? 0o755 : 0o644);
  } else if (opts.binary === 'dir') mkdirSync(bin);
}

describe('findElectronBinary on fake electron package layouts', () => {
  it('no package: browser mode, says it is optional', () => {
    const r = findElectronBinary(root);
    expect(r).toMatchObject({ found: false });
    expect(!r.found && r.reason).toMatch(/not installed/);
  });
  it('package without path.txt (binary download skipped)', () => {
    fakePackage({});
    const r = findElectronBinary(root);
    expect(!r.found && r.reason).toMatch(/electron 41\.7\.1 is installed without its binary/);
  });
  it('path.txt naming a missing binary', () => {
    fakePackage({ pathTxt: 'electron' });
    const r = findElectronBinary(root);
    expect(!r.found && r.reason).toMatch(/missing or not executable/);
  });
  it('binary present but not executable, or a folder', () => {
    fakePackage({ pathTxt: 'electron', binary: 'plain' });
    expect(findElectronBinary(root).found).toBe(false);
    rmSync(pkg, { recursive: true });
    fakePackage({ pathTxt: 'electron', binary: 'dir' });
    expect(findElectronBinary(root).found).toBe(false);
  });
  it('path.txt trying to leave the package is refused', () => {
    fakePackage({ pathTxt: '../../../bin/sh', binary: 'exec' });
    expect(findElectronBinary(root).found).toBe(false);
  });
  it('an executable binary named by path.txt is found', () => {
    fakePackage({ pathTxt: 'electron\n', binary: 'exec' });
    expect(findElectronBinary(root)).toEqual({ found: true, binary: join(pkg, 'dist', 'electron'), version: '41.7.1' });
  });
  it('never requires the electron package itself', () => {
    for (const binary of ['exec', 'plain'] as const) {
      rmSync(pkg, { recursive: true, force: true });
      fakePackage({ pathTxt: 'electron', binary });
      findElectronBinary(root);
    }
    expect(existsSync(requiredMarker)).toBe(false);
  });
});
