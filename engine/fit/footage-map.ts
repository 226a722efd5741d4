/**
 * Footage time <-> tracking time through a footage clock fit. A footage fit has one or
 * more segments per period on the footage clock (`t_trk = offset + rate * t_footage`);
 * footage outside every segment (lead-in, half-time) maps to nothing.
 *
 *   footageToTracking(fit, 612.4)        -> { period: 2, t: 83.1 }
 *   trackingToFootage(fit, 2, 83.1)      -> 612.4
 */
import type { ClockFit, PeriodId, Seconds } from '../../shared-types/index.ts';

export interface TrackingMoment {
  period: PeriodId;
  t: Seconds;
}

/** Tracking period and time shown at footage time `t`, or undefined outside the fitted periods. */
export function footageToTracking(fit: ClockFit, t: Seconds, slack: Seconds = 0): TrackingMoment | undefined {
  let best: { seg: ClockFit['segments'][number]; d: number } | undefined;
  for (const seg of fit.segments) {
    const d = t < seg.fromT ? seg.fromT - t : t > seg.toT ? t - seg.toT : 0;
    if (d <= slack && (!best || d < best.d)) best = { seg, d };
  }
  return best && { period: best.seg.period, t: best.seg.offset + best.seg.rate * t };
}

/** Footage time at which tracking moment (period, t) is shown, or undefined when no segment covers it. */
export function trackingToFootage(fit: ClockFit, period: PeriodId, t: Seconds, slack: Seconds = 0): Seconds | undefined {
  let best: { tf: Seconds; d: number } | undefined;
  for (const seg of fit.segments) {
    if (seg.period !== period || seg.rate === 0) continue;
    const tf = (t - seg.offset) / seg.rate;
    const d = tf < seg.fromT ? seg.fromT - tf : tf > seg.toT ? tf - seg.toT : 0;
    if (d <= slack && (!best || d < best.d)) best = { tf, d };
  }
  return best?.tf;
}
