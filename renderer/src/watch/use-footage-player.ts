/**
 * The footage player for the Watch screen behind the PlayerControl contract
 * (renderer/src/player/contract.ts). Until the shared player module lands this is a small
 * adapter of our own over the <video> element: requestVideoFrameCallback's mediaTime is
 * matched against the probed PTS table so the frame reported is the frame on screen.
 */
import { useEffect, useState, type RefObject } from 'react';
import type { FootageProbe } from '../../../shared-types/index.ts';
import type { DisplayedFrame, PlayerControl } from '../player/contract.ts';

/** Index of the last frame whose PTS is at or before t (+ half a microsecond of slack). */
export function frameAt(pts: readonly number[], t: number): number {
  let lo = 0;
  let hi = pts.length - 1;
  if (hi < 0) return 0;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (pts[mid] <= t + 5e-7) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

export function useFootagePlayer(ref: RefObject<HTMLVideoElement | null>, url: string | undefined, probe: FootageProbe | undefined): PlayerControl | null {
  const [player, setPlayer] = useState<PlayerControl | null>(null);
  useEffect(() => {
    const video = ref.current;
    if (!video || !url || !probe) return;
    video.src = url;
    const pts = probe.pts;
    const start = probe.startTime;
    const listeners = new Set<(f: DisplayedFrame) => void>();
    let current: DisplayedFrame | undefined;
    let waiters: { index: number; resolve: (f: DisplayedFrame) => void }[] = [];
    let handle = 0;
    const onVideoFrame = (_now: number, meta: VideoFrameCallbackMetadata) => {
      const index = frameAt(pts, meta.mediaTime - start);
      current = { index, t: pts[index] };
      for (const l of listeners) l(current);
      const ready = waiters.filter((w) => w.index === index);
      waiters = waiters.filter((w) => w.index !== index);
      for (const w of ready) w.resolve(current);
      handle = video.requestVideoFrameCallback(onVideoFrame);
    };
    handle = video.requestVideoFrameCallback(onVideoFrame);
    const seekToFrame = (index: number) => {
      const i = Math.max(0, Math.min(pts.length - 1, Math.round(index)));
      return new Promise<DisplayedFrame>((resolve) => {
        if (current?.index === i && !video.seeking) return resolve(current);
        waiters.push({ index: i, resolve });
        // The middle of the frame's display interval, so rounding never lands on its neighbour.
        const next = pts[i + 1] ?? pts[i] + 1 / (probe.nominalFps || 25);
        video.currentTime = start + (pts[i] + next) / 2;
      });
    };
    const control: PlayerControl = {
      get current() {
        return current;
      },
      get playing() {
        return !video.paused;
      },
      play: () => void video.play(),
      pause: () => video.pause(),
      seekToFrame,
      seekToTime: (t) => seekToFrame(frameAt(pts, t)),
      step: (n) => seekToFrame((current?.index ?? 0) + n),
      setRate: (r) => {
        video.playbackRate = Math.max(0.0625, Math.abs(r));
      },
      onFrame: (l) => {
        listeners.add(l);
        return () => listeners.delete(l);
      },
      video,
    };
    const onLoaded = () => void seekToFrame(0);
    video.addEventListener('loadeddata', onLoaded, { once: true });
    setPlayer(control);
    return () => {
      video.cancelVideoFrameCallback(handle);
      video.removeEventListener('loadeddata', onLoaded);
      listeners.clear();
      setPlayer(null);
    };
  }, [ref, url, probe]);
  return player;
}
