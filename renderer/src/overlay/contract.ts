/**
 * The overlay contract: what a drawn overlay needs (one scene = one tracking instant seen
 * through one view) and the renderer that draws it with pixi.js onto a transparent canvas.
 * The same renderer draws over the live video (Watch screen), into the 2-D pitch view, and
 * offscreen for clip export, so an exported clip shows exactly what the analyst saw.
 *
 *   const r = await createOverlayRenderer({ width: 1920, height: 1080 });   // overlay/renderer.ts
 *   const data = await loadOverlayData(db, projectId);                      // overlay/data.ts
 *   const scene = buildOverlayScene(data, { index: 812, t: 32.48 }, settings, { width: 1920, height: 1080 });
 *   r.draw(scene);  ctx.drawImage(r.canvas, 0, 0);                          // or new VideoFrame(r.canvas)
 *
 * Coordinates: pitch metres, centre origin, x along the length, y across (y up), as in the
 * database. The view turns metres into output pixels: through the frame's homography
 * (footage) or a plain scale (2-D pitch view).
 */
import type { PeriodId, PitchSize } from '../../../shared-types/index.ts';

export type TeamKey = 'home' | 'away';

/** Every overlay layer; each one lives in overlay/layers/<id>.ts. */
export const LAYER_IDS = [
  'dots',
  'ball',
  'trails',
  'offside',
  'backLine',
  'teamLines',
  'distance',
  'hull',
  'extent',
  'space',
] as const;
export type LayerId = (typeof LAYER_IDS)[number];

/** Which layers are on, per team (the ball layer reads `home || away`). */
export type LayerSelection = Record<LayerId, Record<TeamKey, boolean>>;

/** Marker shapes of our own visual language (told apart without colour). */
export type MarkerShape = 'disc' | 'diamond';

export interface TeamStyle {
  /** Fill colour, 0xRRGGBB. */
  colour: number;
  /** Outline colour, 0xRRGGBB (a light/dark contrast pair to the fill). */
  outline: number;
  shape: MarkerShape;
  /** Colour of the shirt number drawn on the marker. */
  label: number;
  name?: string;
}

export interface ScenePlayer {
  /** Tracking object id (e.g. "home_7"). */
  id: string;
  team: TeamKey;
  shirt?: number;
  goalkeeper: boolean;
  x: number;
  y: number;
}

export interface SceneTrail {
  id: string;
  team: TeamKey | 'ball';
  /** Oldest first, x/y pairs in pitch metres (gaps skipped). */
  points: Float32Array;
}

/** How pitch metres become output pixels. */
export type SceneView =
  | {
      kind: 'footage';
      /**
       * Pitch -> footage image homography of the displayed frame (row-major 3x3, 9 numbers),
       * in pixels of the footage at its own size (`imageWidth` x `imageHeight`); the renderer
       * scales to the output size.
       */
      homography: readonly number[];
      imageWidth: number;
      imageHeight: number;
    }
  | {
      kind: 'pitch';
      /** Output pixels kept free round the pitch (for labels). */
      margin: number;
    };

export interface OverlayScene {
  /** Output size in pixels (the canvas size). */
  width: number;
  height: number;
  pitch: PitchSize;
  view: SceneView;
  /** The tracking instant shown; undefined when the footage shows no tracked moment. */
  moment?: { period: PeriodId; t: number };
  /**
   * False during non-live footage (replays, half-time, lead-in, or no fit/registration):
   * a footage view then draws only a quiet indicator, never positions.
   */
  live: boolean;
  /** Short reason shown by the indicator when not live, e.g. "Replay". */
  notLiveReason?: string;
  players: ScenePlayer[];
  ball?: { x: number; y: number; z?: number };
  trails: SceneTrail[];
  teams: Record<TeamKey, TeamStyle>;
  layers: LayerSelection;
  /** Which way the home team attacks at this moment (offside and back lines need it). */
  homeAttacks: 'positive_x' | 'negative_x';
  /** The two players whose distance the `distance` layer labels (object ids). */
  distancePair?: [string, string];
  /** Number of team lines for the `teamLines` layer (Jenks classes), default 3. */
  teamLineCount?: number;
  /**
   * Pitch markings as polylines (flat x,y pairs in metres). Always drawn in the pitch view;
   * in the footage view only when `showMarkings` (registration check).
   */
  markings?: Float32Array[];
  showMarkings?: boolean;
}

