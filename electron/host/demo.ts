/**
 * The demo match shipped in fixtures/demo (an invented scenario): tracking.csv,
 * events.csv, footage.mp4 (and any further footage*.mp4/.webm), truth.json. The files
 * are opened in the registry so the renderer can load them like any chosen file.
 * Returns null when the demo is not there (not generated yet, or removed).
 *
 * Example: await openDemoMatch(registry, 'fixtures/demo') → { title, tracking, events, footage: [...] }
 */
import { readdir, readFile, stat } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import type { DemoMatch } from '../../shared-types/host-api.ts';
import type { OpenedFiles } from './opened-files.ts';

/** fixtures/demo in this checkout, found from this file's own place. */
export const DEFAULT_DEMO_DIR = new URL('../../fixtures/demo/', import.meta.url).pathname;

async function isFile(path: string): Promise<boolean> {
  return stat(path).then(
    (s) => s.isFile() && s.size > 0,
    () => false,
  );
}

export async function openDemoMatch(registry: OpenedFiles, demoDir: string = DEFAULT_DEMO_DIR): Promise<DemoMatch | null> {
  const dir = resolve(demoDir);
  const tracking = join(dir, 'tracking.csv');
  const events = join(dir, 'events.csv');
  if (!(await isFile(tracking)) || !(await isFile(events))) return null;
  const names = await readdir(dir).catch(() => [] as string[]);
  const footageNames = names.filter((n) => /^footage.*\.(mp4|webm|mkv|mov)$/i.test(n)).sort();
  const footagePaths: string[] = [];
  for (const n of footageNames) if (await isFile(join(dir, n))) footagePaths.push(join(dir, n));
  if (footagePaths.length === 0) return null;
  const truthPath = join(dir, 'truth.json');
  const hasTruth = await isFile(truthPath);
  let title = 'Demo match (invented)';
  // Only a modest truth file is read for its title; a big one keeps the default.
  if (hasTruth && (await stat(truthPath)).size < 8 * 1024 * 1024) {
    // The generator may write a title; anything unreadable just keeps the default.
    try {
      const truth = JSON.parse(await readFile(truthPath, 'utf8')) as { title?: unknown; match?: { title?: unknown } };
      const t = truth.title ?? truth.match?.title;
      if (typeof t === 'string' && t.trim()) title = t.trim();
    } catch {
      /* keep the default title */
    }
  }
  return {
    title,
    tracking: await registry.open(tracking),
    events: await registry.open(events),
    footage: await Promise.all(footagePaths.map((p) => registry.open(p))),
    truth: hasTruth ? await registry.open(truthPath) : undefined,
  };
}
