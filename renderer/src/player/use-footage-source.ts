/**
 * useFootageSource(projectId, footageSourceId) -> what <FootagePlayer> needs for a stored
 * footage source: the URL to play (the host reopens the file by its path), its probe, and
 * the clocks for the match readouts (the newest footage fit for this file, the newest
 * event log fit, the tracking layout). Re-renders when a newer fit is stored.
 *
 *   const f = useFootageSource(projectId, sourceId);
 *   f.src && f.probe && <FootagePlayer src={f.src} mediaOffset={f.mediaOffset} probe={f.probe} clocks={f.clocks} />
 */
import { useEffect, useMemo, useState } from 'react';
import type { FootageProbe } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { useLive } from '../app/useLive.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { MatchClocks } from './clocks.ts';

export interface FootageSourceState {
  src?: string;
  /** Media time of footage time 0 in the played file, when the host knows it (pass to <FootagePlayer mediaOffset>). */
  mediaOffset?: number;
  /** True when the played file is an MP4 copy of the original (MPEG-TS). */
  remuxed?: boolean;
  probe?: FootageProbe;
  clocks: MatchClocks;
  fileName?: string;
  error?: string;
}

/** The newest clock fit of a source kind for the project (optionally for one source). */
export async function newestFit(db: WhistlemarkDb, projectId: number, source: 'footage' | 'events', sourceId?: number) {
  const rows = await db.clockFits.where('projectId').equals(projectId).toArray();
  const mine = rows.filter((r) => r.fit.source === source && (sourceId === undefined || r.sourceId === sourceId));
  // Newest by creation time, then by id (two fits in the same millisecond).
  mine.sort((a, b) => a.createdAt - b.createdAt || (a.id ?? 0) - (b.id ?? 0));
  return mine[mine.length - 1]?.fit;
}

/** Tracking rate and period layout of the project's tracking source, for tracking frame numbers. */
export async function trackingClock(db: WhistlemarkDb, projectId: number): Promise<MatchClocks['tracking']> {
  const src = await db.sources.where('projectId').equals(projectId).filter((s) => s.kind === 'tracking').last();
  if (!src?.id) return undefined;
  const meta = await db.trackingMeta.get(src.id);
  if (!meta) return undefined;
  return { rate: meta.rate, periods: meta.periods.map((p) => ({ period: p.period, firstFrame: p.firstFrame, frameCount: p.frameCount })) };
}

export function useFootageSource(projectId: number, footageSourceId: number | undefined): FootageSourceState {
  const { db, host } = useServices();
  const source = useLive(() => (footageSourceId === undefined ? Promise.resolve(undefined) : db.sources.get(footageSourceId)), [footageSourceId]);
  const probe = useLive(() => (footageSourceId === undefined ? Promise.resolve(undefined) : db.footage.get(footageSourceId).then((r) => r?.probe)), [footageSourceId]);
  const fit = useLive(() => newestFit(db, projectId, 'footage', footageSourceId), [projectId, footageSourceId]);
  const eventFit = useLive(() => newestFit(db, projectId, 'events'), [projectId]);
  const tracking = useLive(() => trackingClock(db, projectId), [projectId]);
  const [played, setPlayed] = useState<{ src: string; mediaOffset?: number; remuxed: boolean }>();
  const [error, setError] = useState<string>();
  const path = source?.path;
  useEffect(() => {
    if (!path) return;
    let stop = false;
    setError(undefined);
    host
      .openPaths([path])
      // MPEG-TS plays through an MP4 copy with the same frames (the host makes it once).
      .then((f) => host.playableFootage(f[0].fileId))
      .then((p) => !stop && setPlayed({ src: p.url, mediaOffset: p.mediaOffset, remuxed: p.remuxed }))
      .catch((e: Error) => !stop && setError(`The footage ${path} could not be opened: ${e.message}. Was it moved? Open it again on the Sources screen.`));
    return () => {
      stop = true;
    };
  }, [host, path]);
  const clocks = useMemo<MatchClocks>(() => ({ fit, eventFit, tracking }), [fit, eventFit, tracking]);
  return { src: played?.src, mediaOffset: played?.mediaOffset, remuxed: played?.remuxed, probe, clocks, fileName: source?.fileName, error };
}
