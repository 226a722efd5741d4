/**
 * First start: with an empty database, create the demo match project and import its
 * three sources through the same path as the mapping screen (detected or remembered
 * mapping, import worker, one transaction each), reporting progress step by step.
 */
import type { ImportProgress, OpenedFile } from '../../../shared-types/index.ts';
import { startImport } from '../import/client.ts';
import { engineImporters } from '../import/engine-importers.ts';
import { importFootage } from '../import/footage.ts';
import { absoluteUrl, prepareFile } from '../import/prepare.ts';
import { headerSignature } from '../mapping/memory.ts';
import { mappingGaps } from '../mapping/edit.ts';
import type { AppServices } from './context.ts';

export interface SeedStep {
  fileName: string;
  bytesTotal: number;
  state: 'waiting' | 'running' | 'done' | 'failed';
  progress?: ImportProgress;
  message?: string;
}

const SEEDED = 'demoSeeded';
let running: Promise<void> | null = null;

/** Runs at most once per page; does nothing unless the database has no project at all. */
export function seedDemoOnFirstStart(s: AppServices, onSteps: (steps: SeedStep[]) => void): Promise<void> {
  running ??= seed(s, onSteps);
  return running;
}

async function seed({ db, host, info }: AppServices, onSteps: (steps: SeedStep[]) => void): Promise<void> {
  const empty = (await db.projects.count()) === 0 && !(await db.settings.get(SEEDED));
  if (!empty) return;
  const demo = await host.demoMatch();
  if (!demo) return;
  const files: OpenedFile[] = [demo.tracking, demo.events, ...demo.footage];
  const steps: SeedStep[] = files.map((f) => ({ fileName: f.name, state: 'waiting', bytesTotal: f.size }));
  const update = (i: number, patch: Partial<SeedStep>) => {
    steps[i] = { ...steps[i], ...patch };
    onSteps([...steps]);
  };
  onSteps([...steps]);
  // Project and the "seeded" mark in one transaction: a reload never makes a second demo.
  const projectId = await db.transaction('rw', db.projects, db.settings, db.audit, async () => {
    const now = Date.now();
    const id = (await db.projects.add({ title: demo.title, createdAt: now, updatedAt: now, demo: true })) as number;
    await db.settings.put({ key: SEEDED, value: now });
    await db.settings.put({ key: 'currentProject', value: id });
    await db.audit.add({ projectId: id, at: now, user: info.userName, what: `create demo project "${demo.title}"` });
    return id;
  });
  for (let i = 0; i < files.length; i++) {
    const f = files[i];
    update(i, { state: 'running' });
    try {
      const prepared = await prepareFile(db, engineImporters, fetch, f, location.href);
      if (prepared.kind === 'footage') {
        await importFootage(db, host, projectId, f, info.userName);
        update(i, { state: 'done' });
        continue;
      }
      const mapping = prepared.mapping;
      const gaps = mapping ? mappingGaps(mapping, prepared.detection.header) : ['not recognised'];
      if (!mapping || gaps.length) {
        update(i, { state: 'failed', message: `Could not be mapped automatically (${gaps.join(' ')}). Open it from the Sources screen.` });
        continue;
      }
      const job = startImport(
        {
          projectId,
          file: { fileName: f.name, path: f.path, size: f.size, mtimeMs: f.mtimeMs, url: absoluteUrl(f.url, location.href) },
          mapping,
          detected: { ...(prepared.detection.mapping ? { mapping: prepared.detection.mapping } : {}), confidence: prepared.detection.confidence, clues: prepared.detection.clues },
          headerSignature: headerSignature(mapping.kind, prepared.detection.header),
          rememberMapping: false,
          user: info.userName,
        },
        (progress) => update(i, { progress }),
      );
      const outcome = await job.outcome;
      if (outcome.status === 'stored') update(i, { state: 'done' });
      else if (outcome.status === 'refused') update(i, { state: 'failed', message: outcome.problems.find((p) => p.severity === 'error')?.message ?? 'refused' });
      else update(i, { state: 'failed', message: 'cancelled' });
    } catch (e) {
      update(i, { state: 'failed', message: (e as Error).message });
    }
  }
}
