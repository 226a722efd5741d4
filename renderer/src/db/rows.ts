/**
 * Row shapes of the project database. Each table stores plain data (typed arrays included),
 * so a row read back is the same value that was written.
 */
import type {
  Anchor,
  ClockFit,
  CorrectionStatus,
  EventKind,
  FootageProbe,
  ImportProblem,
  MatchEvent,
  PeriodId,
  PitchSize,
  ProposedCorrection,
  SourceKind,
  SourceMapping,
  TeamSide,
  TrackedObject,
} from '../../../shared-types/index.ts';

export interface ProjectRow {
  id?: number;
  title: string;
  createdAt: number;
  updatedAt: number;
  /** True for the invented demo match created on first start. */
  demo?: boolean;
}

export interface PeriodSummary {
  period: PeriodId;
  /** Source-clock seconds of the first and last moment of the period. */
  start: number;
  end: number;
  frames?: number;
  missingFrames?: number;
  events?: number;
  /** Tracking: which way the home team attacks in this period. */
  homeAttacks?: 'positive_x' | 'negative_x';
}

/** What the Sources screen shows about one source, computed once at import. */
export interface SourceSummary {
  duration: number;
  /** Hz: tracking rate or footage frame rate. */
  rate?: number;
  frames?: number;
  objects?: number;
  players?: { home: number; away: number; unknown: number };
  hasBall?: boolean;
  eventCount?: number;
  eventsByKind?: Partial<Record<EventKind, number>>;
  teams?: Partial<Record<TeamSide, string>>;
  periods: PeriodSummary[];
  footage?: {
    container: string;
    videoCodec: string;
    audioCodec?: string;
    width: number;
    height: number;
    nominalFps: number;
    measuredFps: number;
    variableRate: boolean;
    frameCount: number;
    startTime: number;
  };
  rows?: number;
  rejectedRows?: number;
}

export interface SourceRow {
  id?: number;
  projectId: number;
  kind: SourceKind;
  fileName: string;
  path: string;
  size: number;
  mtimeMs: number;
  /** The mapping the import used (absent for footage). */
  mapping?: SourceMapping;
  /** What detection proposed before the analyst's edits, kept to see what was changed. */
  detected?: { mapping?: SourceMapping; confidence: number; clues: string[] };
  headerSignature?: string;
  summary: SourceSummary;
  /** Warnings the import reported (errors never get stored: such an import is refused). */
  warnings: ImportProblem[];
  importedAt: number;
}

/** Per-period layout of the stored tracking blocks. */
export interface TrackingPeriodMeta {
  period: PeriodId;
  firstFrame: number;
  frameCount: number;
  homeAttacks: 'positive_x' | 'negative_x';
  framesPerBlock: number;
  blockCount: number;
  hasBallZ: boolean;
}

export interface TrackingMetaRow {
  sourceId: number;
  rate: number;
  pitch: PitchSize;
  objects: TrackedObject[];
  ballIndex: number;
  periods: TrackingPeriodMeta[];
}

/** One time block of one period, frame-major like TrackingPeriod. */
export interface TrackingBlockRow {
  id?: number;
  sourceId: number;
  period: PeriodId;
  block: number;
  /** Index of the block's first frame within its period (0-based). */
  offset: number;
  frameCount: number;
  present: Uint8Array;
  x: Float32Array;
  y: Float32Array;
  ballZ?: Float32Array;
}

export interface EventLogRow {
  sourceId: number;
  pitch: PitchSize;
  teams: Partial<Record<TeamSide, string>>;
  columns: string[];
}

export interface EventRow {
  id?: number;
  sourceId: number;
  projectId: number;
  eventId: string;
  row: number;
  period: PeriodId;
  kind: EventKind;
  /** Exactly as imported; never changed afterwards. */
  logged: MatchEvent;
  /** As currently corrected (starts as a copy of logged). */
  current: MatchEvent;
}

export interface FootageRow {
  sourceId: number;
  probe: FootageProbe;
}

export interface AnchorRow {
  id?: number;
  projectId: number;
  sourceId: number;
  anchor: Anchor;
  /** Who made it: a detector, the analyst's key press, or an accepted proposal. */
  origin?: 'detected' | 'analyst' | 'accepted';
  /** Footage anchors: the row id of the tracking anchor it is paired with in the fit. */
  pairedWith?: number;
  /** Footage anchors: the paired tracking anchor's own id (Anchor.id), which survives a re-run of the analysis that renews the row ids. */
  pairedAnchorId?: string;
  /** Left out of the fit by the analyst (still shown). */
  excluded?: boolean;
}

