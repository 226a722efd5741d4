/**
 * What the Sync screen computes from the stored rows, without React: the footage pairs,
 * the footage clock fit, the proposals, and the row changes an analyst action makes (the
 * anchors it touches and the replacement fit, written together in one history step).
 */
import { fitFootageClock, proposePairings, type FootageClockFit, type FootagePair, type Proposal } from '../../../engine/footage-sync/index.ts';
import { footageToTracking } from '../../../engine/fit/footage-map.ts';
import type { AnchorKind, PeriodId, Seconds } from '../../../shared-types/index.ts';
import type { ChangeInput } from '../history/history.ts';
import type { AnchorRow, ClockFitRow, NonLiveRow, TrackingPeriodMeta } from '../db/rows.ts';

export interface SyncInputs {
  projectId: number;
  footageSourceId: number;
  footageRows: AnchorRow[];
  trackingRows: AnchorRow[];
  nonLive: NonLiveRow[];
  trackingRate: number;
  trackingPeriods: TrackingPeriodMeta[];
  footageFps: number;
  footageDuration: Seconds;
}

export interface SyncState {
  pairs: FootagePair[];
  fit: FootageClockFit;
  proposals: Proposal[];
}

/** The tracking row a footage row is paired with: by the anchor's own id first (it survives a re-analysis), then by row id. */
export function pairedTracking(f: AnchorRow, trackingRows: AnchorRow[]): AnchorRow | undefined {
  if (f.pairedAnchorId) {
    const byId = trackingRows.find((t) => t.anchor.id === f.pairedAnchorId);
    if (byId) return byId;
  }
  return f.pairedWith === undefined ? undefined : trackingRows.find((t) => t.id === f.pairedWith);
}

export function fitOptions(inp: Pick<SyncInputs, 'trackingPeriods' | 'trackingRate' | 'footageFps' | 'footageDuration'>) {
  return {
    footageFrameS: 1 / inp.footageFps,
    trackingFrameS: 1 / inp.trackingRate,
    trackingPeriods: inp.trackingPeriods.map((p) => ({ period: p.period, start: 0, end: (p.frameCount - 1) / inp.trackingRate })),
    footageDurationS: inp.footageDuration,
  };
}

export function pairsOf(footageRows: AnchorRow[], trackingRows: AnchorRow[]): FootagePair[] {
  const out: FootagePair[] = [];
  for (const f of footageRows) {
    const t = pairedTracking(f, trackingRows);
    if (!t) continue;
    const a = t.anchor as AnchorRow['anchor'] & { stillFromT?: number };
    out.push({
      footageAnchorId: rowKey(f), trackingAnchorId: rowKey(t), period: a.period, footageKind: f.anchor.kind, tFootage: f.anchor.t,
      tracking: { kind: a.kind, t: a.t, ...(a.stillFromT !== undefined ? { stillFromT: a.stillFromT } : {}) },
      ...(f.excluded ? { excluded: true } : {}),
    });
  }
  return out;
}

/** Ids the engine sees: the database row id as text; a row not yet written goes by its anchor id. */
export const rowKey = (r: AnchorRow) => (r.id !== undefined ? String(r.id) : r.anchor.id);

export function computeSync(inp: SyncInputs): SyncState {
  const pairs = pairsOf(inp.footageRows, inp.trackingRows);
  const fit = fitFootageClock(pairs, fitOptions(inp));
  const pairedF = new Set(pairs.map((p) => p.footageAnchorId));
  const pairedT = new Set(pairs.map((p) => p.trackingAnchorId));
  const proposals = proposePairings(
    fit,
    inp.footageRows.map((r) => ({ id: rowKey(r), kind: r.anchor.kind, t: r.anchor.t, confidence: r.anchor.confidence })),
    inp.trackingRows.map((r) => ({ id: rowKey(r), kind: r.anchor.kind, period: r.anchor.period, t: r.anchor.t, confidence: r.anchor.confidence, ...((r.anchor as { stillFromT?: number }).stillFromT !== undefined ? { stillFromT: (r.anchor as { stillFromT?: number }).stillFromT } : {}) })),
    { nonLive: inp.nonLive, usedFootage: pairedF, usedTracking: pairedT },
  );
  return { pairs, fit, proposals };
}

/**
 * The footage rows after `apply` edits them, the new fit, and the changes to commit: the
 * touched anchor rows plus the fit row (replaced in place, or added, or removed when no
 * pairing is left).
 */
export function changesWithFit(inp: SyncInputs, fitRow: ClockFitRow | undefined, anchorChanges: ChangeInput[], nextFootageRows: AnchorRow[]): ChangeInput[] {
  const fit = fitFootageClock(pairsOf(nextFootageRows, inp.trackingRows), fitOptions(inp));
  const fitAfter: ClockFitRow | undefined = fit.segments.length ? { projectId: inp.projectId, sourceId: inp.footageSourceId, fit, createdAt: Date.now() } : undefined;
  const fitChange: ChangeInput | undefined = fitRow?.id !== undefined ? { table: 'clockFits', key: fitRow.id, after: fitAfter } : fitAfter ? { table: 'clockFits', after: fitAfter } : undefined;
  return fitChange ? [...anchorChanges, fitChange] : anchorChanges;
}

/**
 * The tracking anchor a newly marked restart in footage pairs with: through the current fit,
 * the nearest unpaired tracking anchor of the same kind within 3 s in that period; without
 * a fit there, for a kick-off, the first kick-off of the first period not yet marked (and
 * not before one marked earlier in the footage).
 */
export function autoPair(kind: AnchorKind, t: Seconds, st: SyncState, inp: SyncInputs): { period: PeriodId; tracking?: AnchorRow } {
  const used = new Set(st.pairs.map((p) => p.trackingAnchorId));
  const free = inp.trackingRows.filter((r) => !used.has(rowKey(r)));
  const at = footageToTracking(st.fit, t, 1);
  if (at) {
    const near = free.filter((r) => r.anchor.kind === kind && r.anchor.period === at.period && Math.abs(r.anchor.t - at.t) <= 3).sort((a, b) => Math.abs(a.anchor.t - at.t) - Math.abs(b.anchor.t - at.t));
    return { period: at.period, tracking: near[0] };
  }
  const periods = [...new Set(inp.trackingRows.map((r) => r.anchor.period))].sort((a, b) => a - b);
  const marked = st.pairs.filter((p) => p.footageKind === 'kick_off' || p.footageKind === 'period_start');
  const candidates = periods.filter((p) => !marked.some((m) => m.period === p) && !marked.some((m) => m.period > p && m.tFootage < t) && !marked.some((m) => m.period < p && m.tFootage > t));
  const period = candidates[0] ?? periods[0] ?? 1;
  if (kind !== 'kick_off') return { period };
  const first = free.filter((r) => r.anchor.period === period && r.anchor.kind === 'kick_off').sort((a, b) => a.anchor.t - b.anchor.t)[0];
  return { period, tracking: first };
}
