/**
 * Space: the Voronoi region of every player (the part of the pitch nearer to them than to
 * anyone else) clipped to the pitch rectangle, and each team's share. Uses d3-delaunay
 * (a dependency; plain computation, no DOM) for its care with co-circular and repeated
 * points; at 22 players a plain O(n²) half-plane clipping is about as fast
 * (bench/geometry.bench.ts), so speed is not the reason.
 */
import { Delaunay } from 'd3-delaunay';
import type { PitchSize, TeamSide } from '../../shared-types/domain.ts';
import type { Vec2 } from './homography.ts';
import type { PlayerSpot } from './lines.ts';
import { polygonArea } from './shape.ts';

export interface SpaceCell {
  id: string;
  team: TeamSide;
  /** Counter-clockwise polygon in pitch metres (y up); empty for a player off the pitch or on top of another. */
  polygon: Vec2[];
  area: number;
}

export interface TeamSpace {
  cells: SpaceCell[];
  /** Square metres per team; the two add up to the pitch area when every cell exists. */
  area: Record<TeamSide, number>;
}

/**
 * Voronoi regions of the players on a length × width pitch (centre origin).
 * `pitchSpace(spots, { length: 105, width: 68 }).area -> { home: 3711.2, away: 3428.8 }`
 */
export function pitchSpace(spots: readonly PlayerSpot[], pitch: PitchSize): TeamSpace {
  const players = spots.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y));
  const hl = pitch.length / 2;
  const hw = pitch.width / 2;
  const area: Record<TeamSide, number> = { home: 0, away: 0 };
  if (players.length === 0) return { cells: [], area };
  const delaunay = Delaunay.from(players, (p) => p.x, (p) => p.y);
  const voronoi = delaunay.voronoi([-hl, -hw, hl, hw]);
  const cells = players.map((p, i): SpaceCell => {
    const poly = voronoi.cellPolygon(i);
    // d3 closes the ring by repeating the first point.
    const polygon: Vec2[] = poly ? poly.slice(0, -1).map((q): Vec2 => [q[0], q[1]]) : [];
    const a = Math.abs(polygonArea(polygon));
    area[p.team] += a;
    return { id: p.id, team: p.team, polygon: polygonArea(polygon) < 0 ? polygon.reverse() : polygon, area: a };
  });
  return { cells, area };
}
