/**
 * The clock fits as JSON: per source and period, each segment's offset, rate, drift and
 * their standard errors, residual figures and every anchor pair with its residual.
 *
 *   clockFitsJson([{ label: 'events.csv', fit }], meta) → '{ "format": "whistlemark-clock-fits/1", … }'
 */
import type { ClockFit } from '../../shared-types/domain.ts';

const r = (v: number, d: number) => (Number.isFinite(v) ? Number(v.toFixed(d)) : null);

export interface LabelledFit {
  /** The source's file name. */
  label: string;
  fit: ClockFit;
  createdAt?: number;
}

export function clockFitsObject(fits: LabelledFit[]) {
  return fits.map(({ label, fit, createdAt }) => ({
    source: label,
    clock: fit.source,
    reference: 'tracking',
    model: `t_tracking = offset_s + rate * t_${fit.source} (seconds since each period start)`,
    method: fit.method,
    ...(createdAt ? { fitted_at: new Date(createdAt).toISOString() } : {}),
    segments: fit.segments.map((s) => ({
      period: s.period,
      from_s: r(s.fromT, 3),
      to_s: r(s.toT, 3),
      offset_s: r(s.offset, 4),
      rate: r(s.rate, 9),
      drift_ppm: r(s.driftPpm, 1),
      offset_se_s: r(s.offsetSe, 4),
      rate_se: r(s.rateSe, 9),
      drift_se_ppm: r(s.rateSe * 1e6, 1),
      rms_residual_s: r(s.rmsResidual, 4),
      leave_one_out_max_s: r(s.leaveOneOutMax, 4),
      anchors_used: s.points.filter((p) => p.used).length,
      anchors_rejected: s.points.filter((p) => !p.used).length,
      anchors: s.points.map((p) => ({
        id: p.anchorId,
        kind: p.kind,
        t_source_s: r(p.t, 3),
        t_tracking_s: r(p.tRef, 3),
        residual_s: r(p.residual, 3),
        used: p.used,
        ...(p.rejectedBecause ? { rejected_because: p.rejectedBecause } : {}),
      })),
    })),
  }));
}

export function clockFitsJson(fits: LabelledFit[], meta: { title: string; generatedAt: string }): string {
  return JSON.stringify({ format: 'whistlemark-clock-fits/1', ...meta, fits: clockFitsObject(fits) }, null, 1) + '\n';
}
