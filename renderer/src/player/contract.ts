/**
 * What every screen may rely on from the footage player (renderer/src/player/).
 * The player owns the <video> element; the frame it reports is the frame actually on
 * screen (requestVideoFrameCallback's mediaTime matched against the probed PTS table).
 */
export interface DisplayedFrame {
  /** Index into the probe's pts table (presentation order). */
  index: number;
  /** Footage seconds of that frame (PTS minus the first frame's PTS). */
  t: number;
}

export interface PlayerControl {
  /** The frame on screen now (undefined before the first frame shows). */
  readonly current: DisplayedFrame | undefined;
  readonly playing: boolean;
  play(): void;
  pause(): void;
  /** Shows exactly frame `index`; resolves once it is on screen. */
  seekToFrame(index: number): Promise<DisplayedFrame>;
  /** Shows the frame displayed at footage time t (the last frame starting at or before t). */
  seekToTime(t: number): Promise<DisplayedFrame>;
  step(frames: number): Promise<DisplayedFrame>;
  /** 1 = normal; negative = backwards shuttle. */
  setRate(rate: number): void;
  /** Called once per displayed frame (playing or after a seek); returns an unsubscribe. */
  onFrame(listener: (f: DisplayedFrame) => void): () => void;
  /** The video element, for drawing overlays over it (do not seek it directly). */
  readonly video: HTMLVideoElement | null;
}
