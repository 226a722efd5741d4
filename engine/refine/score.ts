/**
 * How well one candidate moment in tracking explains one logged event: a sum of log-
 * likelihood-like terms — time prior, tagged player at the ball, kick signature, logged
 * place, and ball state (restarts come from a dead, placed ball; open play does not).
 */
import type { EventKind, MatchEvent, Seconds } from '../../shared-types/domain.ts';
import { isRestartKind } from '../../shared-types/domain.ts';

export type CandidateKind = 'touch' | 'restart' | 'goal_line';

export interface Candidate {
  t: Seconds;
  frameIndex: number;
  x: number;
  y: number;
  kind: CandidateKind;
  /** Velocity jump, m/s (touches and restarts). */
  dv: number;
  /** Ball speed just after, m/s: a kick sends the ball off fast, a first touch does not. */
  speedAfter: number;
  /** Restart kind seen in tracking, for restart candidates. */
  restartKind?: string;
  restartId?: string;
}

/** What the score needs about the tagged player at the candidate's frame. */
export interface PlayerAtBall {
  /** Distance from the tagged player (or, failing that, the nearest of the team) to the ball, m. */
  dist: number;
  /** The same player's distance to the ball 0.4 s later (a kick leaves him behind). */
  distAfter: number;
  /** True when it was the tagged player himself. */
  tagged: boolean;
  label: string;
}

/** Search window around the predicted time and time-prior spread, per kind (s). */
export interface KindWindow {
  before: Seconds;
  after: Seconds;
  /** Spread of the time prior when the true moment is before / after the logged time. */
  sdBefore: Seconds;
  sdAfter: Seconds;
  /** Spread of the logged place, m. */
  placeSd: number;
}

/**
 * Windows, common practice for hand-tagged logs (see ../shared/REFERENCES.md): passes to a
 * fraction of a second; shots are often logged late; goal kicks are seconds off and
 * clicked at a generic spot.
 */
export function kindWindow(kind: EventKind): KindWindow {
  switch (kind) {
    case 'pass': return { before: 2.5, after: 2.5, sdBefore: 0.6, sdAfter: 0.6, placeSd: 2.5 };
    case 'shot': return { before: 6, after: 2.5, sdBefore: 2.5, sdAfter: 0.8, placeSd: 3 };
    case 'goal': return { before: 5, after: 3, sdBefore: 1.5, sdAfter: 1.0, placeSd: 6 };
    case 'goal_kick': return { before: 15, after: 15, sdBefore: 6, sdAfter: 6, placeSd: 12 };
    case 'kick_off': case 'period_start': return { before: 8, after: 8, sdBefore: 1.5, sdAfter: 1.5, placeSd: 3 };
    default: return { before: 6, after: 6, sdBefore: 1.0, sdAfter: 1.0, placeSd: 3 }; // other restarts
  }
}

/** Which candidates an event may take. */
export function candidateKindsFor(kind: EventKind): CandidateKind[] {
  if (kind === 'goal') return ['goal_line'];
  if (isRestartKind(kind) || kind === 'period_start') return ['restart', 'touch'];
  if (kind === 'pass' || kind === 'shot') return ['touch', 'restart'];
  return [];
}

/** Score of leaving an event at its logged time (no candidate good enough). */
export const NULL_SCORE = -7;

export function scoreCandidate(e: MatchEvent, c: Candidate, predicted: Seconds, player: PlayerAtBall | undefined): number {
  const w = kindWindow(e.kind);
  const dt = c.t - predicted;
  const sd = dt < 0 ? w.sdBefore : w.sdAfter;
  let s = -0.5 * (dt / sd) ** 2;
  const restartEvent = isRestartKind(e.kind) || e.kind === 'period_start';
  if (c.kind !== 'goal_line') {
    if (player) {
      const d = Math.max(0, player.dist - 0.8);
      s += Math.max(-12, -0.5 * (d / 0.8) ** 2) * (player.tagged ? 1 : 0.5);
    }
    s += Math.max(-1, Math.min(2, 1.5 * Math.log(c.dv / 4)));
    // Kick signature: the ball leaves fast and leaves the player (passes leave at 8 m/s
    // or more, common practice); a first touch or a dribble keeps it at his feet.
    if (e.kind !== 'goal') {
      s += c.speedAfter >= 8 ? 0.5 : -0.7 * Math.min(6, 8 - c.speedAfter);
      if (player && player.distAfter < 1.5) s -= 3;
    }
  }
  if (e.x !== undefined && e.y !== undefined) {
    const d = Math.hypot(c.x - e.x, c.y - e.y);
    s += Math.max(-8, -0.5 * (d / w.placeSd) ** 2);
  }
  if (restartEvent) {
    const wanted = e.kind === 'period_start' ? 'kick_off' : e.kind;
    s += c.kind === 'restart' ? (c.restartKind === wanted ? 3 : 1.5) : -4;
  } else if (c.kind === 'restart') s -= 3;
  return s;
}
