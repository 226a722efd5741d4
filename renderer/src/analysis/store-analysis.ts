/**
 * Stores one analysis run in ONE transaction: the detected tracking and event anchors, the
 * events clock fit and the proposed corrections replace the previous run's; corrections the
 * analyst already decided (accepted, rejected, edited) are left exactly as they are, and a
 * proposal that changed under such a decision is listed in the run record so the Review
 * screen can say so. Either everything is written or nothing is.
 *
 *   const run = await storeAnalysis(db, { projectId, output, user: 'ana', trigger: 'on request' });
 *   run.proposals  // -> 77
 */
import type { ProposedCorrection } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { CorrectionRow } from '../db/rows.ts';
import type { AnalysisOutput } from './protocol.ts';

export interface ChangedUnderDecision {
  eventId: string;
  status: CorrectionRow['status'];
  /** The proposal the decision was made on, and what this run proposes (absent: nothing now). */
  before: ProposedCorrection;
  after?: ProposedCorrection;
}

export interface AnalysisRun {
  at: number;
  trigger: 'automatic' | 'on request';
  trackingSourceId: number;
  eventSourceId: number;
  rate: number;
  trackingAnchors: number;
  eventAnchors: number;
  /** Open proposals after the run. */
  proposals: number;
  /** Decided corrections the run left alone. */
  keptDecided: number;
  changedUnderDecided: ChangedUnderDecision[];
  /** Open proposals of the previous run that this run no longer makes. */
  withdrawn: number;
}

export interface StoreAnalysisRequest {
  projectId: number;
  output: AnalysisOutput;
  user: string;
  trigger: AnalysisRun['trigger'];
  now?: number;
}

export const runKey = (projectId: number) => `analysisRun:${projectId}`;

/** Worth the analyst's attention: placed by the engine and actually different from the log. */
export function isProposal(c: ProposedCorrection): boolean {
  return c.placed && c.change !== 'none' && Number.isFinite(c.trackingTime);
}

/** Half a tracking frame in time or half a metre in place: below that a proposal has not changed. */
export function proposalMoved(a: ProposedCorrection, b: ProposedCorrection | undefined, rate: number): boolean {
  if (!b) return true;
  if (a.trackingPeriod !== b.trackingPeriod || Math.abs(a.trackingTime - b.trackingTime) > 0.5 / rate) return true;
  if ((a.x === undefined) !== (b.x === undefined) || (a.y === undefined) !== (b.y === undefined)) return true;
  return a.x !== undefined && b.x !== undefined && Math.hypot(a.x - b.x, (a.y ?? 0) - (b.y ?? 0)) > 0.5;
}

export async function storeAnalysis(db: WhistlemarkDb, req: StoreAnalysisRequest): Promise<AnalysisRun> {
  const { projectId, output: out, user } = req;
  const tables = [db.projects, db.sources, db.anchors, db.clockFits, db.corrections, db.audit, db.settings];
  return db.transaction('rw', tables, async () => {
    const now = req.now ?? Date.now();
    for (const id of [out.trackingSourceId, out.eventSourceId]) {
      const s = await db.sources.get(id);
      if (!s || s.projectId !== projectId) throw new Error(`Source ${id} is no longer in this match project (deleted while the analysis ran?); nothing was stored. Run the analysis again.`);
    }
    // Anchors: the previous run's detections go, the analyst's own anchors stay.
    const oldAnchors = await db.anchors
      .where('projectId')
      .equals(projectId)
      .filter((a) => a.origin === 'detected' && ((a.sourceId === out.trackingSourceId && a.anchor.source === 'tracking') || (a.sourceId === out.eventSourceId && a.anchor.source === 'events')))
      .primaryKeys();
    await db.anchors.bulkDelete(oldAnchors);
    await db.anchors.bulkAdd([
      ...out.trackingAnchors.map((anchor) => ({ projectId, sourceId: out.trackingSourceId, anchor, origin: 'detected' as const })),
      ...out.eventAnchors.map((anchor) => ({ projectId, sourceId: out.eventSourceId, anchor, origin: 'detected' as const })),
    ]);
    // The events clock fit of this event log: one, the newest.
    const oldFits = await db.clockFits.where('sourceId').equals(out.eventSourceId).filter((f) => f.projectId === projectId && f.fit.source === 'events').primaryKeys();
    await db.clockFits.bulkDelete(oldFits);
    await db.clockFits.add({ projectId, sourceId: out.eventSourceId, fit: out.fit, createdAt: now });

    const existing = new Map<string, CorrectionRow>();
    for (const r of await db.corrections.where('projectId').equals(projectId).filter((c) => c.sourceId === out.eventSourceId).toArray()) existing.set(r.eventId, r);
    const fresh = new Map(out.corrections.filter(isProposal).map((c) => [c.eventId, c]));
    const changedUnderDecided: ChangedUnderDecision[] = [];
    let keptDecided = 0;
    let withdrawn = 0;
    const puts: CorrectionRow[] = [];
    for (const [eventId, row] of existing) {
      const next = fresh.get(eventId);
      if (row.status !== 'proposed') {
        keptDecided++;
        if (proposalMoved(row.proposal, next, out.rate)) changedUnderDecided.push({ eventId, status: row.status, before: row.proposal, ...(next ? { after: next } : {}) });
        continue;
      }
      if (!next) {
        await db.corrections.delete(row.id!);
        withdrawn++;
      } else puts.push({ ...row, proposal: next, updatedAt: now });
    }
    for (const [eventId, proposal] of fresh)
      if (!existing.has(eventId)) puts.push({ projectId, sourceId: out.eventSourceId, eventId, status: 'proposed', proposal, updatedAt: now });
    await db.corrections.bulkPut(puts);

    const run: AnalysisRun = {
      at: now,
      trigger: req.trigger,
      trackingSourceId: out.trackingSourceId,
      eventSourceId: out.eventSourceId,
      rate: out.rate,
      trackingAnchors: out.trackingAnchors.length,
      eventAnchors: out.eventAnchors.length,
      proposals: puts.length,
      keptDecided,
      changedUnderDecided,
      withdrawn,
    };
    await db.settings.put({ key: runKey(projectId), value: run });
    await db.audit.add({
      projectId,
      at: now,
      user,
      subject: 'correction',
      what: `analysis (${req.trigger}): ${run.proposals} proposed corrections, ${run.trackingAnchors} tracking and ${run.eventAnchors} event anchors, events clock fit` +
        (keptDecided ? `; ${keptDecided} decided corrections kept${changedUnderDecided.length ? `, ${changedUnderDecided.length} of them now proposed differently` : ''}` : ''),
      before: { anchors: oldAnchors.length, fits: oldFits.length, openProposals: [...existing.values()].filter((r) => r.status === 'proposed').length },
      after: { ...run, changedUnderDecided: changedUnderDecided.map((c) => c.eventId) },
    });
    await db.projects.update(projectId, { updatedAt: now });
    return run;
  });
}
