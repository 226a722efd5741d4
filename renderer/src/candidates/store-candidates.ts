/**
 * Stores one scan's results for a footage source as one undoable step (history commit()):
 * the earlier detected whistle and cut anchors of that source are replaced, and so are its
 * proposed non-live stretches, all in one transaction — a scan that fails or is cancelled
 * changes nothing. What the analyst made or touched stays: anchors of other origins,
 * detected anchors paired or excluded in a fit, and confirmed non-live stretches (a new
 * proposal overlapping a confirmed one is dropped).
 */
import { cutAnchors, type CutCandidate, type NonLiveProposal } from '../../../engine/cuts/index.ts';
import { whistleAnchors, type WhistleCandidate } from '../../../engine/audio/index.ts';
import type { Anchor, PeriodId } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { AnchorRow, NonLiveRow } from '../db/rows.ts';
import { commit, type ChangeInput } from '../history/history.ts';

export interface ScanResults {
  whistles: WhistleCandidate[];
  cuts: CutCandidate[];
  proposals: NonLiveProposal[];
}

export interface StoreSummary {
  whistles: number;
  cuts: number;
  proposals: number;
  /** Detected anchors kept because the analyst had paired or excluded them. */
  keptTouched: number;
}

/** Settings key that records the last finished scan of a footage source. */
export const scanMarkKey = (footageSourceId: number) => `candidatesScan:${footageSourceId}`;

export interface ScanMark {
  at: number;
  whistles: number;
  cuts: number;
  proposals: number;
}

const DETECTED_KINDS = new Set(['whistle', 'cut']);
/** Anchors this close to a kept one are the same moment (one frame at 25 fps). */
const SAME_MOMENT_S = 0.04;

/** Footage period of a moment: after a proposed half-time stretch it is the second period. */
function periodAt(t: number, proposals: NonLiveProposal[]): PeriodId {
  const half = proposals.find((p) => p.kind === 'half_time');
  return half && t >= half.toT ? 2 : 1;
}

export async function storeCandidates(
  db: WhistlemarkDb,
  req: { projectId: number; footageSourceId: number; fileName: string; user: string; results: ScanResults },
): Promise<StoreSummary> {
  const { projectId, footageSourceId: sourceId, results } = req;
  const tables = [db.anchors, db.nonLive, db.events, db.corrections, db.clockFits, db.pitchRegistrations, db.reels, db.clips, db.audit, db.projects, db.settings];
  return db.transaction('rw', tables, async () => {
    const anchors = await db.anchors.where('sourceId').equals(sourceId).toArray();
    const nonLive = await db.nonLive.where('footageSourceId').equals(sourceId).toArray();
    const changes: ChangeInput[] = [];
    const kept: AnchorRow[] = [];
    for (const row of anchors) {
      if (row.origin !== 'detected' || !DETECTED_KINDS.has(row.anchor.kind)) continue;
      if (row.pairedWith !== undefined || row.excluded) kept.push(row);
      else changes.push({ table: 'anchors', key: row.id! });
    }
    const fresh = (a: Anchor) => !kept.some((k) => k.anchor.kind === a.kind && Math.abs(k.anchor.t - a.t) < SAME_MOMENT_S);
    const newAnchors = [
      ...whistleAnchors(results.whistles, 1).map((a) => ({ ...a, period: periodAt(a.t, results.proposals) })),
      ...cutAnchors(results.cuts, 1).map((a) => ({ ...a, period: periodAt(a.t, results.proposals) })),
    ].filter(fresh);
    for (const anchor of newAnchors) {
      const row: AnchorRow = { projectId, sourceId, anchor, origin: 'detected' };
      changes.push({ table: 'anchors', after: row });
    }
    const confirmed = nonLive.filter((n) => n.status === 'confirmed');
    for (const n of nonLive) if (n.status === 'proposed') changes.push({ table: 'nonLive', key: n.id! });
    let proposals = 0;
    for (const p of results.proposals) {
      if (confirmed.some((c) => c.fromT < p.toT && c.toT > p.fromT)) continue;
      const row: NonLiveRow = { projectId, footageSourceId: sourceId, fromT: p.fromT, toT: p.toT, kind: p.kind, status: 'proposed', note: p.reason };
      changes.push({ table: 'nonLive', after: row });
      proposals++;
    }
    const whistles = newAnchors.filter((a) => a.kind === 'whistle').length;
    const cuts = newAnchors.length - whistles;
    await commit(db, {
      projectId,
      user: req.user,
      subject: 'anchor',
      what: `find candidates in ${req.fileName}: ${whistles} whistles, ${cuts} cuts, ${proposals} non-live proposals`,
      changes,
    });
    const mark: ScanMark = { at: Date.now(), whistles, cuts, proposals };
    await db.settings.put({ key: scanMarkKey(sourceId), value: mark });
    return { whistles, cuts, proposals, keptTouched: kept.length };
  });
}

/** The last finished scan of a footage source, if any (for "scan once on first open"). */
export async function lastScan(db: WhistlemarkDb, footageSourceId: number): Promise<ScanMark | undefined> {
  return (await db.settings.get(scanMarkKey(footageSourceId)))?.value as ScanMark | undefined;
}
