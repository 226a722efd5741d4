/**
 * Where on the field a restart may be taken, from the Laws of the Game: Law 1 markings
 * (centre mark, penalty mark 11 m, goal area 5.5 m beyond the posts and 5.5 m deep,
 * corner arc 1 m, goal 7.32 m) and Laws 8, 13–17 for which restart goes where.
 */
import type { PitchSize, RestartKind } from '../../shared-types/domain.ts';

export const LAW1 = {
  goalWidth: 7.32,
  goalAreaDepth: 5.5,
  goalAreaBeyondPost: 5.5,
  penaltyMarkDist: 11,
  cornerArcR: 1,
  centreCircleR: 9.15,
} as const;

/** How far off a marking a placed ball may sit and still count (tracking error, placement). */
export interface PlaceTolerance {
  spot: number;
  line: number;
}
const DEFAULT_TOL: PlaceTolerance = { spot: 1.2, line: 0.6 };

/**
 * The restart a ball standing at (x, y) fits, by the Laws' geometry; free kick elsewhere.
 * `restartKindAt(0.2, -0.1, { length: 105, width: 68 }) -> 'kick_off'`
 */
export function restartKindAt(x: number, y: number, pitch: PitchSize, tol: PlaceTolerance = DEFAULT_TOL): RestartKind {
  const hl = pitch.length / 2;
  const hw = pitch.width / 2;
  const ax = Math.abs(x);
  const ay = Math.abs(y);
  if (Math.hypot(x, y) <= tol.spot) return 'kick_off';
  if (Math.hypot(ax - (hl - LAW1.penaltyMarkDist), y) <= tol.spot) return 'penalty';
  if (Math.hypot(ax - hl, ay - hw) <= LAW1.cornerArcR + tol.line) return 'corner';
  const goalAreaHalfW = LAW1.goalWidth / 2 + LAW1.goalAreaBeyondPost;
  if (ax >= hl - LAW1.goalAreaDepth - tol.line && ax <= hl + tol.line && ay <= goalAreaHalfW + tol.line) return 'goal_kick';
  if (ay >= hw - tol.line) return 'throw_in';
  return 'free_kick';
}

/** True when (x, y) is off the field by more than `margin` metres (ball wholly over a line). */
export function outOfField(x: number, y: number, pitch: PitchSize, margin = 0.2): boolean {
  return Math.abs(x) > pitch.length / 2 + margin || Math.abs(y) > pitch.width / 2 + margin;
}