export interface OverlayRendererOptions {
  width: number;
  height: number;
  /** Draw into this canvas (otherwise one is made; put it over the video or keep it offscreen). */
  canvas?: HTMLCanvasElement | OffscreenCanvas;
  /** Keep the drawing buffer for reading back after the frame (export); default false. */
  preserveDrawingBuffer?: boolean;
  /** Default 1: device pixels per output pixel. */
  resolution?: number;
  /**
   * Which pixi renderer (measured in bench/overlay.bench.ts). Default 'auto': WebGL with a
   * GPU, the canvas renderer when WebGL is a software rasteriser (much faster there).
   */
  prefer?: 'webgl' | 'canvas' | 'auto';
}

export interface OverlayRenderer {
  /** Draws the scene now (synchronous); the canvas holds the picture until the next draw. */
  draw(scene: OverlayScene): void;
  /** Changes the output size. */
  resize(width: number, height: number): void;
  readonly canvas: HTMLCanvasElement | OffscreenCanvas;
  /** 'webgl' normally; 'canvas' where WebGL is not available. Never WebGPU. */
  readonly backend: 'webgl' | 'canvas';
  destroy(): void;
}

/** Signature of overlay/renderer.ts `createOverlayRenderer`. */
export type CreateOverlayRenderer = (options: OverlayRendererOptions) => Promise<OverlayRenderer>;

/** Analyst choices that shape a scene (kept in db.settings under `overlay:<projectId>`). */
export interface OverlaySettings {
  teams: Record<TeamKey, TeamStyle>;
  layers: LayerSelection;
  /** Seconds of trail behind each object. */
  trailSeconds: number;
  distancePair?: [string, string];
  teamLineCount?: number;
}

// ---------------------------------------------------------------------------------------
// Data a scene is built from (overlay/data.ts loads it; overlay/scene.ts builds scenes)

/** One landmark clicked on a keyframe: where it is on the pitch and where it was clicked. */
export interface LandmarkPair {
  /** Stable landmark id from the pitch model (engine/geometry/pitch-model.ts). */
  landmarkId: string;
  /** Pitch metres (centre origin). */
  x: number;
  y: number;
  /** Footage image pixels at the footage's own size (u right, v down). */
  u: number;
  v: number;
}

export interface RegistrationKeyframe {
  /** Footage frame index (probe pts table order) and its footage seconds. */
  frame: number;
  t: number;
  pairs: LandmarkPair[];
  /** Pitch -> image homography solved from the pairs (row-major 9 numbers). */
  homography: number[];
  /** Per pair, reprojection error in image pixels (same order as pairs). */
  errors: number[];
}

/** `PitchRegistrationRow.data`: keyframes in frame order. */
export interface RegistrationData {
  schema: 'whistlemark-registration/1';
  imageWidth: number;
  imageHeight: number;
  keyframes: RegistrationKeyframe[];
}

export interface OverlayData {
  pitch: PitchSize;
  /** Tracking: nominal rate, objects and the periods (frame-major, see TrackingPeriod). */
  rate: number;
  objects: import('../../../shared-types/index.ts').TrackedObject[];
  ballIndex: number;
  periods: import('../../../shared-types/index.ts').TrackingPeriod[];
  /** Newest footage clock fit (footage -> tracking); undefined until the Sync screen made one. */
  fit?: import('../../../shared-types/index.ts').ClockFit;
  registration?: RegistrationData;
  /** Confirmed non-live intervals, footage seconds [fromT, toT). */
  nonLive: { fromT: number; toT: number; kind: string }[];
  footage: { width: number; height: number };
}

/** Signature of overlay/scene.ts `buildOverlayScene`. */
export type BuildOverlayScene = (
  data: OverlayData,
  frame: { index: number; t: number },
  settings: OverlaySettings,
  output: { width: number; height: number; view?: 'footage' | 'pitch'; margin?: number },
) => OverlayScene;
