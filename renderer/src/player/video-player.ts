/**
 * createVideoPlayer(video, probe) -> FootagePlayerControl: the PlayerControl contract over
 * one <video> element.
 *
 * The frame reported is the frame on screen: every requestVideoFrameCallback's mediaTime
 * is matched against the probed PTS table (frame-table.ts). Seeking to frame i asks for the
 * middle of its display interval, then checks the frame that actually appeared; if the
 * decoder showed a neighbour it tries once more at the frame's own start and otherwise
 * reports the mismatch (`problem`) instead of pretending.
 *
 * Chromium keeps container timestamps: media time = footage time + the first frame's PTS
 * (0 for an MP4 with an edit list, the B-frame delay for one without, 7 ms for some
 * Matroska files). The offset is learned from the first frame shown after loading.
 *
 * Backward shuttle is done by seeking frame after frame (the element refuses negative
 * rates); forward shuttle uses playbackRate.
 */
import type { FootageProbe } from '../../../shared-types/index.ts';
import type { DisplayedFrame, PlayerControl } from './contract.ts';
import { clampFrame, frameOfMediaTime, frameShownAt, mediaOffsetFrom, seekTargetOf } from './frame-table.ts';

export interface ShownFrame extends DisplayedFrame {
  /** The decoder's mediaTime equals the table's PTS for this frame. */
  exact: boolean;
}

export interface FootagePlayerControl extends PlayerControl {
  readonly current: ShownFrame | undefined;
  /** Shuttle rate: 0 paused, 1 normal, negative backwards. */
  readonly rate: number;
  readonly frameCount: number;
  /** Media time minus footage time, as learned from the element. */
  readonly mediaOffset: number;
  /** The last disagreement between the PTS table and the decoder, if any. */
  readonly problem: string | undefined;
  /** Resolves once the first frame is on screen and the media offset is known. */
  readonly ready: Promise<ShownFrame>;
  togglePlay(): void;
  /** Moves by seconds of footage time from the frame on screen. */
  jump(seconds: number): Promise<DisplayedFrame>;
  /** One shuttle step faster in a direction (1 forward, -1 backward), as J/L do. */
  shuttle(direction: 1 | -1): void;
  /** Called when playing, rate or problem change (not per frame). */
  onState(listener: () => void): () => void;
  destroy(): void;
}

/** Shuttle speeds, slowest first (×normal). */
export const SHUTTLE_SPEEDS = [1, 2, 4, 8] as const;
/** Chromium plays at most 16×; beyond 8× the decoder drops most frames anyway. */
const MAX_RATE = 8;
/** How long to wait for a presented frame after `seeked` before taking the one on screen (robustness, not a test). */
const FRAME_GRACE_MS = 400;

