/**
 * Where the in/out marks and the reel last used on the Reels screen are kept: db.settings,
 * one row per project each. Working state, not match data (like the overlay choices), so
 * not in the undo history; one put per change, so a restart finds the marks as left.
 * Watch and Sync share the marks: mark in on one, out on the other.
 */
import type { WhistlemarkDb } from '../db/database.ts';
import type { FrameMarks } from './mark-span.ts';

export interface StoredMarks extends FrameMarks {
  /** The footage the frames belong to: marks of other footage are not shown. */
  footageSourceId: number;
}

export const marksKey = (projectId: number) => `playerMarks:${projectId}`;
export const lastReelKey = (projectId: number) => `lastReel:${projectId}`;

const frameOrNothing = (v: unknown) => (typeof v === 'number' && Number.isInteger(v) && v >= 0 ? v : undefined);

/** The stored marks for this footage (a damaged or foreign row reads as no marks). */
export function readMarks(value: unknown, footageSourceId: number): FrameMarks {
  if (!value || typeof value !== 'object') return {};
  const v = value as Partial<StoredMarks>;
  if (v.footageSourceId !== footageSourceId) return {};
  const inFrame = frameOrNothing(v.inFrame);
  const outFrame = frameOrNothing(v.outFrame);
  return { ...(inFrame !== undefined ? { inFrame } : {}), ...(outFrame !== undefined ? { outFrame } : {}) };
}

export async function loadMarks(db: WhistlemarkDb, projectId: number, footageSourceId: number): Promise<FrameMarks> {
  return readMarks((await db.settings.get(marksKey(projectId)))?.value, footageSourceId);
}

export async function saveMarks(db: WhistlemarkDb, projectId: number, footageSourceId: number, marks: FrameMarks): Promise<void> {
  const value: StoredMarks = { footageSourceId, ...readMarks({ footageSourceId, ...marks }, footageSourceId) };
  await db.settings.put({ key: marksKey(projectId), value });
}

export async function loadLastReel(db: WhistlemarkDb, projectId: number): Promise<number | undefined> {
  const v = (await db.settings.get(lastReelKey(projectId)))?.value;
  return typeof v === 'number' ? v : undefined;
}

export async function saveLastReel(db: WhistlemarkDb, projectId: number, reelId: number): Promise<void> {
  await db.settings.put({ key: lastReelKey(projectId), value: reelId });
}
