/**
 * The bytes of each export, built from the database with the pure builders of
 * engine/export/. The corrected event log uses the latest events clock fit of each event
 * log and the latest correction of each event.
 *
 *   const file = await buildExport(db, projectId, 'events-csv', { user }); // { name: 'match-corrected-events.csv', bytes }
 */
import { clockFitsJson, correctedEventRows, correctedEventsCsv, correctedEventsJson, syncReportHtml, type CorrectedEventRow, type LabelledFit } from '../../../engine/export/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import type { ClockFitRow, CorrectionRow, SourceRow } from '../db/rows.ts';

export type ExportKind = 'events-csv' | 'events-json' | 'fits-json' | 'report-html';

export const EXPORTS: { kind: ExportKind; label: string; suffix: string; hint: string }[] = [
  { kind: 'events-csv', label: 'Corrected event log (CSV)', suffix: '-corrected-events.csv', hint: 'logged and corrected values side by side, status and confidence' },
  { kind: 'events-json', label: 'Corrected event log (JSON)', suffix: '-corrected-events.json', hint: 'the same rows as JSON' },
  { kind: 'fits-json', label: 'Clock fits (JSON)', suffix: '-clock-fits.json', hint: 'offset, drift and residuals per period, every anchor' },
  { kind: 'report-html', label: 'Sync report (HTML)', suffix: '-sync-report.html', hint: 'one page for the staff; prints to PDF' },
];

export function fileSlug(title: string): string {
  return (
    title
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .replace(/[^A-Za-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .toLowerCase()
      .slice(0, 60) || 'match'
  );
}

export interface ExportContext {
  title: string;
  sources: SourceRow[];
  fits: ClockFitRow[];
  rows: CorrectedEventRow[];
}

/** Latest row of each group, by id. */
function latestBy<T extends { id?: number }>(rows: T[], key: (r: T) => string): Map<string, T> {
  const m = new Map<string, T>();
  for (const r of rows) {
    const k = key(r);
    const had = m.get(k);
    if (!had || (r.id ?? 0) > (had.id ?? 0)) m.set(k, r);
  }
  return m;
}

export async function exportContext(db: WhistlemarkDb, projectId: number): Promise<ExportContext> {
  return db.transaction('r', [db.projects, db.sources, db.events, db.corrections, db.clockFits], async () => {
    const project = await db.projects.get(projectId);
    if (!project) throw new Error(`Match project ${projectId} no longer exists.`);
    const sources = await db.sources.where('projectId').equals(projectId).sortBy('id');
    const allFits = await db.clockFits.where('projectId').equals(projectId).toArray();
    const fits = [...latestBy(allFits, (f) => `${f.sourceId}:${f.fit.source}`).values()].sort((a, b) => a.sourceId - b.sourceId);
    const corrections = latestBy(await db.corrections.where('projectId').equals(projectId).toArray(), (c: CorrectionRow) => `${c.sourceId}:${c.eventId}`);
    const rows: CorrectedEventRow[] = [];
    for (const src of sources.filter((s) => s.kind === 'events')) {
      const fit = fits.find((f) => f.sourceId === src.id && f.fit.source === 'events')?.fit;
      const events = (await db.events.where('sourceId').equals(src.id!).toArray()).sort((a, b) => a.row - b.row);
      rows.push(
        ...correctedEventRows(
          events.map((e) => {
            const c = corrections.get(`${src.id}:${e.eventId}`);
            return { logged: e.logged, current: e.current, ...(c ? { correction: { status: c.status, proposal: c.proposal, ...(c.edited ? { edited: c.edited } : {}) } } : {}) };
          }),
          fit,
        ),
      );
    }
    return { title: project.title, sources, fits, rows };
  });
}

export async function buildExport(db: WhistlemarkDb, projectId: number, kind: ExportKind, who: { user: string; appVersion?: string }): Promise<{ name: string; bytes: Uint8Array; summary: string }> {
  const ctx = await exportContext(db, projectId);
  const generatedAt = new Date().toISOString();
  const name = fileSlug(ctx.title) + EXPORTS.find((e) => e.kind === kind)!.suffix;
  const enc = (s: string) => new TextEncoder().encode(s);
  const labelled: LabelledFit[] = ctx.fits.map((f) => ({ label: ctx.sources.find((s) => s.id === f.sourceId)?.fileName ?? `source ${f.sourceId}`, fit: f.fit, createdAt: f.createdAt }));
  if (kind === 'events-csv' || kind === 'events-json') {
    if (!ctx.rows.length) throw new Error('This match project has no event log yet: import one on the Sources screen first.');
    const text = kind === 'events-csv' ? correctedEventsCsv(ctx.rows) : correctedEventsJson(ctx.rows, { title: ctx.title, generatedAt, clock: 'corrected times: tracking clock, seconds since the period start' });
    return { name, bytes: enc(text), summary: `${ctx.rows.length} events` };
  }
  if (kind === 'fits-json') {
    if (!labelled.length) throw new Error('No clock fit has been made for this match yet: run the sync first.');
    return { name, bytes: enc(clockFitsJson(labelled, { title: ctx.title, generatedAt })), summary: `${labelled.length} fit(s)` };
  }
  const nonLive = await db.nonLive.where('projectId').equals(projectId).toArray();
  const html = syncReportHtml({
    title: ctx.title,
    generatedAt: new Date(generatedAt).toLocaleString(),
    user: who.user,
    ...(who.appVersion ? { appVersion: who.appVersion } : {}),
    fits: labelled,
    events: ctx.rows,
    nonLive: nonLive
      .sort((a, b) => a.fromT - b.fromT)
      .map((n) => ({ footage: ctx.sources.find((s) => s.id === n.footageSourceId)?.fileName ?? `footage ${n.footageSourceId}`, fromT: n.fromT, toT: n.toT, kind: n.kind, status: n.status, ...(n.note ? { note: n.note } : {}) })),
  });
  return { name, bytes: enc(html), summary: `${labelled.length} fit(s), ${ctx.rows.length} events, ${nonLive.length} non-live intervals` };
}
