/**
 * The footage clock fit: footage time → tracking time per period, `t_trk = offset + rate ·
 * t_footage`, from paired anchors, through the shared robust fit (fitClock, weighted, with
 * the drift prior).
 *
 * Error model (why two kinds of pairing weigh so differently):
 * - A frame the analyst marked (kick-off, other restart) is the first frame in which the
 *   ball has been played, so the kick lies somewhere in the frame interval before it: the
 *   pairing uses t = pts − ½ frame, with σ_marked = √(frame_f² + frame_trk²) / √12 (two
 *   uniform quantisations, footage and tracking; 16 ms at 25 fps / 25 Hz). These are the
 *   unit-weight points.
 * - A whistle ↔ restart pairing carries a kind-specific lag (lag-model.ts) that varies
 *   from one occasion to the next by tenths of a second. Each kind's lag is re-estimated
 *   from the pairings against the marks-only fit (median of their residuals), their spread σ_w by pooling the starting spread (as four
 *   occasions) with the robust scale (1.4826 · MAD, floor 80 ms) of the lag-corrected
 *   residuals (as their degrees of freedom); each gets weight (σ_marked / σ_w)², a few
 *   thousandths. Since the lags are measured against the marks, whistles cannot move
 *   the offset there; they add what they can to the rate, which the drift prior mostly
 *   holds anyway.
 * - Guard: after the weighted fit, the mapped time at every marked anchor must stay within
 *   a quarter frame of the marks-only fit, and within half a frame anywhere in the
 *   period's stretch of footage; if not, the whistle weights are halved (up to 8 times),
 *   then dropped for that period. So accepting proposals can never pull a fit anchored on
 *   marks off by a frame: whistles only ever refine it within half a frame. (Their rate
 *   evidence is weak — σ_w of tenths of a second — and a free rate would follow their
 *   noise by hundreds of ppm.)
 *
 * `fitFootageClock(pairs, { trackingPeriods }) -> FootageClockFit` (source 'footage').
 */
import type { AnchorKind, ClockFit, ClockSegment, PeriodId, Seconds } from '../../shared-types/domain.ts';
import { fitClock, fitClocks, mapTime, DEFAULT_DRIFT_PRIOR, type ClockPair, type DriftPrior } from '../fit/clock.ts';
import { mad, median } from '../fit/robust.ts';
import { lagFor, referenceTime, WHISTLE_LAGS, type TrackingMoment, type WhistleLag } from './lag-model.ts';

/** One footage anchor paired with one tracking anchor. */
export interface FootagePair {
  footageAnchorId: string;
  trackingAnchorId: string;
  period: PeriodId;
  /** The footage anchor's kind: a restart the analyst marked, or 'whistle' / 'cut'. */
  footageKind: AnchorKind;
  /** Footage seconds (the marked frame's pts, or the whistle's onset). */
  tFootage: Seconds;
  tracking: TrackingMoment;
  /** Left out by the analyst: not fitted (its residual is still shown). */
  excluded?: boolean;
}

export interface FootageFitOptions {
  /** Footage frame duration, s (default 1/25). */
  footageFrameS?: Seconds;
  /** Tracking frame duration, s (default 1/25). */
  trackingFrameS?: Seconds;
  /** Each tracking period's first and last moment (tracking seconds): segment ranges cover its footage. */
  trackingPeriods?: { period: PeriodId; start: Seconds; end: Seconds }[];
  /** Length of the footage, s (segments are clipped to it). */
  footageDurationS?: Seconds;
  driftPrior?: DriftPrior | null;
  /** Starting lags by tracking kind (default WHISTLE_LAGS). */
  lags?: Partial<Record<AnchorKind, WhistleLag>>;
}

export interface KindLag extends WhistleLag {
  kind: AnchorKind;
  /** Accepted pairings of this kind the estimate used. */
  n: number;
  /** Weight of each such pairing relative to a marked frame. */
  weight: number;
}

export interface FootageClockFit extends ClockFit {
  source: 'footage';
  model: {
    markedSdS: Seconds;
    /** Lag, spread and weight per tracking kind, as estimated (or the starting values). */
    lags: KindLag[];
    /** Factor the guard applied to the whistle weights per period (1 = none, 0 = dropped). */
    guard: { period: PeriodId; factor: number }[];
  };
}

/** Analyst-marked restart (frame-accurate) or a lagged whistle/cut pairing. */
export const isMarkedPair = (p: Pick<FootagePair, 'footageKind'>) => p.footageKind !== 'whistle' && p.footageKind !== 'cut';

const LAG_FLOOR_S = 0.08;
const GUARD_TRIES = 8;
const PRIOR_OCCASIONS = 4;

