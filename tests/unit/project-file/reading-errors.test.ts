import { createHash } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { strToU8, unzipSync, zipSync } from 'fflate';
import { afterAll, describe, expect, it } from 'vitest';
import { PROJECT_TABLES, ProjectFileError, readProjectFile, sha256Hex, writeProjectFile, type ProjectTables } from '../../../engine/project-file/index.ts';
import { decodeValue, encodeValue } from '../../../engine/project-file/values.ts';

function smallTables(): ProjectTables {
  const t = Object.fromEntries(PROJECT_TABLES.map((n) => [n, []])) as unknown as ProjectTables;
  t.projects = [{ id: 7, title: 'Ferncastle Lanterns v Dunmere Tide', createdAt: 1, updatedAt: 2 }];
  t.sources = [{ id: 30, projectId: 7, kind: 'tracking', fileName: 't.csv', path: '/x/t.csv', size: 10, mtimeMs: 0, summary: { duration: 1, periods: [] }, warnings: [], importedAt: 0 }];
  t.trackingBlocks = [{ id: 900, sourceId: 30, period: 1, block: 0, offset: 0, frameCount: 2, present: new Uint8Array([1, 0]), x: new Float32Array([1.5, -0, NaN, 3]), y: new Float32Array(4) }];
  t.clockFits = [{ id: 4, projectId: 7, sourceId: 30, fit: { source: 'events', method: 'huber', segments: [{ period: 1, offsetSe: NaN, rateSe: Infinity, points: [undefined, 1] }] }, createdAt: 0 }];
  t.audit = [{ id: 55, projectId: 7, at: 1, user: 'u', what: 'fit', subject: 'fit', state: 'done', stamp: 1, changes: [{ table: 'clockFits', key: 4, after: { id: 4, projectId: 7, sourceId: 30, fit: {} } }] }];
  return t;
}

