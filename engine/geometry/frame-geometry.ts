/**
 * Everything the overlay's line, shape and space layers need for one displayed moment, in
 * one call: per team the offside line it defends (Law 11), its back line, Jenks team lines,
 * shape; and the Voronoi space of all players. Plain data in, plain data out.
 */
import type { PitchSize, TeamSide } from '../../shared-types/domain.ts';
import { backLine, offsideLine, teamLines, type HomeAttacks, type OffsideLine, type PlayerSpot, type TeamLine } from './lines.ts';
import { teamShape, type TeamShape } from './shape.ts';
import { pitchSpace, type TeamSpace } from './space.ts';

export interface TeamFrameGeometry {
  /** The offside line this team holds as the defending side; null with < 2 players. */
  offside: OffsideLine | null;
  back: { x: number; playerId: string } | null;
  /** From the own goal forwards. */
  lines: TeamLine[];
  shape: TeamShape | null;
}

export interface FrameGeometry {
  home: TeamFrameGeometry;
  away: TeamFrameGeometry;
  space: TeamSpace;
}

/**
 * `frameGeometry(spots, { x: 3, y: -1 }, 'positive_x', { length: 105, width: 68 }).away.offside -> { x: 30, by: 'second_last_defender', playerId: 'a2' }`
 */
export function frameGeometry(spots: readonly PlayerSpot[], ball: { x: number; y: number } | null, homeAttacks: HomeAttacks, pitch: PitchSize, lineCount = 3): FrameGeometry {
  const team = (t: TeamSide): TeamFrameGeometry => ({
    offside: offsideLine(spots, ball, t, homeAttacks),
    back: backLine(spots, t, homeAttacks),
    lines: teamLines(spots, t, homeAttacks, lineCount),
    shape: teamShape(spots, t),
  });
  return { home: team('home'), away: team('away'), space: pitchSpace(spots, pitch) };
}
