/**
 * Turns a container's raw per-frame timestamps into the footage facts every prober
 * reports the same way: presentation order, footage time (PTS minus the first PTS),
 * keyframe indices, nominal and measured rate, and whether the rate varies.
 *
 * Example: frameTable([{ ticks: 0, key: true }, { ticks: 3600, key: false }], 90000)
 *   → { pts: [0, 0.04], keyframes: [0], nominalFps: 25, ... }
 */

export interface RawFrame {
  /** Presentation timestamp in time-base ticks (integers where the container has them). */
  ticks: number;
  key: boolean;
}

export interface FrameTable {
  /** Seconds of the first frame in the container clock. */
  startTime: number;
  pts: number[];
  keyframes: number[];
  nominalFps: number;
  measuredFps: number;
  variableRate: boolean;
  /** Median frame interval in seconds (0 for fewer than two frames). */
  medianInterval: number;
}

/** Rates broadcast and cameras use (common practice); a measured rate snaps to one within 0.1 %. */
const STANDARD_RATES = [24000 / 1001, 24, 25, 30000 / 1001, 30, 48, 50, 60000 / 1001, 60, 100, 120000 / 1001, 120];

export function snapRate(fps: number): number {
  for (const r of STANDARD_RATES) if (Math.abs(fps - r) / r < 0.001) return r;
  return Math.round(fps * 1000) / 1000;
}

function median(values: number[]): number {
  if (values.length === 0) return 0;
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * @param frames video frames in any order (decode order is fine)
 * @param timebase ticks per second
 * @param tickOffset ticks to subtract from every timestamp first (MP4 edit list media_time)
 */
export function frameTable(frames: RawFrame[], timebase: number, tickOffset = 0): FrameTable {
  if (frames.length === 0) throw new Error('the footage has no video frames');
  // Sort by presentation time; a stable sort keeps equal timestamps in decode order.
  const ordered = frames.map((f, i) => ({ ...f, i })).sort((a, b) => a.ticks - b.ticks || a.i - b.i);
  const first = ordered[0].ticks;
  const startTime = (first - tickOffset) / timebase;
  // Subtract in integer ticks before dividing, so 0.04 comes out as 0.04 and not 0.0399999.
  const pts = ordered.map((f) => (f.ticks - first) / timebase);
  const keyframes: number[] = [];
  ordered.forEach((f, idx) => {
    if (f.key) keyframes.push(idx);
  });
  const intervals: number[] = [];
  for (let k = 1; k < pts.length; k++) intervals.push(pts[k] - pts[k - 1]);
  const med = median(intervals);
  // Rounding to the container's tick (1 ms in Matroska) is not a varying rate: allow
  // two ticks or 1.5 ms, whichever is larger, before calling an interval irregular.
  const tolerance = Math.max(2 / timebase, 0.0015);
  const variableRate = intervals.some((d) => Math.abs(d - med) > tolerance);
  // Nominal rate from the mean of the typical intervals, not the median alone: 30000/1001
  // in 1 ms ticks is 33, 33, 34 ms — the median says 30.3 fps, the mean says 29.97.
  const typical = intervals.filter((d) => Math.abs(d - med) <= tolerance);
  const typicalSum = typical.reduce((a, b) => a + b, 0);
  const nominalFps = typicalSum > 0 ? snapRate(typical.length / typicalSum) : 0;
  const span = pts[pts.length - 1];
  const measuredFps = span > 0 ? (pts.length - 1) / span : 0;
  return { startTime, pts, keyframes, nominalFps, measuredFps, variableRate, medianInterval: med };
}
