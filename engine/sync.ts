/**
 * The whole alignment of an event log onto tracking, with no hint from the analyst:
 * restarts in both sources -> coarse offset per period (sequence alignment) -> robust
 * clock fit on the paired restarts -> per-event refinement -> a second clock fit on the
 * confidently placed events (many more points, so drift is well determined) -> a final
 * refinement through that fit.
 */
import type { Anchor, ClockFit, ClockSegment, EventLog, PeriodId, ProposedCorrection, TrackingData } from '../shared-types/domain.ts';
import { detectRestarts, type RestartAnchor, type RestartOptions } from './anchors/restarts.ts';
import { eventAnchors } from './anchors/events.ts';
import { alignRestarts, type AlignOptions, type CoarseMatch } from './align/coarse.ts';
import { DEFAULT_DRIFT_PRIOR, fitClocks, type ClockFitOptions, type ClockPair } from './fit/clock.ts';
import { buildScenes, refineEvents } from './refine/refine.ts';

export interface SyncOptions {
  restarts?: RestartOptions;
  align?: AlignOptions;
  fit?: ClockFitOptions;
  /** Refit the clock on refined events and refine again this many times (default 2). */
  refits?: number;
}

export interface SyncResult {
  trackingAnchors: RestartAnchor[];
  eventAnchors: Anchor[];
  coarse: CoarseMatch[];
  fit: ClockFit;
  corrections: ProposedCorrection[];
}

/** Kinds whose refined times are good clock points (shots are often logged late, goal kicks far off). */
const REFIT_KINDS = new Set(['pass', 'throw_in', 'corner', 'free_kick', 'kick_off', 'penalty']);

/**
 * `syncMatch(tracking, events) -> { trackingAnchors, eventAnchors, coarse, fit, corrections }`
 */
export function syncMatch(tracking: TrackingData, events: EventLog, opts: SyncOptions = {}): SyncResult {
  const trackingAnchors = detectRestarts(tracking, opts.restarts);
  const evtAnchors = eventAnchors(events);
  const coarse = alignRestarts(trackingAnchors, evtAnchors, opts.align);
  const periods = [...new Set(events.events.map((e) => e.period))].sort((a, b) => a - b);

  const firstPairs = new Map<PeriodId, ClockPair[]>();
  for (const m of coarse)
    firstPairs.set(m.period, m.pairs.map((p) => ({
      anchorId: p.source.id, refAnchorId: p.tracking.id, kind: p.source.kind, t: p.source.t, tRef: p.tracking.t,
      weight: Math.min(p.source.confidence, p.tracking.confidence),
    })));
  // First fit: offset only (nominal rate). A few dozen jittery restarts cannot pin the
  // rate to better than thousands of ppm, and a wrong rate would steer every event.
  let fit = withFallbacks(fitClocks(firstPairs, 'events', { ...opts.fit, fixedRate: 1 }), periods);
  const scenes = buildScenes(tracking, trackingAnchors);
  let corrections = refineEvents(tracking, events, fit, scenes);

  for (let pass = 0; pass < (opts.refits ?? 2); pass++) {
    const pairs = new Map<PeriodId, ClockPair[]>();
    corrections.forEach((c, i) => {
      const e = events.events[i];
      if (!c.placed || c.confidence < 0.25 || !REFIT_KINDS.has(e.kind)) return;
      const list = pairs.get(e.period) ?? [];
      list.push({ anchorId: `evt-${e.id}`, kind: e.kind === 'pass' ? 'touch' : (e.kind as ClockPair['kind']), t: e.t, tRef: c.trackingTime });
      pairs.set(e.period, list);
    });
    // Periods with too few placed events keep the restart-based fit.
    for (const seg of fit.segments) if ((pairs.get(seg.period)?.length ?? 0) < 10) pairs.delete(seg.period);
    if (pairs.size === 0) break;
    // Free rate, held near nominal by the weak drift prior (±300 ppm): on a few minutes
    // of jittery tags the data alone leave it uncertain by thousands of ppm.
    const refit = fitClocks(pairs, 'events', { minScale: 0.05, driftPrior: DEFAULT_DRIFT_PRIOR, ...opts.fit });
    fit = { ...fit, segments: [...fit.segments.filter((s) => !pairs.has(s.period)), ...refit.segments].sort((a, b) => a.period - b.period || a.fromT - b.fromT) };
    corrections = refineEvents(tracking, events, fit, scenes);
  }
  return { trackingAnchors, eventAnchors: evtAnchors, coarse, fit, corrections };
}

/** A period with nothing to pair keeps clocks as they are (offset 0, rate 1), flagged. */
function withFallbacks(fit: ClockFit, periods: PeriodId[]): ClockFit {
  const segments: ClockSegment[] = [...fit.segments];
  for (const period of periods)
    if (!segments.some((s) => s.period === period))
      segments.push({ period, fromT: 0, toT: 0, offset: 0, rate: 1, driftPpm: 0, offsetSe: NaN, rateSe: NaN, rmsResidual: NaN, leaveOneOutMax: NaN, points: [] });
  return { ...fit, segments: segments.sort((a, b) => a.period - b.period || a.fromT - b.fromT) };
}
