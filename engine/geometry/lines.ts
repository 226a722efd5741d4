/**
 * Lines drawn across a team: the offside line (Law 11), the back line, team lines from
 * Jenks natural breaks on depth, and the distance between two players. Depth is measured
 * towards a team's own goal line, from the direction of attack recorded per period.
 */
import type { TeamSide } from '../../shared-types/domain.ts';
import { jenksGroups } from './jenks.ts';

/** One player at one moment, pitch metres. */
export interface PlayerSpot {
  id: string;
  team: TeamSide;
  x: number;
  y: number;
  /** The team's goalkeeper (excluded from the back line, team lines and shape). */
  goalkeeper?: boolean;
}

export type HomeAttacks = 'positive_x' | 'negative_x';

/** +1 when the team attacks towards +x in this period, −1 otherwise. */
export function attackSign(team: TeamSide, homeAttacks: HomeAttacks): 1 | -1 {
  const home = homeAttacks === 'positive_x' ? 1 : -1;
  return team === 'home' ? home : (-home as 1 | -1);
}

const other = (t: TeamSide): TeamSide => (t === 'home' ? 'away' : 'home');

export interface OffsideLine {
  /** x of the line in pitch metres. */
  x: number;
  /** What placed it (Law 11): the second-last opponent, the ball when nearer the goal line, or the halfway line. */
  by: 'second_last_defender' | 'ball' | 'halfway';
  /** The defender it runs through when `by` is second_last_defender. */
  playerId?: string;
}

/**
 * The offside line against the attackers of `defending`'s opponents: through the
 * second-last defender (goalkeeper counted), or the ball if that is nearer the goal line,
 * and never in the attackers' own half (Law 11). Null with fewer than two defenders.
 * `offsideLine(spots, { x: 10, y: 0 }, 'away', 'positive_x') -> { x: 38.2, by: 'second_last_defender', playerId: 'a4' }`
 */
export function offsideLine(spots: readonly PlayerSpot[], ball: { x: number; y: number } | null, defending: TeamSide, homeAttacks: HomeAttacks): OffsideLine | null {
  const a = attackSign(other(defending), homeAttacks);
  const defenders = spots.filter((p) => p.team === defending && Number.isFinite(p.x)).sort((p, q) => a * q.x - a * p.x);
  if (defenders.length < 2) return null;
  const second = defenders[1];
  let best: OffsideLine = { x: second.x, by: 'second_last_defender', playerId: second.id };
  if (ball && Number.isFinite(ball.x) && a * ball.x > a * best.x) best = { x: ball.x, by: 'ball' };
  if (a * best.x < 0) best = { x: 0, by: 'halfway' };
  return best;
}

/**
 * The back line: x of the team's deepest outfield player (goalkeeper left out).
 * `backLine(spots, 'home', 'positive_x') -> { x: -31.5, playerId: 'h5' }`
 */
export function backLine(spots: readonly PlayerSpot[], team: TeamSide, homeAttacks: HomeAttacks): { x: number; playerId: string } | null {
  const a = attackSign(team, homeAttacks);
  const out = spots.filter((p) => p.team === team && !p.goalkeeper && Number.isFinite(p.x));
  if (out.length === 0) return null;
  const deepest = out.reduce((m, p) => (a * p.x < a * m.x ? p : m));
  return { x: deepest.x, playerId: deepest.id };
}

export interface TeamLine {
  /** Mean x of the group, pitch metres. */
  x: number;
  /** Depth range of the group. */
  minX: number;
  maxX: number;
  playerIds: string[];
}

/**
 * Team lines: the outfield players split by Jenks natural breaks on x into k groups,
 * ordered from the team's own goal forwards (defence, midfield, attack for k = 3).
 * `teamLines(spots, 'home', 'positive_x', 3).map((l) => l.playerIds.length) -> [4, 4, 2]`
 */
export function teamLines(spots: readonly PlayerSpot[], team: TeamSide, homeAttacks: HomeAttacks, k = 3): TeamLine[] {
  const a = attackSign(team, homeAttacks);
  const out = spots.filter((p) => p.team === team && !p.goalkeeper && Number.isFinite(p.x));
  // Group on depth (a·x) so the groups come out ordered from the own goal forwards.
  const groups = jenksGroups(out.map((p) => a * p.x), k);
  const used = new Set<string>();
  return groups.map((g) => {
    const lo = g[0];
    const hi = g[g.length - 1];
    const members = out.filter((p) => !used.has(p.id) && a * p.x >= lo && a * p.x <= hi).slice(0, g.length);
    members.forEach((p) => used.add(p.id));
    const xs = members.map((p) => p.x);
    return { x: xs.reduce((s, v) => s + v, 0) / xs.length, minX: Math.min(...xs), maxX: Math.max(...xs), playerIds: members.map((p) => p.id) };
  });
}

/**
 * Distance in metres between two players at one moment; null when either is missing.
 * `playerDistance(spots, 'h4', 'h5') -> 12.3`
 */
export function playerDistance(spots: readonly PlayerSpot[], a: string, b: string): number | null {
  const p = spots.find((s) => s.id === a);
  const q = spots.find((s) => s.id === b);
  if (!p || !q || !Number.isFinite(p.x + p.y + q.x + q.y)) return null;
  return Math.hypot(p.x - q.x, p.y - q.y);
}

/**
 * Which player of each team is the goalkeeper in a period: the one whose median x lies
 * deepest towards the team's own goal (common practice when the source does not say).
 * `guessKeepers([{ id: 'h1', team: 'home', xs: [-48, -47] }, …], 'positive_x') -> { home: 'h1', away: 'a1' }`
 */
export function guessKeepers(players: readonly { id: string; team: TeamSide; xs: ArrayLike<number> }[], homeAttacks: HomeAttacks): Partial<Record<TeamSide, string>> {
  const out: Partial<Record<TeamSide, string>> = {};
  const best: Partial<Record<TeamSide, number>> = {};
  for (const p of players) {
    const xs = Array.from(p.xs).filter(Number.isFinite).sort((a, b) => a - b);
    if (xs.length === 0) continue;
    const depth = attackSign(p.team, homeAttacks) * xs[xs.length >> 1];
    if (best[p.team] === undefined || depth < best[p.team]!) {
      best[p.team] = depth;
      out[p.team] = p.id;
    }
  }
  return out;
}
