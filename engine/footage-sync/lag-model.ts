/**
 * How far a referee's whistle sits from the tracking restart it belongs to, by restart
 * kind. A tracking restart anchor is the moment the ball is played (engine/anchors/
 * restarts.ts), with `stillFromT` the moment it came to rest at the spot.
 *
 * - Kick-off (Law 8) and penalty kick (Law 14): the referee signals and the kick follows,
 *   typically within about a second (common practice, from memory). The whistle precedes
 *   the kick: lag = t_played − t_whistle ≈ 0.7 s.
 * - Free kick (Law 13): the whistle stops play for the offence; the ball is then placed
 *   and comes to rest about a second later (common practice, from memory), so the pairing
 *   is with the moment of rest, not the kick (which follows after a variable wait).
 * - Corner, goal kick, throw-in: normally taken without a whistle; the whistle for "out"
 *   is optional and the wait before the restart varies by many seconds (common practice),
 *   so no pairing is proposed for them.
 *
 * These are starting values only: fitFootageClock re-estimates every kind's lag from the
 * accepted pairings against the analyst's frame-accurate marks, and their spread from the
 * robust scale of the residuals.
 */
import type { AnchorKind, Seconds } from '../../shared-types/domain.ts';

export interface WhistleLag {
  /** Which moment of the tracking restart the whistle belongs to. */
  ref: 'played' | 'still';
  /** Reference moment minus whistle onset, seconds (positive: the whistle comes first). */
  lagS: Seconds;
  /** Spread of that lag between occasions, seconds (one standard deviation). */
  sdS: Seconds;
}

export const WHISTLE_LAGS: Partial<Record<AnchorKind, WhistleLag>> = {
  kick_off: { ref: 'played', lagS: 0.7, sdS: 0.35 },
  penalty: { ref: 'played', lagS: 0.8, sdS: 0.45 },
  free_kick: { ref: 'still', lagS: 1.0, sdS: 0.6 },
};

/** Tracking anchor fields the pairing uses (a stored tracking anchor, or engine RestartAnchor). */
export interface TrackingMoment {
  kind: AnchorKind;
  t: Seconds;
  stillFromT?: Seconds;
}

/**
 * The tracking time a whistle for this restart is expected to be heard at, before the
 * kind's lag is taken off: the kick, or the moment of rest where the model says so (the
 * kick when the anchor does not carry a moment of rest).
 * `referenceTime({ kind: 'free_kick', t: 110.4, stillFromT: 108.0 }) -> 108.0`
 */
export function referenceTime(a: TrackingMoment, lag: WhistleLag): Seconds {
  return lag.ref === 'still' && a.stillFromT !== undefined && a.stillFromT < a.t ? a.stillFromT : a.t;
}

/** The lag to use for a tracking anchor; a free kick without a moment of rest waits longer and less predictably. */
export function lagFor(a: TrackingMoment, lags: Partial<Record<AnchorKind, WhistleLag>> = WHISTLE_LAGS): WhistleLag | undefined {
  const lag = lags[a.kind];
  if (!lag) return undefined;
  if (lag.ref === 'still' && (a.stillFromT === undefined || !(a.stillFromT < a.t))) return { ref: 'played', lagS: lag.lagS + 3, sdS: lag.sdS * 3 };
  return lag;
}