/** Fit the footage clock; periods without any usable pairing get no segment. */
export function fitFootageClock(pairs: FootagePair[], opts: FootageFitOptions = {}): FootageClockFit {
  const frameF = opts.footageFrameS ?? 1 / 25;
  const frameT = opts.trackingFrameS ?? 1 / 25;
  const sdMarked = Math.hypot(frameF, frameT) / Math.sqrt(12);
  const driftPrior = opts.driftPrior === undefined ? DEFAULT_DRIFT_PRIOR : opts.driftPrior;
  const startLags = opts.lags ?? WHISTLE_LAGS;
  const fitOpts = { minScale: sdMarked, driftPrior };
  const live = pairs.filter((p) => !p.excluded);
  const marked = live.filter(isMarkedPair);
  const lagged = live.filter((p) => !isMarkedPair(p)).map((p) => ({ p, lag: lagFor(p.tracking, startLags) })).filter((x) => x.lag) as { p: FootagePair; lag: WhistleLag }[];

  // 1. Marks only.
  const byPeriod = new Map<PeriodId, ClockPair[]>();
  for (const p of marked) push(byPeriod, p.period, markedPair(p, frameF));
  const base = fitClocks(byPeriod, 'footage', fitOpts);
  coverPeriods(base, opts); // the guard below checks the whole stretch of each period

  // 2. Lags per kind against the marks (pooled over periods), spread from their residuals.
  const resid = lagged
    .filter(({ p }) => base.segments.some((s) => s.period === p.period))
    .map(({ p, lag }) => ({ kind: p.tracking.kind, r: referenceTime(p.tracking, lag) - lag.lagS - mapTime(base, p.period, p.tFootage), lag }));
  const kinds = [...new Set(lagged.map((x) => x.p.tracking.kind))];
  const lagOf = new Map<AnchorKind, KindLag>();
  for (const kind of kinds) {
    const rs = resid.filter((x) => x.kind === kind).map((x) => x.r);
    const first = lagged.find((x) => x.p.tracking.kind === kind)!.lag;
    // Not shrunk toward the starting value: a lag error left in would tilt the rate about
    // the marks wherever the whistles sit on one side of them. A kind seen once is then
    // fitted exactly by its own lag and carries no weight of evidence, as it should.
    const shift = rs.length ? median(rs) : 0;
    lagOf.set(kind, { kind, ref: first.ref, lagS: first.lagS - shift, sdS: first.sdS, n: rs.length, weight: 0 });
  }
  // Spread per kind: the starting spread counts as PRIOR_OCCASIONS occasions, the measured
  // residuals (robust: 1.4826 · MAD of the pooled deviations) as their degrees of freedom
  // (pairings less one per kind whose lag was estimated). A handful of pairings whose
  // lags happen to agree cannot make whistles look frame-accurate.
  const deviations = resid.map((x) => x.r + (x.lag.lagS - lagOf.get(x.kind)!.lagS));
  const measured = deviations.length >= 3 ? Math.max(LAG_FLOOR_S, 1.4826 * mad(deviations)) : 0;
  const dof = Math.max(0, deviations.length - [...lagOf.values()].filter((l) => l.n > 0).length);
  for (const l of lagOf.values()) {
    l.sdS = Math.sqrt((PRIOR_OCCASIONS * l.sdS ** 2 + dof * measured ** 2) / (PRIOR_OCCASIONS + dof));
    l.weight = (sdMarked / l.sdS) ** 2;
  }

  // 3. Weighted fit per period, inside the marks' segments, with the guard.
  const segments: ClockSegment[] = [];
  const guard: { period: PeriodId; factor: number }[] = [];
  const periods = [...new Set(live.map((p) => p.period))].sort((a, b) => a - b);
  for (const period of periods) {
    const baseSegs = base.segments.filter((s) => s.period === period);
    const whistles = lagged.filter((x) => x.p.period === period).map(({ p }) => {
      const l = lagOf.get(p.tracking.kind)!;
      return { p, pair: { anchorId: p.footageAnchorId, refAnchorId: p.trackingAnchorId, kind: p.tracking.kind, t: p.tFootage, tRef: referenceTime(p.tracking, l) - l.lagS, weight: l.weight } as ClockPair };
    });
    const marks = byPeriod.get(period) ?? [];
    if (!baseSegs.length) {
      // No mark in this period: the whistles alone, at their estimated lags.
      if (whistles.length) segments.push(fitClock(whistles.map((w) => w.pair), period, fitOpts));
      continue;
    }
    let factor = 1;
    let fitted: ClockSegment[] = [];
    for (let attempt = 0; attempt <= GUARD_TRIES + 1; attempt++) {
      if (attempt === GUARD_TRIES + 1) factor = 0;
      fitted = baseSegs.map((seg, i) => {
        const own = (t: Seconds) => nearestSegment(baseSegs, t) === i;
        const ps = [...marks.filter((m) => own(m.t)), ...(factor > 0 ? whistles.filter((w) => own(w.pair.t)).map((w) => ({ ...w.pair, weight: w.pair.weight! * factor })) : [])];
        return factor > 0 && ps.length > seg.points.length ? fitClock(ps, period, fitOpts) : seg;
      });
      const moved = (t: Seconds) => {
        const i = nearestSegment(baseSegs, t);
        return Math.abs(fitted[i].offset + fitted[i].rate * t - (baseSegs[i].offset + baseSegs[i].rate * t));
      };
      // The difference of two lines is largest at the ends of the stretch.
      const atMarks = Math.max(0, ...marks.map((m) => moved(m.t)));
      const anywhere = Math.max(0, ...baseSegs.flatMap((sg) => [moved(sg.fromT), moved(sg.toT)]));
      if (factor === 0 || (atMarks <= frameF / 4 && anywhere <= frameF / 2)) break;
      factor /= 2;
    }
    guard.push({ period, factor });
    segments.push(...fitted);
  }
  const fit: FootageClockFit = { source: 'footage', segments, method: 'huber', model: { markedSdS: sdMarked, lags: [...lagOf.values()], guard } };
  coverPeriods(fit, opts);
  return fit;
}

