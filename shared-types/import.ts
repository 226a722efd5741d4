/**
 * What importers detect, what the analyst may correct (the mapping), and what they report.
 * The parsers themselves are pure (engine/import/), fed text chunks by whoever reads the
 * file: a renderer worker streaming from the host, or the CLI streaming from disk.
 */
import type { EventKind, PeriodId, PitchSize, TeamSide } from './domain.ts';

export type Severity = 'error' | 'warning';

/** One problem, located so the analyst can find it: file, row, column, time. */
export interface ImportProblem {
  severity: Severity;
  file: string;
  /** 1-based line in the file (header is line 1 for delimited text). */
  line?: number;
  column?: string;
  /** Source-clock time where that is the clearest locator. */
  time?: string;
  message: string;
  /** What to do about it. */
  hint?: string;
}

export interface ImportProgress {
  bytesRead: number;
  bytesTotal: number;
  rows: number;
  phase: 'reading' | 'normalising' | 'storing' | 'done';
}

export type LengthUnit = 'm' | 'cm' | 'mm' | 'normalised';
export type Origin = 'centre' | 'bottom_left' | 'top_left';

/** Where coordinates in the file live, so they can be brought to centre-origin metres. */
export interface CoordinateMapping {
  unit: LengthUnit;
  origin: Origin;
  /** True when y grows downwards in the file (image-like grids). */
  yDown: boolean;
  /** For grids other than metres or 0..1: the file's extent in its own units (e.g. 0..100 x 0..100). */
  gridLength?: number;
  gridWidth?: number;
  pitch: PitchSize;
}

export type TrackingLayout = 'long' | 'wide' | 'jsonl';

export interface TrackingMapping {
  kind: 'tracking';
  layout: TrackingLayout;
  delimiter?: string;
  columns: {
    frame?: string;
    time?: string;
    period?: string;
    /** Long layout */
    objectId?: string;
    team?: string;
    /** Long layout: shirt number column, when ids do not carry it. */
    shirt?: string;
    x?: string;
    y?: string;
    z?: string;
    /** JSON Lines: the field holding each frame's array of objects (e.g. "objects"). */
    objectList?: string;
    /** Wide layout: per-object column pairs, e.g. { id: 'home_7', x: 'home_7_x', y: 'home_7_y' }. */
    objects?: { id: string; x: string; y: string; team?: TeamSide; role?: 'player' | 'ball' }[];
  };
  /** Object id that is the ball, when there is one. */
  ballId?: string;
  /** Rate in Hz when the file has no usable time column. */
  rate?: number;
  /** How periods are found when there is no period column. */
  periods: { from: 'column' } | { from: 'gap'; minGapS: number } | { from: 'frames'; ranges: [number, number][] };
  coordinates: CoordinateMapping;
}

export type EventClockStyle =
  | 'match_clock_continuing' // MM:SS(.s), second period counting on from 45:00
  | 'match_clock_restarting' // MM:SS(.s), each period from 0:00
  | 'seconds' // seconds since the period's start
  | 'iso8601'; // wall clock; period starts from period_start rows

export interface EventMapping {
  kind: 'events';
  format: 'csv' | 'json';
  delimiter?: string;
  columns: {
    period?: string;
    time: string;
    kind: string;
    team?: string;
    player?: string;
    x?: string;
    y?: string;
    endX?: string;
    endY?: string;
  };
  clock: EventClockStyle;
  /** Period lengths for the continuing match clock (seconds added by earlier periods). */
  periodStartsS?: Record<PeriodId, number>;
  /** File's kind names -> canonical kinds; unknown names map to 'other' with a warning. */
  kindNames: Record<string, EventKind>;
  /** File's team names -> side. */
  teamNames: Record<string, TeamSide>;
  coordinates: CoordinateMapping;
}

export type SourceMapping = TrackingMapping | EventMapping;

/** What `detect` found in the first part of a file, shown on the mapping screen. */
export interface Detection {
  kind: 'tracking' | 'events' | 'unknown';
  /** Why we think so, one short line per clue. */
  clues: string[];
  header: string[];
  preview: string[][];
  mapping?: SourceMapping;
  /** 0..1 */
  confidence: number;
  problems: ImportProblem[];
}

/** A row the importer could not take, kept so the analyst can save them to a file. */
export interface RejectedRow {
  line: number;
  text: string;
  reason: string;
}

/**
 * Result of one import. All-or-nothing: when `ok` is false, `data` is absent and the
 * caller stores nothing. Warnings never block; any error does.
 */
export interface ImportResult<T> {
  ok: boolean;
  data?: T;
  problems: ImportProblem[];
  rejectedRows: RejectedRow[];
  rows: number;
}

export interface ImportOptions<M> {
  fileName: string;
  mapping: M;
  /** Total bytes, for progress. */
  bytesTotal?: number;
  onProgress?: (p: ImportProgress) => void;
  signal?: AbortSignal;
}
