/**
 * The project database (Dexie over IndexedDB). Versioned from the first release on:
 * every schema change is a new `version(n)` with an upgrade function, never an edit of an
 * old one, so a database written by any earlier build opens in this one.
 */
import Dexie, { type EntityTable, type Table } from 'dexie';
import type {
  AnchorRow,
  AuditRow,
  ClipRow,
  ClockFitRow,
  CorrectionRow,
  EventLogRow,
  EventRow,
  ExportJobRow,
  FootageRow,
  NonLiveRow,
  PitchRegistrationRow,
  ProjectRow,
  ReelRow,
  RememberedMappingRow,
  SettingRow,
  SourceRow,
  TrackingBlockRow,
  TrackingMetaRow,
} from './rows.ts';

export const DB_NAME = 'whistlemark';

/**
 * Version 1 schema. Events kept only the row as logged.
 * (Kept verbatim: Dexie needs every old version to migrate from it.)
 */
export const SCHEMA_V1 = {
  projects: '++id, title, updatedAt',
  sources: '++id, projectId, kind, headerSignature',
  trackingMeta: 'sourceId',
  trackingBlocks: '++id, sourceId, [sourceId+period+block]',
  eventLogs: 'sourceId',
  events: '++id, sourceId, projectId, [sourceId+row]',
  footage: 'sourceId',
  anchors: '++id, projectId, sourceId',
  clockFits: '++id, projectId, sourceId',
  corrections: '++id, projectId, [sourceId+eventId], status',
  audit: '++id, projectId, at',
  pitchRegistrations: '++id, projectId, footageSourceId',
  reels: '++id, projectId',
  clips: '++id, projectId, reelId',
  mappings: 'signature, kind, savedAt',
  settings: 'key',
} as const;

/**
 * Version 2: events carry the currently corrected copy beside the logged one (`current`),
 * and are indexed by kind within a project (the Review list filters on it).
 */
export const SCHEMA_V2 = {
  events: '++id, sourceId, projectId, [sourceId+row], [projectId+kind]',
} as const;

/**
 * Version 3: non-live footage intervals, the export queue, and undo order in the audit
 * trail (undoable entries carry their row changes; see renderer/src/history/).
 */
export const SCHEMA_V3 = {
  audit: '++id, projectId, at, [projectId+stamp]',
  nonLive: '++id, projectId, footageSourceId',
  exportJobs: '++id, projectId, state',
} as const;

export class WhistlemarkDb extends Dexie {
  projects!: EntityTable<ProjectRow, 'id'>;
  sources!: EntityTable<SourceRow, 'id'>;
  trackingMeta!: Table<TrackingMetaRow, number>;
  trackingBlocks!: EntityTable<TrackingBlockRow, 'id'>;
  eventLogs!: Table<EventLogRow, number>;
  events!: EntityTable<EventRow, 'id'>;
  footage!: Table<FootageRow, number>;
  anchors!: EntityTable<AnchorRow, 'id'>;
  clockFits!: EntityTable<ClockFitRow, 'id'>;
  corrections!: EntityTable<CorrectionRow, 'id'>;
  audit!: EntityTable<AuditRow, 'id'>;
  pitchRegistrations!: EntityTable<PitchRegistrationRow, 'id'>;
  reels!: EntityTable<ReelRow, 'id'>;
  clips!: EntityTable<ClipRow, 'id'>;
  nonLive!: EntityTable<NonLiveRow, 'id'>;
  exportJobs!: EntityTable<ExportJobRow, 'id'>;
  mappings!: Table<RememberedMappingRow, string>;
  settings!: Table<SettingRow, string>;

  constructor(name: string = DB_NAME) {
    super(name);
    this.version(1).stores(SCHEMA_V1);
    this.version(2)
      .stores(SCHEMA_V2)
      .upgrade(async (tx) => {
        // Rows from version 1 have no corrected copy yet: it starts equal to the log.
        await tx
          .table('events')
          .toCollection()
          .modify((row: Partial<EventRow>) => {
            if (row.current === undefined && row.logged) row.current = structuredClone(row.logged);
          });
      });
    this.version(3).stores(SCHEMA_V3);
  }
}

let shared: WhistlemarkDb | undefined;

/** The one database of this renderer (page or worker). */
export function getDb(): WhistlemarkDb {
  shared ??= new WhistlemarkDb();
  return shared;
}
