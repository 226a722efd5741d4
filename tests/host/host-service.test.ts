import { copyFileSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHostService } from '../../electron/host/host-service.ts';
import { listDirectory } from '../../electron/host/directory.ts';

const refDir = new URL('../../fixtures/reference/', import.meta.url).pathname;
let tmp: string;
beforeAll(() => {
  tmp = mkdtempSync(join(tmpdir(), 'wm-service-'));
});
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const service = (demoDir: string) => createHostService({ mode: 'browser', fileUrl: (id, name) => `/files/${id}/${name}`, demoDir });

describe('demoMatch', () => {
  it('is null while the demo files are missing or empty, instead of failing', async () => {
    const dir = join(tmp, 'demo-partial');
    mkdirSync(dir);
    expect(await service(join(tmp, 'nowhere')).api.demoMatch()).toBeNull();
    writeFileSync(join(dir, 'tracking.csv'), 'frame\n1\n');
    expect(await service(dir).api.demoMatch()).toBeNull(); // no events, no footage
    writeFileSync(join(dir, 'events.csv'), '');
    copyFileSync(join(refDir, 'cfr25.mp4'), join(dir, 'footage.mp4'));
    expect(await service(dir).api.demoMatch()).toBeNull(); // events.csv still empty (being written)
  });
  it('opens all demo files, footage in name order, truth optional', async () => {
    const dir = join(tmp, 'demo-full');
    mkdirSync(dir);
    writeFileSync(join(dir, 'tracking.csv'), 'frame\n1\n');
    writeFileSync(join(dir, 'events.csv'), 'period\n1\n');
    copyFileSync(join(refDir, 'cfr25.mp4'), join(dir, 'footage.mp4'));
    copyFileSync(join(refDir, 'cfr25.webm'), join(dir, 'footage-b.webm'));
    const { api, files } = service(dir);
    const demo = await api.demoMatch();
    expect(demo?.title).toBe('Demo match (invented)');
    expect(demo?.footage.map((f) => f.name)).toEqual(['footage-b.webm', 'footage.mp4']);
    expect(demo?.truth).toBeUndefined();
    expect(files.get(demo!.tracking.fileId)?.path).toBe(join(dir, 'tracking.csv'));
    // Opening the same file twice keeps one id (the renderer may remember it).
    expect((await api.openPaths([join(dir, 'tracking.csv')]))[0].fileId).toBe(demo!.tracking.fileId);
  });
});

describe('probeFootage through the service', () => {
  it('probes an opened file, refuses unknown ids, and re-probes a file replaced on disk', async () => {
    const dir = join(tmp, 'probe');
    mkdirSync(dir);
    const path = join(dir, 'match.mp4');
    copyFileSync(join(refDir, 'cfr25.mp4'), path);
    const { api } = service(dir);
    const [file] = await api.openPaths([path]);
    // ffprobe (Debian ffmpeg 5.1): cfr25.mp4 100 frames, vfr.mp4 90 frames (fixtures/reference/*.ffprobe.json).
    expect((await api.probeFootage(file.fileId)).frameCount).toBe(100);
    await expect(api.probeFootage('f'.repeat(32))).rejects.toThrow(/no opened file has id/);
    copyFileSync(join(refDir, 'vfr.mp4'), path);
    expect((await api.probeFootage(file.fileId)).frameCount).toBe(90);
  });
});

describe('listDirectory (in-app chooser)', () => {
  it('folders first, then files by name, no dot files, links followed', async () => {
    const dir = join(tmp, 'list');
    mkdirSync(join(dir, 'b-folder'), { recursive: true });
    mkdirSync(join(dir, 'a-folder'));
    writeFileSync(join(dir, 'z.csv'), '12345');
    writeFileSync(join(dir, 'a.mp4'), '1');
    writeFileSync(join(dir, '.hidden'), 'x');
    symlinkSync(join(dir, 'a-folder'), join(dir, 'link-to-folder'));
    symlinkSync(join(dir, 'gone'), join(dir, 'broken-link'));
    const l = await listDirectory(dir);
    expect(l.path).toBe(dir);
    expect(l.parent).toBe(tmp);
    expect(l.entries.map((e) => `${e.kind}:${e.name}`)).toEqual(['directory:a-folder', 'directory:b-folder', 'directory:link-to-folder', 'file:a.mp4', 'file:z.csv']);
    expect(l.entries.find((e) => e.name === 'z.csv')?.size).toBe(5);
  });
  it('the root has no parent; a missing folder says so', async () => {
    expect((await listDirectory('/')).parent).toBeUndefined();
    await expect(listDirectory(join(tmp, 'missing'))).rejects.toThrow(/missing: cannot list \(no such folder\); pick another folder/);
  });
});
