/**
 * Loads what overlay scenes are built from for one project: tracking (all periods), the
 * newest footage clock fit, the footage's pitch registration and confirmed non-live
 * intervals. Missing pieces stay undefined; scenes then say why nothing is drawn.
 *
 *   const data = await loadOverlayData(db, projectId);   // -> OverlayData | undefined (no tracking or footage)
 */
import type { WhistlemarkDb } from '../db/database.ts';
import type { PitchRegistrationRow } from '../db/rows.ts';
import { loadTracking } from '../db/store.ts';
import type { OverlayData, RegistrationData } from './contract.ts';

export interface OverlaySources {
  trackingSourceId: number;
  footageSourceId: number;
}

export async function overlaySources(db: WhistlemarkDb, projectId: number): Promise<OverlaySources | undefined> {
  const sources = await db.sources.where('projectId').equals(projectId).toArray();
  const trk = sources.filter((s) => s.kind === 'tracking').at(-1);
  const ftg = sources.filter((s) => s.kind === 'footage').at(0);
  if (!trk?.id || !ftg?.id) return undefined;
  return { trackingSourceId: trk.id, footageSourceId: ftg.id };
}

export async function loadRegistrationRow(db: WhistlemarkDb, projectId: number, footageSourceId: number): Promise<PitchRegistrationRow | undefined> {
  const rows = await db.pitchRegistrations.where('footageSourceId').equals(footageSourceId).toArray();
  return rows.filter((r) => r.projectId === projectId).sort((a, b) => (b.id ?? 0) - (a.id ?? 0))[0];
}

export function isRegistrationData(d: unknown): d is RegistrationData {
  return !!d && typeof d === 'object' && (d as RegistrationData).schema === 'whistlemark-registration/1' && Array.isArray((d as RegistrationData).keyframes);
}

export async function loadOverlayData(db: WhistlemarkDb, projectId: number, which?: OverlaySources): Promise<OverlayData | undefined> {
  const src = which ?? (await overlaySources(db, projectId));
  if (!src) return undefined;
  const tracking = await loadTracking(db, src.trackingSourceId);
  const footage = await db.footage.get(src.footageSourceId);
  if (!footage) return undefined;
  const fits = await db.clockFits.where('projectId').equals(projectId).toArray();
  const fit = fits
    .filter((f) => f.fit.source === 'footage' && f.sourceId === src.footageSourceId)
    .sort((a, b) => b.createdAt - a.createdAt || (b.id ?? 0) - (a.id ?? 0))[0]?.fit;
  const reg = await loadRegistrationRow(db, projectId, src.footageSourceId);
  const nonLive = (await db.nonLive.where('footageSourceId').equals(src.footageSourceId).toArray())
    .filter((n) => n.projectId === projectId && n.status === 'confirmed')
    .map((n) => ({ fromT: n.fromT, toT: n.toT, kind: n.kind }));
  return {
    pitch: tracking.pitch,
    rate: tracking.rate,
    objects: tracking.objects,
    ballIndex: tracking.ballIndex,
    periods: tracking.periods,
    ...(fit ? { fit } : {}),
    ...(reg && isRegistrationData(reg.data) ? { registration: reg.data } : {}),
    nonLive,
    footage: { width: footage.probe.width, height: footage.probe.height },
  };
}
