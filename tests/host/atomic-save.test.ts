import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { checkFileName, saveAtomic } from '../../electron/host/atomic-save.ts';

// Atomicity rests on POSIX rename(2) and link(2) semantics (IEEE Std 1003.1): rename
// replaces the name in one step; link fails with EEXIST when the name is taken.
let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'wm-save-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const text = (s: string) => new TextEncoder().encode(s);

describe('saveAtomic', () => {
  it('writes a new file and reports the bytes', async () => {
    const r = await saveAtomic({ directory: dir, name: 'report.csv', bytes: text('a,b\n1,2\n') });
    expect(r).toEqual({ path: join(dir, 'report.csv'), bytesWritten: 8 });
    expect(readFileSync(r.path, 'utf8')).toBe('a,b\n1,2\n');
    expect(readdirSync(dir)).toEqual(['report.csv']);
  });

  it('refuses to overwrite without the flag, and replaces with it', async () => {
    writeFileSync(join(dir, 'report.csv'), 'old');
    await expect(saveAtomic({ directory: dir, name: 'report.csv', bytes: text('new') })).rejects.toThrow(/already exists; nothing was written/);
    expect(readFileSync(join(dir, 'report.csv'), 'utf8')).toBe('old');
    await saveAtomic({ directory: dir, name: 'report.csv', bytes: text('new'), overwrite: true });
    expect(readFileSync(join(dir, 'report.csv'), 'utf8')).toBe('new');
    expect(readdirSync(dir)).toEqual(['report.csv']);
  });

  it('an error thrown mid-stream leaves the previous file intact and no temporary file', async () => {
    writeFileSync(join(dir, 'clip.bin'), 'previous');
    async function* failing() {
      yield text('half of the new');
      throw new Error('encoder crashed');
    }
    await expect(saveAtomic({ directory: dir, name: 'clip.bin', bytes: failing(), overwrite: true })).rejects.toThrow(/encoder crashed/);
    expect(readFileSync(join(dir, 'clip.bin'), 'utf8')).toBe('previous');
    expect(readdirSync(dir)).toEqual(['clip.bin']);
  });

  it('a process killed mid-write leaves the previous file intact', async () => {
    writeFileSync(join(dir, 'project.json'), '{"v":1}');
    const child = spawn(process.execPath, ['--import', 'tsx', new URL('./save-writer-child.ts', import.meta.url).pathname, dir, 'project.json'], {
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    await new Promise<void>((resolve, reject) => {
      child.stdout.on('data', (d: Buffer) => {
        if (d.toString().includes('writing')) resolve();
      });
      child.on('exit', (code) => reject(new Error(`child ended early (${code})`)));
    });
    const exited = new Promise((r) => child.on('exit', r));
    child.kill('SIGKILL');
    await exited;
    expect(readFileSync(join(dir, 'project.json'), 'utf8')).toBe('{"v":1}');
    // What the killed writer left is only its own temporary file, never the real name.
    const leftovers = readdirSync(dir).filter((n) => n !== 'project.json');
    expect(leftovers).toHaveLength(1);
    expect(leftovers.every((n) => n.startsWith('.project.json.') && n.endsWith('.partial'))).toBe(true);
  });

  it('refuses names with folders in them and missing folders, saying what to do', async () => {
    for (const bad of ['../x.csv', 'a/b.csv', 'a\\b.csv', '..', '', 'nul\0.csv']) expect(() => checkFileName(bad)).toThrow(/not a usable file name/);
    await expect(saveAtomic({ directory: join(dir, 'nope'), name: 'x.csv', bytes: text('x') })).rejects.toThrow(/folder not found; choose an existing folder/);
  });
});
