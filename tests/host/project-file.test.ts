import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ProjectFileError, writeProjectFile } from '../../engine/project-file/index.ts';
import { openProjectFile, saveProjectFile } from '../../electron/host/project-file.ts';
import { smallProject } from './project-fixture.ts';

// Atomicity rests on POSIX rename(2) (IEEE Std 1003.1): the new file takes the name in one step.
let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'wm-project-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('match project files on disk', () => {
  it('saves, refuses to replace without asking, replaces when asked, and opens back', async () => {
    const path = join(dir, 'match.wmatch');
    const v1 = smallProject('first');
    await saveProjectFile(path, await writeProjectFile(v1, { writtenBy: 't', databaseVersion: 3 }), { sliceBytes: 64 * 1024 });
    await expect(saveProjectFile(path, await writeProjectFile(smallProject('second'), { writtenBy: 't', databaseVersion: 3 }))).rejects.toThrow(/already exists; nothing was written/);
    expect((await openProjectFile(path)).tables).toEqual(v1);
    await saveProjectFile(path, await writeProjectFile(smallProject('second'), { writtenBy: 't', databaseVersion: 3 }), { overwrite: true });
    expect((await openProjectFile(path)).manifest.title).toBe('second');
    expect(readdirSync(dir)).toEqual(['match.wmatch']);
  });

  it('a save killed midway (child process, SIGKILL) leaves the previous file intact and openable', async () => {
    const path = join(dir, 'match.wmatch');
    const previous = smallProject('the previous version');
    const before = await writeProjectFile(previous, { writtenBy: 't', databaseVersion: 3 });
    writeFileSync(path, before);
    const child = spawn(process.execPath, ['--import', 'tsx', new URL('./project-save-child.ts', import.meta.url).pathname, path], { stdio: ['ignore', 'pipe', 'inherit'] });
    await new Promise<void>((resolve, reject) => {
      child.stdout.on('data', (d: Buffer) => d.toString().includes('writing') && resolve());
      child.on('exit', (code) => reject(new Error(`the saving child ended before it was killed (${code})`)));
    });
    const exited = new Promise((r) => child.on('exit', r));
    child.kill('SIGKILL');
    await exited;
    expect(Buffer.compare(readFileSync(path), Buffer.from(before))).toBe(0);
    const opened = await openProjectFile(path);
    expect(opened.manifest.title).toBe('the previous version');
    expect(opened.tables).toEqual(previous);
    // Only the killed writer's own temporary file is left beside it, half written and never opened as the project.
    const left = readdirSync(dir).filter((n) => n !== 'match.wmatch');
    expect(left).toHaveLength(1);
    expect(left[0]).toMatch(/^\.match\.wmatch\..*\.partial$/);
    await expect(openProjectFile(join(dir, left[0]))).rejects.toBeInstanceOf(ProjectFileError);
  }, 60_000);

  it('a missing file says so', async () => {
    await expect(openProjectFile(join(dir, 'nope.wmatch'))).rejects.toThrow(/no such file; was it moved or renamed\?/);
  });
});