export interface ClockFitRow {
  id?: number;
  projectId: number;
  sourceId: number;
  fit: ClockFit;
  createdAt: number;
}

export interface CorrectionRow {
  id?: number;
  projectId: number;
  sourceId: number;
  eventId: string;
  status: CorrectionStatus;
  proposal: ProposedCorrection;
  edited?: { period: PeriodId; t: number; x?: number; y?: number };
  updatedAt: number;
}

export interface AuditRow {
  id?: number;
  projectId: number;
  at: number;
  user: string;
  /** Short description of the change, e.g. "import tracking tracking.csv". */
  what: string;
  before?: unknown;
  after?: unknown;
  /** What kind of object changed (shown and filtered in the audit view). */
  subject?: AuditSubject;
  /** Undoable changes carry the rows they touched (see renderer/src/history/). */
  changes?: RowChange[];
  /** 'done' until undone; 'undone' can be redone; 'dropped' once a new change replaced the redo. */
  state?: 'done' | 'undone' | 'dropped';
  /** Order of undo: the moment it was last done or undone (ms, made unique). */
  stamp?: number;
}

export type AuditSubject = 'project' | 'source' | 'event' | 'correction' | 'anchor' | 'fit' | 'nonLive' | 'registration' | 'reel' | 'clip' | 'undo';

/** Tables whose rows the undo history may write. */
export type HistoryTable = 'events' | 'corrections' | 'anchors' | 'clockFits' | 'nonLive' | 'pitchRegistrations' | 'reels' | 'clips';

/** One row before and after a change; absent means the row did not exist. */
export interface RowChange {
  table: HistoryTable;
  key: number;
  before?: unknown;
  after?: unknown;
}

/** A stretch of footage that does not show live play (replay, graphics, half-time, lead-in). */
export interface NonLiveRow {
  id?: number;
  projectId: number;
  footageSourceId: number;
  /** Footage seconds, [fromT, toT). */
  fromT: number;
  toT: number;
  kind: 'replay' | 'graphics' | 'half_time' | 'lead_in' | 'other';
  /** Proposed from cut candidates until the analyst confirms it. */
  status: 'proposed' | 'confirmed';
  note?: string;
}

/** A queued or finished export (survives a restart so the queue can resume). */
export interface ExportJobRow {
  id?: number;
  projectId: number;
  reelId: number;
  /** Clip ids in order; empty = the whole reel as one file. */
  clipIds: number[];
  state: 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
  /** Where the analyst chose to write. */
  directory: string;
  path: 'embedded' | 'native';
  /** 0..1 */
  progress: number;
  outputs: string[];
  message?: string;
  /** The analyst agreed to replace files of the same names. */
  overwrite?: boolean;
  /** Seconds of title card before each clip (export-clips/title-card.ts); absent or 0: none. */
  titleCardS?: number;
  /** The host's native export session of the clip being encoded (stopped if a restart cuts it off). */
  nativeSession?: string;
  createdAt: number;
  updatedAt: number;
}

export interface PitchRegistrationRow {
  id?: number;
  projectId: number;
  footageSourceId: number;
  /** Landmark pairs and homographies per keyframe; shape owned by the overlay work. */
  data: unknown;
  updatedAt: number;
}

export interface ReelRow {
  id?: number;
  projectId: number;
  title: string;
  createdAt: number;
}

export interface ClipRow {
  id?: number;
  projectId: number;
  reelId: number;
  order: number;
  /** Tracking-clock period and seconds. */
  period: PeriodId;
  from: number;
  to: number;
  note?: string;
  /** Shown on the title card and in the sidecars. */
  title?: string;
  /** Overlay layers burned into this clip (ids of overlay/contract.ts LAYER_IDS, both teams). */
  layers?: string[];
  /** Seconds added before the first and after the last event the clip was built from. */
  preRoll?: number;
  postRoll?: number;
  /** Event ids (MatchEvent.id) the clip was built from; empty for in/out points. */
  eventIds?: string[];
}

/** A mapping the analyst confirmed, offered again for a file with the same header. */
export interface RememberedMappingRow {
  signature: string;
  kind: 'tracking' | 'events';
  mapping: SourceMapping;
  fileName: string;
  savedAt: number;
}

export interface SettingRow {
  key: string;
  value: unknown;
}
