/**
 * The one door between the renderer and the machine. Electron answers it over IPC
 * (electron/preload.ts + electron/main.ts); browser mode answers the same calls over
 * loopback HTTP (electron/serve.ts). All behaviour lives in electron/host/.
 *
 * Files are never addressed by path from the renderer after they are opened: the host
 * hands out an opaque `fileId` per file the analyst chose, and serves only those.
 */
import type { FootageProbe } from './domain.ts';

export type HostMode = 'electron' | 'browser';

export interface HostInfo {
  mode: HostMode;
  appVersion: string;
  /** Local user name, written into the audit trail. */
  userName: string;
  /** True when the host can show the system's own open/save dialogs (Electron). */
  nativeDialogs: boolean;
  /** Whether the page is cross-origin isolated (needed by the multi-thread ffmpeg core). */
  crossOriginIsolated?: boolean;
  /** A native ffmpeg is on PATH: clip export can take the faster native path (nativeClip* calls). */
  nativeFfmpeg?: boolean;
}

/** A file the analyst opened; the host serves its bytes at `url` (byte ranges supported). */
export interface OpenedFile {
  fileId: string;
  name: string;
  /** Absolute path on the analyst's machine, shown to them and kept for relinking. */
  path: string;
  size: number;
  /** Modification time, ms since the epoch. */
  mtimeMs: number;
  /** URL the renderer fetches or plays: wmfile://... in Electron, /files/... in browser mode. */
  url: string;
}

export interface DirectoryEntry {
  name: string;
  path: string;
  kind: 'file' | 'directory';
  size?: number;
}

export interface DirectoryListing {
  path: string;
  parent?: string;
  entries: DirectoryEntry[];
}

/**
 * What the player plays for an opened footage file: the file itself, or (MPEG-TS, which
 * Chromium cannot open) an MP4 copy with the same frames made without re-encoding.
 */
export interface PlayableFootage extends OpenedFile {
  remuxed: boolean;
  /** Media time of the first frame in the played file (footage time 0), when known. */
  mediaOffset?: number;
}

export type FilePurpose = 'tracking' | 'events' | 'footage' | 'mapping' | 'project' | 'any';

export interface DemoMatch {
  title: string;
  tracking: OpenedFile;
  events: OpenedFile;
  footage: OpenedFile[];
  /** The truth file, so the analyst can compare (README says how to view it). */
  truth?: OpenedFile;
}

export interface SaveRequest {
  /** Suggested file name, e.g. "rejected-rows.csv". */
  suggestedName: string;
  /** Directory to write into; when absent the host asks (Electron) or uses the last one. */
  directory?: string;
  bytes: Uint8Array;
  /** Replace an existing file; without it the host refuses and says so. */
  overwrite?: boolean;
}

export interface SaveResult {
  path: string;
  bytesWritten: number;
}

/**
 * One clip for the native export path: the host's ffmpeg decodes and encodes the footage
 * span, and lays over it the overlay frames the renderer sends (run-encoded,
 * engine/overlay-frames/runs.ts): `cardFrames` title-card frames first, then one per clip frame.
 */
export interface NativeClipStart {
  fileId: string;
  /** Footage seconds of the in-frame (its PTS). */
  inT: number;
  /** Clip frames (out-frame − in-frame), not counting the card. */
  frames: number;
  fps: number;
  width: number;
  height: number;
  cardFrames?: number;
  /** false: no overlay frames follow (plain re-encode). */
  overlay: boolean;
  directory: string;
  name: string;
  overwrite?: boolean;
}

export interface NativeClipProgress {
  sessionId: string;
  /** Pictures the encoder has written so far, of `totalFrames` (card included). */
  encodedFrames: number;
  totalFrames: number;
}

export interface HostApi {
  info(): Promise<HostInfo>;
  /** Native dialog (Electron only). Resolves to [] when the analyst cancels. */
  chooseFiles(purpose: FilePurpose, multiple: boolean): Promise<OpenedFile[]>;
  /** In-app file chooser (browser mode): list a directory. */
  listDirectory(path?: string): Promise<DirectoryListing>;
  /** In-app file chooser (browser mode): the analyst picked these paths. */
  openPaths(paths: string[]): Promise<OpenedFile[]>;
  /** The demo match shipped in fixtures/demo, already opened. */
  demoMatch(): Promise<DemoMatch | null>;
  /** Container, codecs and the real per-frame PTS table of an opened footage file. */
  probeFootage(fileId: string): Promise<FootageProbe>;
  /** The file the <video> element should play for an opened footage file (see PlayableFootage). */
  playableFootage(fileId: string): Promise<PlayableFootage>;
  /** Atomic write (temporary file, flush, rename); never overwrites without `overwrite`. */
  saveFile(req: SaveRequest): Promise<SaveResult>;
  /** Starts a native clip export (see NativeClipStart); fails when info().nativeFfmpeg is false. */
  nativeClipStart(req: NativeClipStart): Promise<NativeClipProgress>;
  /** Hands over a batch of overlay frames; resolves when the host has room for more. */
  nativeClipFrames(sessionId: string, batch: Uint8Array): Promise<NativeClipProgress>;
  /** All frames sent: waits for the encoder and gives the file its name (never overwriting unasked). */
  nativeClipFinish(sessionId: string): Promise<SaveResult>;
  /** Stops the export; nothing is left in the folder. */
  nativeClipCancel(sessionId: string): Promise<void>;
}

/** Names of the HostApi calls, used by both adapters to route and validate. */
export const HOST_CALLS = [
  'info',
  'chooseFiles',
  'listDirectory',
  'openPaths',
  'demoMatch',
  'probeFootage',
  'playableFootage',
  'saveFile',
  'nativeClipStart',
  'nativeClipFrames',
  'nativeClipFinish',
  'nativeClipCancel',
] as const satisfies readonly (keyof HostApi)[];
export type HostCall = (typeof HOST_CALLS)[number];
