/**
 * The tables of a freshly synced match, as the app would hold them after importing the
 * tracking and event log and running the sync: project, sources (with the Sources screen's
 * summaries), tracking in 60 s blocks, the event log and its events, the detected anchors,
 * the events clock fit and one proposed correction per event, each recorded in the audit
 * trail as undoable steps. For the command line (`whistlemark sync … --project OUT`), which
 * cannot reach the app's database. tests/unit/project-file/match-tables.test.ts checks that
 * these rows equal what the app's own import code (renderer/src/db) writes.
 *
 *   const tables = matchTables({ title, user, tracking, events, sync, files, now });
 *   const bytes = await writeProjectFile(tables, { writtenBy, databaseVersion: 3 });
 */
import type { Anchor, ClockFit, EventLog, ProposedCorrection, TrackingData } from '../../shared-types/domain.ts';
import type { ProjectTables } from './format.ts';
import { PROJECT_TABLES } from './format.ts';

type Row = Record<string, unknown>;

export interface SourceFile {
  fileName: string;
  path: string;
  size: number;
  mtimeMs: number;
  mapping?: unknown;
}

export interface MatchTablesInput {
  title: string;
  user: string;
  tracking: TrackingData;
  events: EventLog;
  files: { tracking: SourceFile; events: SourceFile; footage?: SourceFile & { probe?: unknown } };
  sync?: { trackingAnchors: Anchor[]; eventAnchors: Anchor[]; fit: ClockFit; corrections: ProposedCorrection[] };
  now?: number;
  /** Seconds of tracking per stored block (the app's default is 60). */
  blockSeconds?: number;
  /** Database schema version the rows follow. */
  databaseVersion?: number;
}

/** Same summary as the Sources screen computes at import (renderer/src/summaries.ts). */
export function trackingSummary(data: TrackingData): Row {
  const players = { home: 0, away: 0, unknown: 0 };
  for (const o of data.objects) if (o.role === 'player') players[o.team ?? 'unknown']++;
  const periods = data.periods.map((p) => {
    let present = 0;
    for (let i = 0; i < p.present.length; i++) present += p.present[i];
    return { period: p.period, start: 0, end: p.frameCount / data.rate, frames: p.frameCount, missingFrames: p.frameCount - present, homeAttacks: p.homeAttacks };
  });
  return {
    duration: periods.reduce((s, p) => s + (p.end - p.start), 0),
    rate: data.rate,
    frames: data.periods.reduce((s, p) => s + p.frameCount, 0),
    objects: data.objects.length,
    players,
    hasBall: data.ballIndex >= 0,
    periods,
  };
}

export function eventsSummary(log: EventLog): Row {
  const eventsByKind: Record<string, number> = {};
  const byPeriod = new Map<number, { start: number; end: number; events: number }>();
  for (const e of log.events) {
    eventsByKind[e.kind] = (eventsByKind[e.kind] ?? 0) + 1;
    const p = byPeriod.get(e.period);
    if (!p) byPeriod.set(e.period, { start: e.t, end: e.t, events: 1 });
    else {
      p.start = Math.min(p.start, e.t);
      p.end = Math.max(p.end, e.t);
      p.events++;
    }
  }
  const periods = [...byPeriod.entries()].sort((a, b) => a[0] - b[0]).map(([period, p]) => ({ period, start: p.start, end: p.end, events: p.events }));
  return { duration: periods.reduce((s, p) => s + (p.end - p.start), 0), eventCount: log.events.length, eventsByKind, teams: log.teams, periods };
}

/** Tracking in time blocks, as renderer/src/db/tracking-blocks.ts stores it. */
export function trackingBlocks(sourceId: number, data: TrackingData, blockSeconds = 60): { meta: Row; blocks: Row[] } {
  const perBlock = Math.max(1, Math.round(data.rate * blockSeconds));
  const n = data.objects.length;
  const blocks: Row[] = [];
  const periods = data.periods.map((p) => {
    const blockCount = Math.ceil(p.frameCount / perBlock);
    for (let b = 0; b < blockCount; b++) {
      const from = b * perBlock;
      const to = Math.min(p.frameCount, from + perBlock);
      blocks.push({
        sourceId, period: p.period, block: b, offset: from, frameCount: to - from,
        present: p.present.slice(from, to), x: p.x.slice(from * n, to * n), y: p.y.slice(from * n, to * n),
        ...(p.ballZ ? { ballZ: p.ballZ.slice(from, to) } : {}),
      });
    }
    return { period: p.period, firstFrame: p.firstFrame, frameCount: p.frameCount, homeAttacks: p.homeAttacks, framesPerBlock: perBlock, blockCount, hasBallZ: p.ballZ !== undefined };
  });
  return { meta: { sourceId, rate: data.rate, pitch: data.pitch, objects: data.objects, ballIndex: data.ballIndex, periods }, blocks };
}

