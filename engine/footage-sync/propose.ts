/**
 * Proposed footage ↔ tracking pairings: each whistle (footage anchor) mapped through the
 * current fit lands near the tracking restart it belongs to, less that kind's lag.
 *
 *   proposePairings(fit, footageAnchors, trackingAnchors)
 *     -> [{ label: 'whistle at 12:31.4 ↔ corner at tracking 10:02.8', score: 0.83, ... }]
 *
 * Score: exp(−½ z²) · confidence of both anchors, with z the miss in units of
 * √(σ_lag² + σ_map²); σ_map grows with the distance to the nearest fitted mark at the
 * drift prior's 300 ppm. Candidates beyond 3 of those units are not proposed. Pairs are
 * then taken best score first, so no anchor is used twice (greedy: the lists are short and
 * the windows rarely overlap, so a full assignment would change nothing in practice).
 * Cuts are not paired: a cut says where the picture changed, not where play did; they
 * snap marks and bound non-live intervals instead. Nothing inside a non-live interval
 * (replay, graphics, half-time) is proposed, on either side.
 */
import type { AnchorKind, ClockFit, PeriodId, Seconds } from '../../shared-types/domain.ts';
import { footageToTracking, trackingToFootage } from '../fit/footage-map.ts';
import { DEFAULT_DRIFT_PRIOR } from '../fit/clock.ts';
import { lagFor, referenceTime, WHISTLE_LAGS, type WhistleLag } from './lag-model.ts';
import type { FootageClockFit } from './fit.ts';

export interface FootageAnchorInput {
  id: string;
  kind: AnchorKind;
  t: Seconds;
  confidence: number;
}

export interface TrackingAnchorInput {
  id: string;
  kind: AnchorKind;
  period: PeriodId;
  t: Seconds;
  stillFromT?: Seconds;
  confidence: number;
}

export interface Proposal {
  footageAnchorId: string;
  trackingAnchorId: string;
  period: PeriodId;
  /** The tracking restart's kind. */
  kind: AnchorKind;
  tFootage: Seconds;
  tTracking: Seconds;
  /** Where the fit puts the whistle on the tracking clock. */
  mappedTracking: Seconds;
  lagS: Seconds;
  /** Tracking reference − lag − mapped whistle, s. */
  missS: Seconds;
  /** 0..1 */
  score: number;
  label: string;
}

export interface ProposeOptions {
  /** Footage intervals that do not show live play, [fromT, toT). */
  nonLive?: { fromT: Seconds; toT: Seconds }[];
  /** Anchors already paired (never proposed again). */
  usedFootage?: ReadonlySet<string>;
  usedTracking?: ReadonlySet<string>;
  /** Minimum score to propose (default 0.05). */
  minScore?: number;
}

const KIND_WORDS: Partial<Record<AnchorKind, string>> = {
  kick_off: 'kick-off', goal_kick: 'goal kick', corner: 'corner', throw_in: 'throw-in', free_kick: 'free kick', penalty: 'penalty',
  period_start: 'period start', period_end: 'period end', whistle: 'whistle', cut: 'cut', touch: 'touch',
};
export const kindWord = (k: AnchorKind) => KIND_WORDS[k] ?? k;

/** `clockText(751.4) -> '12:31.4'` */
export function clockText(t: Seconds): string {
  const sign = t < 0 ? '−' : '';
  const a = Math.abs(t);
  const m = Math.floor(a / 60);
  const s = a - 60 * m;
  return `${sign}${m}:${s.toFixed(1).padStart(4, '0')}`;
}

export function proposePairings(fit: ClockFit, footageAnchors: FootageAnchorInput[], trackingAnchors: TrackingAnchorInput[], opts: ProposeOptions = {}): Proposal[] {
  const nonLive = opts.nonLive ?? [];
  const inNonLive = (t: Seconds) => nonLive.some((n) => t >= n.fromT && t < n.toT);
  const model = (fit as Partial<FootageClockFit>).model;
  const lags: Partial<Record<AnchorKind, WhistleLag>> = { ...WHISTLE_LAGS };
  for (const l of model?.lags ?? []) lags[l.kind] = { ref: l.ref, lagS: l.lagS, sdS: l.sdS };
  const markedSd = model?.markedSdS ?? 0.016;
  const driftSd = DEFAULT_DRIFT_PRIOR.sdPpm * 1e-6;
  const minScore = opts.minScore ?? 0.05;

  const candidates: Proposal[] = [];
  for (const f of footageAnchors) {
    if (f.kind !== 'whistle' || opts.usedFootage?.has(f.id) || inNonLive(f.t)) continue;
    const at = footageToTracking(fit, f.t);
    if (!at) continue;
    const seg = fit.segments.find((s) => s.period === at.period && f.t >= s.fromT && f.t <= s.toT);
    const usedTs = (seg?.points ?? []).filter((p) => p.used).map((p) => p.t);
    const dist = usedTs.length ? Math.min(...usedTs.map((t) => Math.abs(t - f.t))) : 300;
    const sdMap = Math.hypot(markedSd, dist * driftSd);
    for (const a of trackingAnchors) {
      if (a.period !== at.period || opts.usedTracking?.has(a.id)) continue;
      const lag = lagFor(a, lags);
      if (!lag) continue;
      const shown = trackingToFootage(fit, a.period, a.t, 1);
      if (shown !== undefined && inNonLive(shown)) continue;
      const ref = referenceTime(a, lag);
      const miss = ref - lag.lagS - at.t;
      const z = miss / Math.hypot(lag.sdS, sdMap);
      if (Math.abs(z) > 3) continue;
      const score = Math.exp(-0.5 * z * z) * clamp01(f.confidence) * clamp01(a.confidence);
      if (score < minScore) continue;
      candidates.push({
        footageAnchorId: f.id, trackingAnchorId: a.id, period: a.period, kind: a.kind, tFootage: f.t, tTracking: a.t,
        mappedTracking: at.t, lagS: lag.lagS, missS: miss, score,
        label: `whistle at ${clockText(f.t)} ↔ ${kindWord(a.kind)} at tracking ${clockText(a.t)}`,
      });
    }
  }
  candidates.sort((a, b) => b.score - a.score);
  const takenF = new Set<string>(), takenT = new Set<string>();
  const out: Proposal[] = [];
  for (const c of candidates) {
    if (takenF.has(c.footageAnchorId) || takenT.has(c.trackingAnchorId)) continue;
    takenF.add(c.footageAnchorId);
    takenT.add(c.trackingAnchorId);
    out.push(c);
  }
  return out.sort((a, b) => a.tFootage - b.tFootage);
}

const clamp01 = (v: number) => (Number.isFinite(v) ? Math.min(1, Math.max(0, v)) : 0);
