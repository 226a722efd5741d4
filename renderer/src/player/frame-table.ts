/**
 * Frame lookups on the probed PTS table (footage seconds of every frame, presentation
 * order) and the link between footage time and the <video> element's media time.
 * Plain data in, plain data out: no DOM, so the unit tests run them directly.
 *
 *   frameShownAt(pts, 0.05)            -> 1 (pts [0, 0.04, 0.08])
 *   seekTargetOf(pts, 1, 25)           -> 0.06 (the middle of frame 1's display interval)
 *   frameOfMediaTime(pts, 10.04, 10)   -> { index: 1, exact: true, error: 0 }
 */
import { frameAtOrBefore } from '../../../engine/timecode/pts.ts';

/** Clamps a frame number into the table, rounding to a whole frame. */
export function clampFrame(pts: ArrayLike<number>, frame: number): number {
  if (pts.length === 0) throw new RangeError('the footage has no frames');
  if (Number.isNaN(frame)) throw new RangeError('frame number is NaN');
  return Math.max(0, Math.min(pts.length - 1, Math.round(frame)));
}

/** The frame on screen at footage time t: the last one starting at or before t (frame 0 before the first). */
export function frameShownAt(pts: ArrayLike<number>, t: number): number {
  return Math.max(0, frameAtOrBefore(pts, t));
}

/** How long frame i stays on screen; the last frame borrows its predecessor's length (or 1/fps). */
export function frameLength(pts: ArrayLike<number>, i: number, nominalFps: number): number {
  if (i + 1 < pts.length) return pts[i + 1] - pts[i];
  if (i > 0) return pts[i] - pts[i - 1];
  return 1 / (nominalFps > 0 ? nominalFps : 25);
}

/**
 * Footage time to ask the <video> element for so that it shows frame i: the middle of the
 * frame's display interval, so that rounding in the decoder's time base (microseconds in
 * Chromium, 1/90000 s in MPEG-TS) never lands on a neighbour.
 */
export function seekTargetOf(pts: ArrayLike<number>, i: number, nominalFps: number): number {
  const f = clampFrame(pts, i);
  return pts[f] + frameLength(pts, f, nominalFps) / 2;
}

export interface MatchedFrame {
  index: number;
  /** mediaTime equals the frame's PTS (within half a millisecond): the table and the decoder agree. */
  exact: boolean;
  /** mediaTime minus the frame's PTS, in footage seconds. */
  error: number;
}

/** Half a millisecond: Chromium reports mediaTime in whole microseconds; PTS tables are exact. */
export const EXACT_TOLERANCE = 5e-4;

/**
 * The frame a media time names. `mediaOffset` is media time minus footage time (Chromium
 * keeps the container's timestamps: an MP4 without an edit list or a Matroska file whose
 * first frame is at 7 ms starts there). The nearest frame within half a frame wins; a
 * time between frames (a table that disagrees with the decoder) falls back to the frame
 * at or before it and is reported as not exact.
 */
export function frameOfMediaTime(pts: ArrayLike<number>, mediaTime: number, mediaOffset: number): MatchedFrame {
  const t = mediaTime - mediaOffset;
  const before = frameShownAt(pts, t);
  let index = before;
  if (before + 1 < pts.length && Math.abs(pts[before + 1] - t) < Math.abs(pts[before] - t)) index = before + 1;
  let error = t - pts[index];
  if (Math.abs(error) > EXACT_TOLERANCE) {
    index = before;
    error = t - pts[index];
  }
  return { index, exact: Math.abs(error) <= EXACT_TOLERANCE, error };
}

/**
 * Media time minus footage time, learned from the first frame the element shows after
 * loading (expected: the probe's start time). When the element reports a time near a
 * known frame other than the first, the offset that makes it exact is kept.
 */
export function mediaOffsetFrom(pts: ArrayLike<number>, firstMediaTime: number, probeStart: number): number {
  const expected = frameOfMediaTime(pts, firstMediaTime, probeStart);
  if (expected.exact) return probeStart;
  // The element's own zero: its first shown frame is frame 0.
  return firstMediaTime - pts[0];
}