function markedPair(p: FootagePair, frameF: Seconds): ClockPair {
  // A period end or start marked on its own frame is the moment itself; a restart's marked
  // frame is the first one after the kick.
  const halfFrame = p.footageKind === 'period_end' ? 0 : frameF / 2;
  return { anchorId: p.footageAnchorId, refAnchorId: p.trackingAnchorId, kind: p.footageKind, t: p.tFootage - halfFrame, tRef: p.tracking.t };
}

function push<K, V>(m: Map<K, V[]>, k: K, v: V) {
  const l = m.get(k);
  if (l) l.push(v);
  else m.set(k, [v]);
}

function nearestSegment(segs: ClockSegment[], t: Seconds): number {
  let best = 0, bestD = Infinity;
  segs.forEach((s, i) => {
    const d = t < s.fromT ? s.fromT - t : t > s.toT ? t - s.toT : 0;
    if (d < bestD) { bestD = d; best = i; }
  });
  return best;
}

/**
 * Segment ranges: within a period, neighbours meet halfway; the period's first and last
 * segment reach to where the tracking period starts and ends in footage (or stay at the
 * outermost pairing when that is not given); periods never overlap; all inside the file.
 */
function coverPeriods(fit: ClockFit, opts: FootageFitOptions): void {
  const segs = fit.segments;
  segs.sort((a, b) => a.period - b.period || a.fromT - b.fromT);
  for (let i = 0; i + 1 < segs.length; i++)
    if (segs[i].period === segs[i + 1].period) {
      const mid = (segs[i].toT + segs[i + 1].fromT) / 2;
      segs[i].toT = mid;
      segs[i + 1].fromT = mid;
    }
  const periods = [...new Set(segs.map((s) => s.period))];
  for (const period of periods) {
    const mine = segs.filter((s) => s.period === period);
    const extent = opts.trackingPeriods?.find((p) => p.period === period);
    if (!extent) continue;
    const first = mine[0], last = mine[mine.length - 1];
    if (first.rate > 0) first.fromT = Math.min(first.fromT, (extent.start - first.offset) / first.rate);
    if (last.rate > 0) last.toT = Math.max(last.toT, (extent.end - last.offset) / last.rate);
  }
  for (let i = 0; i + 1 < segs.length; i++)
    if (segs[i].period !== segs[i + 1].period && segs[i].toT > segs[i + 1].fromT) {
      const mid = (segs[i].toT + segs[i + 1].fromT) / 2;
      segs[i].toT = mid;
      segs[i + 1].fromT = mid;
    }
  for (const s of segs) {
    s.fromT = Math.max(0, s.fromT);
    if (opts.footageDurationS !== undefined) s.toT = Math.min(opts.footageDurationS, s.toT);
  }
}

/**
 * What the fit says about one pairing, in seconds (positive: tracking later than the fit
 * predicts), the same way it was fitted: marks at the kick moment, whistles with their
 * kind's estimated lag. NaN when the period has no segment.
 */
export function pairResidual(fit: FootageClockFit, p: FootagePair, footageFrameS: Seconds = 1 / 25): Seconds {
  if (isMarkedPair(p)) {
    const m = markedPair(p, footageFrameS);
    return m.tRef - mapTime(fit, p.period, m.t);
  }
  const l = fit.model.lags.find((x) => x.kind === p.tracking.kind) ?? lagFor(p.tracking);
  if (!l) return NaN;
  return referenceTime(p.tracking, l) - l.lagS - mapTime(fit, p.period, p.tFootage);
}
