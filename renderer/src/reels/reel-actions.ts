/**
 * Every analyst change to reels and clips, each one undoable step through the history
 * (renderer/src/history commit(): writes the rows and the audit entry in one transaction).
 *
 *   const reelId = await addReel(db, ctx, 'Corners against');
 *   await addClips(db, ctx, reelId, spansFromEvents(corners, { preRoll: 4, postRoll: 8 }));
 *   await mergeClipsInReel(db, ctx, reelId);   // overlapping clips become one
 */
import type { WhistlemarkDb } from '../db/database.ts';
import type { ClipRow, ReelRow } from '../db/rows.ts';
import { commit, type ChangeInput } from '../history/history.ts';
import { moveInOrder, overlapGroups, type ClipSpan } from './clip-rules.ts';

export interface ActionContext {
  projectId: number;
  user: string;
}

export type StoredClip = ClipRow & { id: number };

export async function clipsOfReel(db: WhistlemarkDb, reelId: number): Promise<StoredClip[]> {
  const rows = (await db.clips.where('reelId').equals(reelId).toArray()) as StoredClip[];
  return rows.sort((a, b) => a.order - b.order || a.id - b.id);
}

export async function addReel(db: WhistlemarkDb, ctx: ActionContext, title: string): Promise<number> {
  const name = title.trim() || 'Untitled reel';
  const row: ReelRow = { projectId: ctx.projectId, title: name, createdAt: Date.now() };
  const [id] = await commit(db, { ...ctx, subject: 'reel', what: `add reel "${name}"`, changes: [{ table: 'reels', after: row }] });
  return id;
}

export async function renameReel(db: WhistlemarkDb, ctx: ActionContext, reelId: number, title: string): Promise<void> {
  const reel = await db.reels.get(reelId);
  if (!reel) throw new Error(`reel ${reelId} no longer exists; it may have been deleted or undone`);
  await commit(db, { ...ctx, subject: 'reel', what: `rename reel "${reel.title}" to "${title}"`, changes: [{ table: 'reels', key: reelId, after: { ...reel, title } }] });
}

/** Deletes the reel and its clips in one step (one undo brings both back). */
export async function deleteReel(db: WhistlemarkDb, ctx: ActionContext, reelId: number): Promise<void> {
  const reel = await db.reels.get(reelId);
  if (!reel) return;
  const clips = await clipsOfReel(db, reelId);
  await commit(db, {
    ...ctx,
    subject: 'reel',
    what: `delete reel "${reel.title}" (${clips.length} clips)`,
    changes: [...clips.map((c) => ({ table: 'clips' as const, key: c.id })), { table: 'reels', key: reelId }],
  });
}

/** Appends clips at the end of the reel, in the order given. */
export async function addClips(db: WhistlemarkDb, ctx: ActionContext, reelId: number, spans: ClipSpan[], layers: string[] = ['dots', 'ball']): Promise<number[]> {
  if (!spans.length) return [];
  const existing = await clipsOfReel(db, reelId);
  let order = existing.length ? existing[existing.length - 1].order + 1 : 0;
  const changes: ChangeInput[] = spans.map((s) => ({
    table: 'clips',
    after: {
      projectId: ctx.projectId,
      reelId,
      order: order++,
      period: s.period,
      from: s.from,
      to: s.to,
      title: s.title,
      note: '',
      layers: [...layers],
      preRoll: s.preRoll,
      postRoll: s.postRoll,
      eventIds: s.eventIds,
    } satisfies ClipRow,
  }));
  return commit(db, { ...ctx, subject: 'clip', what: spans.length === 1 ? `add clip "${spans[0].title}"` : `add ${spans.length} clips`, changes });
}

export type ClipEdit = Partial<Pick<ClipRow, 'title' | 'note' | 'layers' | 'from' | 'to' | 'preRoll' | 'postRoll'>>;

export async function updateClip(db: WhistlemarkDb, ctx: ActionContext, clipId: number, edit: ClipEdit, what?: string): Promise<void> {
  const clip = await db.clips.get(clipId);
  if (!clip) throw new Error(`clip ${clipId} no longer exists; it may have been deleted or undone`);
  const next = { ...clip, ...edit };
  if (!(next.to > next.from)) throw new RangeError(`clip "${clip.title ?? clipId}": out (${next.to.toFixed(2)} s) must be after in (${next.from.toFixed(2)} s)`);
  await commit(db, { ...ctx, subject: 'clip', what: what ?? `edit clip "${clip.title ?? clipId}" (${Object.keys(edit).join(', ')})`, changes: [{ table: 'clips', key: clipId, after: next }] });
}

export async function deleteClips(db: WhistlemarkDb, ctx: ActionContext, clipIds: number[]): Promise<void> {
  if (!clipIds.length) return;
  await commit(db, { ...ctx, subject: 'clip', what: clipIds.length === 1 ? `delete clip ${clipIds[0]}` : `delete ${clipIds.length} clips`, changes: clipIds.map((key) => ({ table: 'clips', key })) });
}

/** Moves the clip at position `from` to position `to`; rewrites only the orders that change. */
export async function moveClip(db: WhistlemarkDb, ctx: ActionContext, reelId: number, from: number, to: number): Promise<void> {
  const clips = await clipsOfReel(db, reelId);
  if (from === to || from < 0 || from >= clips.length) return;
  const next = moveInOrder(clips, from, to);
  const changes: ChangeInput[] = [];
  next.forEach((c, i) => {
    if (c.order !== i) changes.push({ table: 'clips', key: c.id, after: { ...c, order: i } });
  });
  await commit(db, { ...ctx, subject: 'clip', what: `move clip "${clips[from].title ?? clips[from].id}" to position ${Math.min(to, clips.length - 1) + 1}`, changes });
}

/**
 * Merges overlapping clips of the reel: each group keeps its first clip (widened, event
 * ids, notes and layers joined), the others are deleted. One undoable step. Returns how many clips went.
 */
export async function mergeClipsInReel(db: WhistlemarkDb, ctx: ActionContext, reelId: number, gap = 0): Promise<number> {
  const clips = await clipsOfReel(db, reelId);
  const groups = overlapGroups(clips, gap).filter((g) => g.length > 1);
  if (!groups.length) return 0;
  const changes: ChangeInput[] = [];
  for (const g of groups) {
    const parts = g.map((i) => clips[i]);
    const keep = parts[0];
    changes.push({
      table: 'clips',
      key: keep.id,
      after: {
        ...keep,
        from: Math.min(...parts.map((p) => p.from)),
        to: Math.max(...parts.map((p) => p.to)),
        eventIds: [...new Set(parts.flatMap((p) => p.eventIds ?? []))],
        layers: [...new Set(parts.flatMap((p) => p.layers ?? []))],
        note: parts.map((p) => p.note ?? '').filter(Boolean).join('\n'),
        title: `${keep.title ?? 'Clip'} (+${parts.length - 1})`,
      },
    });
    for (const p of parts.slice(1)) changes.push({ table: 'clips', key: p.id });
  }
  const removed = changes.filter((c) => c.after === undefined).length;
  await commit(db, { ...ctx, subject: 'clip', what: `merge overlapping clips (${removed} joined into others)`, changes });
  return removed;
}
