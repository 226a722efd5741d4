/**
 * E2E set-up rows written straight into the app's IndexedDB ("whistlemark", the database
 * Dexie opens in the page), for tests that must not depend on the screens that would make
 * them (a fit from the Sync screen, a registration from Watch). Dexie does not see writes
 * made past it until its next read of that table; reload when a screen already shows it.
 *
 *   const demo = await demoProject(page);
 *   await storeDemoRows(page, demo, { footageFit: truthFootageFit(), eventFit: truthEventFit() });
 *   const fits = await readStore<{ fit: ClockFit }>(page, 'clockFits');
 */
import type { Page } from 'playwright-core';
import type { ClockFit } from '../../shared-types/index.ts';
import type { RegistrationData } from '../../renderer/src/overlay/contract.ts';

/** Every row of each named object store, read in one transaction. */
export async function readStores(page: Page, stores: string[]): Promise<Record<string, unknown[]>> {
  return page.evaluate(async (stores) => {
    const db: IDBDatabase = await new Promise((res, rej) => {
      const r = indexedDB.open('whistlemark');
      r.onsuccess = () => res(r.result);
      r.onerror = () => rej(r.error);
    });
    try {
      const tx = db.transaction(stores, 'readonly');
      const reads = stores.map((s) => tx.objectStore(s).getAll());
      await new Promise((res, rej) => ((tx.oncomplete = res), (tx.onerror = () => rej(tx.error))));
      return Object.fromEntries(stores.map((s, i) => [s, reads[i].result as unknown[]]));
    } finally {
      db.close();
    }
  }, stores);
}

export async function readStore<T>(page: Page, store: string): Promise<T[]> {
  return (await readStores(page, [store]))[store] as T[];
}

/** Adds the rows in one transaction (all or none); returns their new keys in order. */
export async function addRows(page: Page, rows: { store: string; row: object }[]): Promise<IDBValidKey[]> {
  return page.evaluate(async (rows) => {
    const db: IDBDatabase = await new Promise((res, rej) => {
      const r = indexedDB.open('whistlemark');
      r.onsuccess = () => res(r.result);
      r.onerror = () => rej(r.error);
    });
    try {
      const tx = db.transaction([...new Set(rows.map((r) => r.store))], 'readwrite');
      const adds = rows.map((r) => tx.objectStore(r.store).add(r.row));
      await new Promise((res, rej) => ((tx.oncomplete = res), (tx.onerror = () => rej(tx.error)), (tx.onabort = () => rej(tx.error))));
      return adds.map((a) => a.result);
    } finally {
      db.close();
    }
  }, rows);
}

export interface DemoProject {
  projectId: number;
  footageSourceId: number;
  eventsSourceId: number;
  trackingSourceId: number;
}

/** The demo project (made on first start) and its three sources. */
export async function demoProject(page: Page): Promise<DemoProject> {
  const { projects, sources } = (await readStores(page, ['projects', 'sources'])) as {
    projects: { id: number; demo?: boolean }[];
    sources: { id: number; projectId: number; kind: string }[];
  };
  const project = projects.find((p) => p.demo);
  if (!project) throw new Error('setup-rows: no demo project in the page database yet (wait for "The demo match is ready")');
  const source = (kind: string) => {
    const s = sources.find((x) => x.projectId === project.id && x.kind === kind);
    if (!s) throw new Error(`setup-rows: the demo project has no ${kind} source`);
    return s.id;
  };
  return { projectId: project.id, footageSourceId: source('footage'), eventsSourceId: source('events'), trackingSourceId: source('tracking') };
}

export interface DemoRows {
  /** Footage -> tracking clock fit, stored against the footage source. */
  footageFit?: ClockFit;
  /** Event log -> tracking clock fit, stored against the event-log source. */
  eventFit?: ClockFit;
  /** Pitch registration of the footage. */
  registration?: RegistrationData;
  /** Footage spans that are not live play, stored as confirmed. */
  nonLive?: { fromT: number; toT: number; kind: string }[];
}

/** Stores the rows the Sync and Watch screens would make for the demo, in their row shapes. */
export async function storeDemoRows(page: Page, demo: DemoProject, rows: DemoRows): Promise<void> {
  const now = Date.now();
  const { projectId } = demo;
  const add: { store: string; row: object }[] = [];
  if (rows.footageFit) add.push({ store: 'clockFits', row: { projectId, sourceId: demo.footageSourceId, fit: rows.footageFit, createdAt: now } });
  if (rows.eventFit) add.push({ store: 'clockFits', row: { projectId, sourceId: demo.eventsSourceId, fit: rows.eventFit, createdAt: now } });
  if (rows.registration) add.push({ store: 'pitchRegistrations', row: { projectId, footageSourceId: demo.footageSourceId, data: rows.registration, updatedAt: now } });
  for (const n of rows.nonLive ?? []) add.push({ store: 'nonLive', row: { projectId, footageSourceId: demo.footageSourceId, fromT: n.fromT, toT: n.toT, kind: n.kind, status: 'confirmed' } });
  if (!add.length) throw new Error('storeDemoRows: no rows given');
  await addRows(page, add);
}