export function createVideoPlayer(video: HTMLVideoElement, probe: Pick<FootageProbe, 'pts' | 'startTime' | 'nominalFps'>, opts: { mediaOffset?: number } = {}): FootagePlayerControl {
  const pts = probe.pts;
  const fps = probe.nominalFps;
  if (pts.length === 0) throw new Error('the footage has no frames to show');
  let mediaOffset = opts.mediaOffset ?? probe.startTime;
  let current: ShownFrame | undefined;
  let problem: string | undefined;
  let rate = 0;
  let wantedRate = 1;
  let destroyed = false;
  const frameListeners = new Set<(f: DisplayedFrame) => void>();
  const stateListeners = new Set<() => void>();
  let frameWaiters: ((f: ShownFrame) => void)[] = [];
  const emitState = () => stateListeners.forEach((l) => l());

  let handle = 0;
  let lastMediaTime: number | undefined;
  const onVideoFrame = (_now: number, meta: VideoFrameCallbackMetadata) => {
    if (destroyed) return;
    lastMediaTime = meta.mediaTime;
    const m = frameOfMediaTime(pts, meta.mediaTime, mediaOffset);
    current = { index: m.index, t: pts[m.index], exact: m.exact };
    const waiters = frameWaiters;
    frameWaiters = [];
    waiters.forEach((w) => w(current!));
    frameListeners.forEach((l) => l(current!));
    handle = video.requestVideoFrameCallback(onVideoFrame);
  };
  handle = video.requestVideoFrameCallback(onVideoFrame);

  const nextFrame = () => new Promise<ShownFrame>((resolve) => frameWaiters.push(resolve));

  /** Sets currentTime and resolves with the frame that appears. */
  const seekMedia = (mediaTime: number): Promise<ShownFrame> => {
    const shown = nextFrame();
    return new Promise<ShownFrame>((resolve) => {
      let timer: ReturnType<typeof setTimeout> | undefined;
      const onSeeked = () => {
        // A seek that lands on the frame already shown may present nothing new.
        timer = setTimeout(() => current && resolve(current), FRAME_GRACE_MS);
      };
      video.addEventListener('seeked', onSeeked, { once: true });
      void shown.then((f) => {
        clearTimeout(timer);
        video.removeEventListener('seeked', onSeeked);
        resolve(f);
      });
      video.currentTime = Math.max(0, mediaTime);
    });
  };

  // --- ready: first frame on screen, offset learned ------------------------------------
  const ready = new Promise<ShownFrame>((resolve, reject) => {
    const start = async () => {
      video.removeEventListener('loadeddata', start);
      // Time 0 shows the element's first frame, which is the table's frame 0: its raw
      // media time says where footage time 0 sits on the element's clock.
      await seekMedia(0);
      if (destroyed) return;
      if (lastMediaTime === undefined) return reject(new Error('the footage shows no frame'));
      mediaOffset = mediaOffsetFrom(pts, lastMediaTime, mediaOffset);
      const m = frameOfMediaTime(pts, lastMediaTime, mediaOffset);
      current = { index: m.index, t: pts[m.index], exact: m.exact };
      frameListeners.forEach((l) => l(current!));
      resolve(current);
    };
    const fail = () => reject(new Error(video.error?.message || 'the footage could not be played'));
    if (video.readyState >= 2) void start();
    else video.addEventListener('loadeddata', start);
    video.addEventListener('error', fail, { once: true });
  });
  ready.catch(() => undefined);

  // --- seeking: the newest wish wins; every caller learns the frame finally shown -------
  let wanted = 0;
  let running: Promise<ShownFrame> | undefined;
  const runSeeks = async (): Promise<ShownFrame> => {
    await ready.catch(() => undefined);
    for (;;) {
      const i = wanted;
      if (current && current.index === i && current.exact && !video.seeking) {
        if (wanted === i) {
          running = undefined;
          return current;
        }
        continue;
      }
      let shown = await seekMedia(mediaOffset + seekTargetOf(pts, i, fps));
      if (wanted !== i) continue;
      if (shown.index !== i) {
        // The decoder's rounding put a neighbour up: ask for the frame's own start (+1 ms).
        shown = await seekMedia(mediaOffset + pts[i] + 0.001);
        if (wanted !== i) continue;
      }
      const before = problem;
      problem = shown.index === i && shown.exact ? undefined : `asked for frame ${i} (${pts[i].toFixed(6)} s) but the decoder shows frame ${shown.index}${shown.exact ? '' : ' at a time the frame table does not have'}`;
      if (problem !== before) emitState();
      running = undefined;
      return shown;
    }
  };
  const seekInternal = (index: number): Promise<ShownFrame> => {
    wanted = clampFrame(pts, index);
    running ??= runSeeks();
    return running;
  };

  // --- shuttle ---------------------------------------------------------------------------
  let reverseToken = 0;
  const runReverse = async (token: number) => {
    let base = current ?? (await ready);
    let t0 = performance.now();
    let speed = rate;
    while (token === reverseToken && !destroyed) {
      if (speed !== rate) {
        base = current ?? base;
        t0 = performance.now();
        speed = rate;
      }
      const target = base.t + (speed * (performance.now() - t0)) / 1000;
      const i = frameShownAt(pts, target);
      if (i === 0 && target <= pts[0]) {
        await seekInternal(0);
        stopMotion();
        return;
      }
      if (i !== current?.index) await seekInternal(i);
      else await new Promise((r) => requestAnimationFrame(r));
    }
  };
  const stopMotion = () => {
    reverseToken++;
    const was = rate;
    rate = 0;
    if (!video.paused) video.pause();
    if (was !== 0) emitState();
  };
  const startMotion = (r: number) => {
    reverseToken++;
    rate = r;
    if (r > 0) {
      video.playbackRate = r;
      if (video.paused) {
        video.play().catch((e: Error) => {
          // Autoplay rules can refuse sound: play muted rather than not at all.
          if (e.name === 'NotAllowedError' && !video.muted) {
            video.muted = true;
            video.play().catch(() => stopMotion());
          } else stopMotion();
        });
      }
    } else {
      if (!video.paused) video.pause();
      void runReverse(reverseToken);
    }
    emitState();
  };
  // After a pause, park the element in the middle of the frame on screen, so a step from
  // here is a step from what the analyst sees.
  const onPause = () => {
    if (rate > 0) {
      rate = 0;
      emitState();
    }
    if (current && !destroyed) void seekInternal(current.index);
  };
  const onEnded = () => stopMotion();
  video.addEventListener('pause', onPause);
  video.addEventListener('ended', onEnded);

  const control: FootagePlayerControl = {
    get current() {
      return current;
    },
    get playing() {
      return rate !== 0;
    },
    get rate() {
      return rate;
    },
    get frameCount() {
      return pts.length;
    },
    get mediaOffset() {
      return mediaOffset;
    },
    get problem() {
      return problem;
    },
    ready,
    video,
    play: () => startMotion(wantedRate),
    pause: () => stopMotion(),
    togglePlay: () => (rate !== 0 ? stopMotion() : startMotion(wantedRate === 0 ? 1 : wantedRate)),
    seekToFrame: (index) => {
      stopMotion();
      return seekInternal(index);
    },
    seekToTime: (t) => {
      stopMotion();
      return seekInternal(frameShownAt(pts, t));
    },
    step: (frames) => {
      stopMotion();
      return seekInternal((running ? wanted : (current?.index ?? 0)) + frames);
    },
    jump: (seconds) => {
      stopMotion();
      const from = running ? pts[wanted] : (current?.t ?? 0);
      return seekInternal(frameShownAt(pts, from + seconds));
    },
    setRate: (r) => {
      if (!Number.isFinite(r)) return;
      const clamped = Math.max(-MAX_RATE, Math.min(MAX_RATE, r));
      if (clamped === 0) return stopMotion();
      wantedRate = clamped;
      if (rate !== 0) startMotion(clamped);
    },
    shuttle: (direction) => {
      const same = Math.sign(rate) === direction;
      const speed = same ? Math.min(MAX_RATE, Math.abs(rate) * 2) : 1;
      wantedRate = direction * speed;
      startMotion(wantedRate);
    },
    onFrame: (l) => {
      frameListeners.add(l);
      return () => frameListeners.delete(l);
    },
    onState: (l) => {
      stateListeners.add(l);
      return () => stateListeners.delete(l);
    },
    destroy: () => {
      destroyed = true;
      reverseToken++;
      video.cancelVideoFrameCallback(handle);
      video.removeEventListener('pause', onPause);
      video.removeEventListener('ended', onEnded);
      if (!video.paused) video.pause();
      frameListeners.clear();
      stateListeners.clear();
    },
  };
  return control;
}
