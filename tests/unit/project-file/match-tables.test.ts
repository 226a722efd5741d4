import 'fake-indexeddb/auto';
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readProjectFile, writeProjectFile } from '../../../engine/project-file/index.ts';
import { eventsSummary, matchTables, trackingBlocks, trackingSummary } from '../../../engine/project-file/match-tables.ts';
import { syncMatch } from '../../../engine/sync.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { loadTracking } from '../../../renderer/src/db/store.ts';
import { splitTracking } from '../../../renderer/src/db/tracking-blocks.ts';
import { addProjectTables } from '../../../renderer/src/export/project-tables.ts';
import { nextUndo, undo } from '../../../renderer/src/history/history.ts';
import { summariseEvents, summariseTracking } from '../../../renderer/src/summaries.ts';
import { DEMO, loadSources, type LoadedSources } from './demo-project.ts';

const root = new URL('../../..', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'wm-mt-'));
let src: LoadedSources;
let db: WhistlemarkDb;
beforeAll(async () => {
  src = await loadSources();
  db = new WhistlemarkDb(`match-tables-${process.pid}`);
}, 60_000);
afterAll(async () => {
  await db.delete();
  rmSync(dir, { recursive: true, force: true });
});

describe('match tables for the command line', () => {
  it('summaries and tracking blocks equal what the app itself stores at import (renderer/src)', () => {
    expect(trackingSummary(src.tracking.data)).toEqual(summariseTracking(src.tracking.data));
    expect(eventsSummary(src.events.data)).toEqual(summariseEvents(src.events.data));
    const mine = trackingBlocks(5, src.tracking.data);
    const app = splitTracking(5, src.tracking.data);
    expect(mine.meta).toEqual(app.meta);
    expect(mine.blocks).toEqual(app.blocks);
  });

  it('opens in the app database: tracking loads back equal, proposals and fit present, undo works', async () => {
    const sync = syncMatch(src.tracking.data, src.events.data);
    const files = (p: string) => ({ fileName: p.split('/').pop()!, path: p, size: 1, mtimeMs: 0 });
    const tables = matchTables({ title: 'Ferncastle Lanterns v Dunmere Tide', user: 'u', tracking: src.tracking.data, events: src.events.data, sync, files: { tracking: files(src.tracking.path), events: files(src.events.path) } });
    const read = await readProjectFile(await writeProjectFile(tables, { writtenBy: 't', databaseVersion: 3 }));
    const id = await addProjectTables(db, read.tables);
    const trk = (await db.sources.where('projectId').equals(id).toArray()).find((s) => s.kind === 'tracking')!;
    const back = await loadTracking(db, trk.id!);
    expect(back.periods.map((p) => p.frameCount)).toEqual(src.tracking.data.periods.map((p) => p.frameCount));
    expect(back.periods[1].x).toEqual(src.tracking.data.periods[1].x);
    expect(await db.corrections.where('projectId').equals(id).count()).toBe(src.events.data.events.length);
    expect((await nextUndo(db, id))?.what).toBe(`proposed ${src.events.data.events.length} corrections`);
    await undo(db, id, 'u');
    expect(await db.corrections.where('projectId').equals(id).count()).toBe(0);
  });

  it('`whistlemark sync TRACKING EVENTS FOOTAGE --project OUT` writes a project file with a footage fingerprint, and refuses to replace it without --replace', () => {
    const out = join(dir, 'demo.wmatch');
    const run = (...extra: string[]) =>
      spawnSync('node', ['bin/whistlemark.mjs', 'sync', DEMO + 'tracking.csv', DEMO + 'events.csv', DEMO + 'footage.mp4', '--project', out, ...extra], { cwd: root, encoding: 'utf8', timeout: 120_000 });
    const r = run();
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/wrote .*demo\.wmatch/);
    const again = run();
    expect(again.status).toBe(1);
    expect(again.stderr).toMatch(/already exists; nothing was written.*--replace/);
    expect(run('--replace').status).toBe(0);
    return readProjectFile(readFileSync(out)).then(({ manifest, tables }) => {
      expect(manifest.title).toBe('Ferncastle Lanterns v Dunmere Tide');
      expect(tables.sources.map((s) => s.kind)).toEqual(['tracking', 'events', 'footage']);
      expect(tables.footage[0].probe).toMatchObject({ width: 640, height: 360 });
      const fp = manifest.footage[0].fingerprint!;
      const bytes = readFileSync(DEMO + 'footage.mp4');
      // node:crypto over the same byte ranges (first and last MiB).
      expect(fp).toEqual({
        size: statSync(DEMO + 'footage.mp4').size,
        headSha256: createHash('sha256').update(bytes.subarray(0, 1 << 20)).digest('hex'),
        tailSha256: createHash('sha256').update(bytes.subarray(bytes.length - (1 << 20))).digest('hex'),
      });
      expect(tables.corrections).toHaveLength(src.events.data.events.length);
    });
  }, 180_000);
});
