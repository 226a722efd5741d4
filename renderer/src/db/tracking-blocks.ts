/**
 * Tracking is stored in time blocks (default 60 s of frames per block, per period) so one
 * period loads with a few dozen reads and a later screen can page through a match without
 * holding all of it. Blocks are plain slices of the frame-major arrays.
 */
import type { TrackingData, TrackingPeriod } from '../../../shared-types/index.ts';
import type { TrackingBlockRow, TrackingMetaRow, TrackingPeriodMeta } from './rows.ts';

export const DEFAULT_BLOCK_SECONDS = 60;

export function framesPerBlock(rate: number, blockSeconds = DEFAULT_BLOCK_SECONDS): number {
  return Math.max(1, Math.round(rate * blockSeconds));
}

/** Split a whole tracking source into its meta row and block rows (copies, not views). */
export function splitTracking(
  sourceId: number,
  data: TrackingData,
  blockSeconds = DEFAULT_BLOCK_SECONDS,
): { meta: TrackingMetaRow; blocks: TrackingBlockRow[] } {
  const perBlock = framesPerBlock(data.rate, blockSeconds);
  const n = data.objects.length;
  const blocks: TrackingBlockRow[] = [];
  const periods: TrackingPeriodMeta[] = data.periods.map((p) => {
    const blockCount = Math.ceil(p.frameCount / perBlock);
    for (let b = 0; b < blockCount; b++) {
      const from = b * perBlock;
      const to = Math.min(p.frameCount, from + perBlock);
      blocks.push({
        sourceId,
        period: p.period,
        block: b,
        offset: from,
        frameCount: to - from,
        present: p.present.slice(from, to),
        x: p.x.slice(from * n, to * n),
        y: p.y.slice(from * n, to * n),
        ...(p.ballZ ? { ballZ: p.ballZ.slice(from, to) } : {}),
      });
    }
    return {
      period: p.period,
      firstFrame: p.firstFrame,
      frameCount: p.frameCount,
      homeAttacks: p.homeAttacks,
      framesPerBlock: perBlock,
      blockCount,
      hasBallZ: p.ballZ !== undefined,
    };
  });
  const meta: TrackingMetaRow = {
    sourceId,
    rate: data.rate,
    pitch: data.pitch,
    objects: data.objects,
    ballIndex: data.ballIndex,
    periods,
  };
  return { meta, blocks };
}

/** Put one period back together from its blocks (in any order). */
export function joinPeriod(meta: TrackingMetaRow, pm: TrackingPeriodMeta, blocks: TrackingBlockRow[]): TrackingPeriod {
  const n = meta.objects.length;
  // No NaN pre-fill: every frame must come from a block (checked below), so it would be
  // overwritten anyway; skipping it saves a full pass over the period.
  const present = new Uint8Array(pm.frameCount);
  const x = new Float32Array(pm.frameCount * n);
  const y = new Float32Array(pm.frameCount * n);
  const ballZ = pm.hasBallZ ? new Float32Array(pm.frameCount).fill(NaN) : undefined;
  let covered = 0;
  for (const b of blocks) {
    if (b.period !== pm.period) continue;
    present.set(b.present, b.offset);
    x.set(b.x, b.offset * n);
    y.set(b.y, b.offset * n);
    if (ballZ && b.ballZ) ballZ.set(b.ballZ, b.offset);
    covered += b.frameCount;
  }
  if (covered !== pm.frameCount) {
    throw new Error(
      `Tracking period ${pm.period} of source ${meta.sourceId} is incomplete in the database ` +
        `(${covered} of ${pm.frameCount} frames). Re-import the tracking file.`,
    );
  }
  return {
    period: pm.period,
    firstFrame: pm.firstFrame,
    frameCount: pm.frameCount,
    present,
    x,
    y,
    ...(ballZ ? { ballZ } : {}),
    homeAttacks: pm.homeAttacks,
  };
}
