/** A small but complete match project (every table, typed arrays) for the host tests. */
import { PROJECT_TABLES, type ProjectTables } from '../../engine/project-file/index.ts';

export function smallProject(title: string): ProjectTables {
  const t = Object.fromEntries(PROJECT_TABLES.map((n) => [n, []])) as unknown as ProjectTables;
  t.projects = [{ id: 1, title, createdAt: 1, updatedAt: 2 }];
  t.sources = [{ id: 1, projectId: 1, kind: 'tracking', fileName: 't.csv', path: '/m/t.csv', size: 1, mtimeMs: 0, summary: { duration: 1, periods: [] }, warnings: [], importedAt: 0 }];
  const frames = 25 * 20;
  t.trackingBlocks = Array.from({ length: 4 }, (_, b) => ({
    id: b + 1, sourceId: 1, period: 1, block: b, offset: b * frames, frameCount: frames,
    present: new Uint8Array(frames).fill(1),
    x: Float32Array.from({ length: frames * 23 }, (_, i) => Math.sin(i + b)),
    y: Float32Array.from({ length: frames * 23 }, (_, i) => Math.cos(i * 0.5 + b)),
  }));
  t.reels = [{ id: 1, projectId: 1, title: 'Pressing', createdAt: 0 }];
  return t;
}