export function matchTables(input: MatchTablesInput): ProjectTables {
  const now = input.now ?? Date.now();
  const t = Object.fromEntries(PROJECT_TABLES.map((n) => [n, []])) as unknown as ProjectTables;
  const projectId = 1;
  let auditId = 0;
  let stamp = now;
  const note = (what: string, extra: Row = {}) => t.audit.push({ id: ++auditId, projectId, at: now, user: input.user, what, ...extra });
  t.projects.push({ id: projectId, title: input.title, createdAt: now, updatedAt: now });
  note(`create project "${input.title}"`);

  const source = (id: number, kind: string, f: SourceFile, summary: Row) => ({
    id, projectId, kind, fileName: f.fileName, path: f.path, size: f.size, mtimeMs: f.mtimeMs, summary, warnings: [], importedAt: now,
    ...(f.mapping ? { mapping: f.mapping } : {}),
  });
  const trackingSummaryRow = trackingSummary(input.tracking);
  t.sources.push(source(1, 'tracking', input.files.tracking, trackingSummaryRow));
  const { meta, blocks } = trackingBlocks(1, input.tracking, input.blockSeconds);
  t.trackingMeta.push(meta);
  blocks.forEach((b, i) => t.trackingBlocks.push({ id: i + 1, ...b }));
  note(`import tracking ${input.files.tracking.fileName}`, { after: { sourceId: 1, summary: trackingSummaryRow, warnings: 0 } });

  const evSummary = eventsSummary(input.events);
  t.sources.push(source(2, 'events', input.files.events, evSummary));
  t.eventLogs.push({ sourceId: 2, pitch: input.events.pitch, teams: input.events.teams, columns: input.events.columns });
  input.events.events.forEach((e, i) =>
    t.events.push({ id: i + 1, sourceId: 2, projectId, eventId: e.id, row: e.row, period: e.period, kind: e.kind, logged: e, current: structuredClone(e) }),
  );
  note(`import events ${input.files.events.fileName}`, { after: { sourceId: 2, summary: evSummary, warnings: 0 } });

  if (input.files.footage) {
    const f = input.files.footage;
    t.sources.push(source(3, 'footage', f, { duration: 0, periods: [] }));
    if (f.probe) t.footage.push({ sourceId: 3, probe: f.probe });
  }

  const s = input.sync;
  if (s) {
    // Each stored result is one undoable step, as the app's analysis writes it.
    const step = (what: string, subject: string, table: string, rows: Row[]) =>
      note(what, { subject, state: 'done', stamp: ++stamp, changes: rows.map((r) => ({ table, key: r.id, after: r })) });
    const anchors: Row[] = [
      ...s.trackingAnchors.map((a) => ({ projectId, sourceId: 1, anchor: a, origin: 'detected' })),
      ...s.eventAnchors.map((a) => ({ projectId, sourceId: 2, anchor: a, origin: 'detected' })),
    ].map((r, i) => ({ ...r, id: i + 1 }));
    t.anchors.push(...anchors);
    step(`detected ${anchors.length} anchors`, 'anchor', 'anchors', anchors);
    const fit = { id: 1, projectId, sourceId: 2, fit: s.fit, createdAt: now };
    t.clockFits.push(fit);
    step('events clock fit', 'fit', 'clockFits', [fit]);
    const corrections = s.corrections.map((c, i) => ({ id: i + 1, projectId, sourceId: 2, eventId: c.eventId, status: 'proposed', proposal: c, updatedAt: now }));
    t.corrections.push(...corrections);
    step(`proposed ${corrections.length} corrections`, 'correction', 'corrections', corrections);
  }
  return t;
}
