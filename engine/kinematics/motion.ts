/**
 * Position, velocity and acceleration of one tracked object in one period, from the
 * frame-major tracking arrays, by Savitzky–Golay filtering of each coordinate.
 */
import type { TrackingPeriod } from '../../shared-types/domain.ts';
import { savgolSeries } from './savgol.ts';

export interface Motion {
  /** Smoothed position, m. NaN where missing. */
  x: Float64Array;
  y: Float64Array;
  /** Velocity, m/s. */
  vx: Float64Array;
  vy: Float64Array;
  /** Acceleration, m/s². */
  ax: Float64Array;
  ay: Float64Array;
  speed: Float64Array;
  /** |a|, m/s². */
  accel: Float64Array;
}

export interface MotionOptions {
  /** Half window in seconds (default 0.12 s: 7 samples at 25 Hz, 3 at 10 Hz). */
  halfWindowS?: number;
  order?: number;
}

/**
 * `objectMotion(period, ballIndex, objects.length, 25) -> { x, y, vx, vy, speed, accel, ... }`
 */
export function objectMotion(
  period: TrackingPeriod,
  objectIndex: number,
  objectCount: number,
  rate: number,
  opts: MotionOptions = {},
): Motion {
  const half = Math.max(1, Math.round((opts.halfWindowS ?? 0.12) * rate));
  const order = opts.order ?? 2;
  const dt = 1 / rate;
  const n = period.frameCount;
  const f = (src: Float32Array, deriv: number) =>
    savgolSeries(src, { half, order, deriv, dt }, objectCount, objectIndex, n);
  const x = f(period.x, 0);
  const y = f(period.y, 0);
  const vx = f(period.x, 1);
  const vy = f(period.y, 1);
  const ax = f(period.x, 2);
  const ay = f(period.y, 2);
  const speed = new Float64Array(n);
  const accel = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    speed[i] = Math.hypot(vx[i], vy[i]);
    accel[i] = Math.hypot(ax[i], ay[i]);
  }
  return { x, y, vx, vy, ax, ay, speed, accel };
}
