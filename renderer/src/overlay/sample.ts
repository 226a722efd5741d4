/**
 * Tracking positions at any instant: linear interpolation between the two stored frames
 * around it (tracking is 25 Hz, footage frames fall between). A value missing on one side
 * takes the other side; missing on both is NaN.
 *
 *   sampleAt(period, rate, 12.34, out)   // out[2*o], out[2*o+1] = x, y of object o
 */
import type { TrackingPeriod } from '../../../shared-types/index.ts';

export function sampleAt(p: TrackingPeriod, n: number, rate: number, t: number, out: Float64Array): boolean {
  const f = t * rate;
  if (!(f >= 0 && f <= p.frameCount - 1)) {
    out.fill(NaN);
    return false;
  }
  const f0 = Math.floor(f);
  const f1 = Math.min(p.frameCount - 1, f0 + 1);
  const w = f - f0;
  for (let o = 0; o < n; o++) {
    out[2 * o] = mix(p.x[f0 * n + o], p.x[f1 * n + o], w);
    out[2 * o + 1] = mix(p.y[f0 * n + o], p.y[f1 * n + o], w);
  }
  return true;
}

function mix(a: number, b: number, w: number): number {
  if (Number.isNaN(a)) return b;
  if (Number.isNaN(b)) return a;
  return a + (b - a) * w;
}

/** Positions of object o at each stored frame in [t - seconds, t] (gaps skipped), oldest first, ending at the interpolated point. */
export function trailOf(p: TrackingPeriod, n: number, o: number, rate: number, t: number, seconds: number, now: [number, number]): Float32Array {
  const last = Math.min(p.frameCount - 1, Math.floor(t * rate));
  const first = Math.max(0, Math.ceil((t - seconds) * rate));
  const pts: number[] = [];
  for (let f = first; f <= last; f++) {
    const x = p.x[f * n + o];
    const y = p.y[f * n + o];
    if (!Number.isNaN(x) && !Number.isNaN(y)) pts.push(x, y);
  }
  if (!Number.isNaN(now[0])) pts.push(now[0], now[1]);
  return Float32Array.from(pts);
}
