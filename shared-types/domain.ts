/**
 * Domain types shared by engine/, electron/ and renderer/. Plain data only: no classes,
 * no DOM or Node types, so every side (worker, main process, CLI) can pass them around.
 *
 * Canonical forms (see ../shared/DESIGN.md "Clocks and coordinates"):
 * - pitch coordinates in metres, origin at the centre mark, x along the length, y across,
 *   right-handed (y up when x points right);
 * - tracking time: seconds = (frame - period's first frame) / nominal rate, per period;
 * - event time: period + seconds since that period's start, as logged;
 * - footage time: seconds of presentation time from the first frame of the file.
 */

export type Seconds = number;
/** 1 and 2 for the halves; 3 and 4 for extra time. */
export type PeriodId = number;
export type TeamSide = 'home' | 'away';
export type SourceKind = 'tracking' | 'events' | 'footage';

export const EVENT_KINDS = [
  'kick_off',
  'pass',
  'shot',
  'goal',
  'goal_kick',
  'corner',
  'throw_in',
  'free_kick',
  'penalty',
  'period_start',
  'period_end',
  'other',
] as const;
export type EventKind = (typeof EVENT_KINDS)[number];

/** Restarts: the ball is dead, placed, stationary, then played (Laws 8, 13–17). */
export const RESTART_KINDS = ['kick_off', 'goal_kick', 'corner', 'throw_in', 'free_kick', 'penalty'] as const;
export type RestartKind = (typeof RESTART_KINDS)[number];
export const isRestartKind = (k: string): k is RestartKind => (RESTART_KINDS as readonly string[]).includes(k);

/** Field size in metres. The demo uses 105 x 68. */
export interface PitchSize {
  length: number;
  width: number;
}
export const DEFAULT_PITCH: PitchSize = { length: 105, width: 68 };

// ---------------------------------------------------------------------------------------
// Tracking

export type ObjectRole = 'player' | 'ball' | 'official';

export interface TrackedObject {
  /** Identifier as in the source file (column prefix or object id). */
  id: string;
  role: ObjectRole;
  team?: TeamSide;
  shirt?: number;
  name?: string;
}

/**
 * One period of tracking, frame-major typed arrays: value for object o at frame f is at
 * index f * objects.length + o. Missing values are NaN. Frames are consecutive at the
 * nominal rate from firstFrame; a frame missing in the file is a row of NaN with
 * present[f] = 0.
 */
export interface TrackingPeriod {
  period: PeriodId;
  /** Frame number of the first frame, as numbered in the source file. */
  firstFrame: number;
  frameCount: number;
  /** 1 where the file had the frame, 0 where it was missing. */
  present: Uint8Array;
  x: Float32Array;
  y: Float32Array;
  /** Ball height in metres where the source gives it; otherwise absent. */
  ballZ?: Float32Array;
  /** Which way the home team attacks in this period. */
  homeAttacks: 'positive_x' | 'negative_x';
}

export interface TrackingData {
  /** Nominal frame rate in Hz (25 common, 10 for some providers). */
  rate: number;
  pitch: PitchSize;
  objects: TrackedObject[];
  /** Index into objects of the ball, or -1 when the source has no ball. */
  ballIndex: number;
  periods: TrackingPeriod[];
}

// ---------------------------------------------------------------------------------------
// Event log

export interface MatchEvent {
  /** Stable id within the source: `e<row>`. */
  id: string;
  /** 1-based data row in the source file (header not counted). */
  row: number;
  period: PeriodId;
  /** Seconds since the period's start, as logged (event clock). */
  t: Seconds;
  kind: EventKind;
  /** The kind as written in the file, before mapping. */
  rawKind: string;
  team?: TeamSide;
  /** Player label as in the log (shirt number or id). */
  player?: string;
  /** Pitch metres, centre origin, same orientation as tracking. */
  x?: number;
  y?: number;
  endX?: number;
  endY?: number;
  /** Original columns, for writing the file back with corrections beside it. */
  raw: Record<string, string>;
}

export interface EventLog {
  pitch: PitchSize;
  /** Team names as written in the log, keyed by side. */
  teams: Partial<Record<TeamSide, string>>;
  columns: string[];
  events: MatchEvent[];
}

// ---------------------------------------------------------------------------------------
// Footage

export interface FootageProbe {
  container: string;
  videoCodec: string;
  audioCodec?: string;
  width: number;
  height: number;
  /** Presentation time of the first frame in the container's clock (PTS minus nothing). */
  startTime: Seconds;
  duration: Seconds;
  nominalFps: number;
  measuredFps: number;
  variableRate: boolean;
  frameCount: number;
  /** Footage time of every frame in presentation order: PTS minus the first frame's PTS. */
  pts: number[];
  /** Indices into pts of keyframes. */
  keyframes: number[];
  hasAudio: boolean;
  audioSampleRate?: number;
  audioChannels?: number;
}

// ---------------------------------------------------------------------------------------
// Anchors, clock fits, corrections

/** 'touch': an open-play ball touch (a pass placed in tracking by refinement), used as a clock point. */
export type AnchorKind = RestartKind | 'period_start' | 'period_end' | 'whistle' | 'cut' | 'touch';

export interface Anchor {
  id: string;
  source: SourceKind;
  kind: AnchorKind;
  period: PeriodId;
  /** Time in the source's own clock (tracking, event or footage seconds). */
  t: Seconds;
  /** Place in pitch metres where known. */
  x?: number;
  y?: number;
  /** 0..1 */
  confidence: number;
  /** Short human-readable note: why it was detected. */
  note?: string;
  /** For event anchors: the event id it came from. */
  eventId?: string;
  /** Tracking restart anchors: tracking time the ball came to rest at the spot (before t, the kick). */
  stillFromT?: Seconds;
}

/** One anchor pairing used in a fit: source time t maps to reference (tracking) time tRef. */
export interface FitPoint {
  anchorId: string;
  refAnchorId?: string;
  kind: AnchorKind;
  t: Seconds;
  tRef: Seconds;
  residual: Seconds;
  used: boolean;
  /** Why a point was rejected (MAD outlier, excluded by the analyst, ...). */
  rejectedBecause?: string;
}

/** `t_ref = offset + rate * t` on [fromT, toT] of the source clock. */
export interface ClockSegment {
  period: PeriodId;
  fromT: Seconds;
  toT: Seconds;
  offset: Seconds;
  rate: number;
  driftPpm: number;
  offsetSe: Seconds;
  rateSe: number;
  rmsResidual: Seconds;
  /** Largest change of the offset when any one used point is left out. */
  leaveOneOutMax: Seconds;
  points: FitPoint[];
}

export interface ClockFit {
  source: Exclude<SourceKind, 'tracking'>;
  /** The reference clock is always tracking. */
  segments: ClockSegment[];
  method: 'huber' | 'theil-sen';
}

export type ChangeKind = 'none' | 'time' | 'location' | 'time+location';
export type CorrectionStatus = 'proposed' | 'accepted' | 'rejected' | 'edited';

export interface ProposedCorrection {
  eventId: string;
  /** Tracking period and time the event was placed at (after the clock fit). */
  trackingPeriod: PeriodId;
  trackingTime: Seconds;
  /** Frame number as numbered in the tracking file. */
  trackingFrame: number;
  /** The logged time mapped through the clock fit, before refinement. */
  predictedTime: Seconds;
  x?: number;
  y?: number;
  change: ChangeKind;
  /** 0..1 */
  confidence: number;
  /** For a person: "ball left N07 1.3 s after the logged time". */
  reason: string;
  placed: boolean;
}
