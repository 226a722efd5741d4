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
