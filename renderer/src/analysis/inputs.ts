/**
 * What an analysis runs on: the project's newest tracking and event-log sources, read back
 * from the database. The event log is rebuilt from the rows *as logged* (never the
 * corrected copies), so a re-run proposes against the same log the analyst is reviewing.
 *
 *   const s = await analysisSources(db, 3);        // -> { trackingSourceId: 7, eventSourceId: 8 } | undefined
 *   const log = await loadLoggedEventLog(db, 8);    // -> EventLog in file order
 */
import type { EventLog } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';

export interface AnalysisSources {
  trackingSourceId: number;
  eventSourceId: number;
}

/** The newest tracking and event-log sources of a project, or undefined when one is missing. */
export async function analysisSources(db: WhistlemarkDb, projectId: number): Promise<AnalysisSources | undefined> {
  const sources = await db.sources.where('projectId').equals(projectId).toArray();
  const newest = (kind: 'tracking' | 'events') =>
    sources.filter((s) => s.kind === kind).sort((a, b) => b.importedAt - a.importedAt || (b.id ?? 0) - (a.id ?? 0))[0]?.id;
  const trackingSourceId = newest('tracking');
  const eventSourceId = newest('events');
  return trackingSourceId === undefined || eventSourceId === undefined ? undefined : { trackingSourceId, eventSourceId };
}

/** The event log of a source as it was imported (rows in file order). */
export async function loadLoggedEventLog(db: WhistlemarkDb, eventSourceId: number): Promise<EventLog> {
  const log = await db.eventLogs.get(eventSourceId);
  if (!log) throw new Error(`Source ${eventSourceId} has no event log in the database. Import the event log again on the Sources screen (Alt+1).`);
  const rows = await db.events.where('sourceId').equals(eventSourceId).toArray();
  rows.sort((a, b) => a.row - b.row);
  return { pitch: log.pitch, teams: log.teams, columns: log.columns, events: rows.map((r) => r.logged) };
}

/** True when the project already has a stored analysis of this event log (a clock fit or any correction). */
export async function hasAnalysis(db: WhistlemarkDb, projectId: number, eventSourceId: number): Promise<boolean> {
  const fits = await db.clockFits.where('sourceId').equals(eventSourceId).filter((f) => f.projectId === projectId && f.fit.source === 'events').count();
  if (fits > 0) return true;
  return (await db.corrections.where('projectId').equals(projectId).filter((c) => c.sourceId === eventSourceId).count()) > 0;
}