const dir = mkdtempSync(join(tmpdir(), 'wm-pf-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function expectRefused(bytes: Uint8Array, reason: ProjectFileError['reason'], message: RegExp) {
  const err = await readProjectFile(bytes, 'match.wmatch').then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(ProjectFileError);
  expect((err as ProjectFileError).reason).toBe(reason);
  expect((err as Error).message).toMatch(message);
}

describe('project file format', () => {
  it('SHA-256 equals node:crypto (FIPS 180-4 test vector "abc")', async () => {
    const abc = strToU8('abc');
    expect(await sha256Hex(abc)).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    const random = new Uint8Array(100_000).map((_, i) => (i * 2654435761) >>> 24);
    expect(await sha256Hex(random)).toBe(createHash('sha256').update(random).digest('hex'));
  });

  it('values JSON cannot hold survive: typed arrays, NaN, ±Infinity, -0, undefined, and objects carrying the tag key', () => {
    const chunks: Uint8Array[] = [];
    const v = { a: new Float64Array([1, NaN]), b: [undefined, -0, Infinity, -Infinity], c: { $wm: 'array', chunk: 0 }, d: undefined, e: new Date(5) };
    const back = decodeValue(JSON.parse(JSON.stringify(encodeValue(v, chunks))), (n) => chunks[n]) as typeof v;
    expect(back).toEqual(v);
    expect(Object.is(back.b[1], -0)).toBe(true);
    expect('d' in back).toBe(true);
  });

  it('is a plain zip the Debian zip tools read, manifest first, checksums matching', async () => {
    const bytes = await writeProjectFile(smallTables(), { writtenBy: 'Whistlemark test', databaseVersion: 3 });
    const path = join(dir, 'small.wmatch');
    writeFileSync(path, bytes);
    // Info-ZIP's unzip (Debian) tests every entry's CRC-32 and lists the names.
    expect(execFileSync('unzip', ['-tq', path]).toString()).toMatch(/No errors detected/);
    const names = execFileSync('unzip', ['-Z1', path]).toString().trim().split('\n');
    expect(names[0]).toBe('manifest.json');
    expect(names).toContain('tables/trackingBlocks.json');
    const files = unzipSync(bytes);
    const manifest = JSON.parse(new TextDecoder().decode(files['manifest.json']));
    expect(manifest).toMatchObject({ format: 'whistlemark-match-project', formatVersion: 1, title: 'Ferncastle Lanterns v Dunmere Tide' });
    for (const [name, e] of Object.entries(manifest.entries as Record<string, { sha256: string }>))
      expect(createHash('sha256').update(files[name]).digest('hex'), name).toBe(e.sha256);
    // Ids are dense inside the file.
    const read = await readProjectFile(bytes);
    expect(read.tables.projects[0].id).toBe(1);
    expect(read.tables.trackingBlocks[0]).toMatchObject({ id: 1, sourceId: 1 });
    expect((read.tables.audit[0].changes as { key: number }[])[0].key).toBe(1);
    expect(read.tables.trackingBlocks[0].x).toEqual(new Float32Array([1.5, -0, NaN, 3]));
  });

  it('refuses what is not a zip, an empty file, a foreign zip and a newer format, saying what to do', async () => {
    await expectRefused(strToU8('period,frame\n1,2\n'), 'not-zip', /not a Whistlemark match project: it is not a zip archive\. Choose a \.wmatch file/);
    await expectRefused(new Uint8Array(0), 'not-zip', /it is empty/);
    // A zip made by Debian's zip tool, of any other file.
    const other = join(dir, 'other.zip');
    writeFileSync(join(dir, 'notes.txt'), 'hello');
    execFileSync('zip', ['-q', '-j', other, join(dir, 'notes.txt')]);
    await expectRefused(readFileSync(other), 'foreign', /zip archive but not a Whistlemark match project \(it has no manifest\.json\)/);
    await expectRefused(zipSync({ 'manifest.json': strToU8('{"format":"something-else"}') }), 'foreign', /format "something-else"/);
    const good = unzipSync(await writeProjectFile(smallTables(), { writtenBy: 'w', databaseVersion: 3 }));
    const m = JSON.parse(new TextDecoder().decode(good['manifest.json']));
    good['manifest.json'] = strToU8(JSON.stringify({ ...m, formatVersion: 2, writtenBy: 'Whistlemark 9' }));
    await expectRefused(zipSync(good), 'newer', /written by a newer Whistlemark \(Whistlemark 9, project format 2\).*Update Whistlemark/);
  });

  it('refuses a truncated file at every cut, and a file with any changed byte', async () => {
    const bytes = await writeProjectFile(smallTables(), { writtenBy: 'w', databaseVersion: 3 });
    for (const keep of [10, 100, Math.floor(bytes.length / 2), bytes.length - 30, bytes.length - 1]) {
      await expectRefused(bytes.slice(0, keep), 'damaged', /damaged|truncated/);
    }
    // Flip one byte at many places: each time the file is refused (or, where the byte is
    // outside anything read — zip comments, timestamps — read identically).
    const good = await readProjectFile(bytes);
    let refused = 0;
    for (let at = 4; at < bytes.length; at += 7) {
      const bad = bytes.slice();
      bad[at] ^= 0x5a;
      try {
        const r = await readProjectFile(bad);
        expect(r.tables).toEqual(good.tables);
      } catch (e) {
        expect(e).toBeInstanceOf(ProjectFileError);
        refused++;
      }
    }
    expect(refused).toBeGreaterThan(0);
  });

  it('refuses a manifest that is valid JSON of the wrong shape (a changed byte in a key)', async () => {
    const files = unzipSync(await writeProjectFile(smallTables(), { writtenBy: 'w', databaseVersion: 3 }));
    const m = JSON.parse(new TextDecoder().decode(files['manifest.json']));
    const withManifest = (v: unknown) => zipSync({ ...files, 'manifest.json': strToU8(JSON.stringify(v)) });
    const { entries, ...noEntries } = m;
    await expectRefused(withManifest({ ...noEntries, '?ntries': entries }), 'damaged', /no usable list of entries/);
    await expectRefused(withManifest({ ...m, entries: { ...entries, 'tables/projects.json': 5 } }), 'damaged', /no usable list of entries/);
    await expectRefused(withManifest({ ...m, tables: { ...m.tables, projects: { entry: 3 } } }), 'damaged', /no usable list of tables/);
  });

  it('refuses an entry whose checksum does not match, naming it', async () => {
    const files = unzipSync(await writeProjectFile(smallTables(), { writtenBy: 'w', databaseVersion: 3 }));
    files['tables/projects.json'] = strToU8('[{"id":1,"title":"changed"}]');
    await expectRefused(zipSync(files), 'damaged', /entry tables\/projects\.json does not match its checksum/);
    const again = unzipSync(await writeProjectFile(smallTables(), { writtenBy: 'w', databaseVersion: 3 }));
    delete again['chunks/0.bin'];
    await expectRefused(zipSync(again), 'damaged', /entry chunks\/0\.bin listed in its manifest is missing/);
  });
});
