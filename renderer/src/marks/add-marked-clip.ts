/**
 * "Add marked clip to reel…": the marked span as a clip at the end of a reel (an existing
 * one, or a new one made first), each through the undo history like every other change.
 * A new reel is its own step: Ctrl+Z takes the clip away, a second Ctrl+Z the reel.
 */
import type { WhistlemarkDb } from '../db/database.ts';
import { spanFromPoints } from '../reels/clip-rules.ts';
import { addClips, addReel, type ActionContext } from '../reels/reel-actions.ts';
import type { MarkedSpan } from './mark-span.ts';
import { saveLastReel } from './mark-store.ts';

export type ReelChoice = { reelId: number } | { newReelTitle: string };

export interface AddedClip {
  reelId: number;
  reelTitle: string;
  clipId: number;
  title: string;
  durationS: number;
  newReel: boolean;
}

/** `layers`: the overlay layers the clip shows (Watch passes the ones on screen); absent: the Reels default. */
export async function addMarkedClip(db: WhistlemarkDb, ctx: ActionContext, span: MarkedSpan, target: ReelChoice, title?: string, layers?: string[]): Promise<AddedClip> {
  const clipTitle = title?.trim() || span.title;
  // Checked before anything is written, so a bad span never leaves an empty new reel behind.
  const clip = spanFromPoints(span.period, span.from, span.to, clipTitle);
  let reelId: number;
  let reelTitle: string;
  if ('reelId' in target) {
    const reel = await db.reels.get(target.reelId);
    if (!reel || reel.projectId !== ctx.projectId) throw new Error(`The reel chosen (${target.reelId}) no longer exists (deleted, or its creation undone): choose another reel or a new one.`);
    reelId = target.reelId;
    reelTitle = reel.title;
  } else {
    reelTitle = target.newReelTitle.trim() || 'Marked clips';
    reelId = await addReel(db, ctx, reelTitle);
  }
  const [clipId] = await addClips(db, ctx, reelId, [clip], ...(layers ? [layers] : []));
  await saveLastReel(db, ctx.projectId, reelId);
  return { reelId, reelTitle, clipId, title: clipTitle, durationS: span.durationS, newReel: !('reelId' in target) };
}
