/**
 * Geometry derived from a scene's positions, computed once per scene by the geometry
 * engine (engine/geometry/) and shared by the layers that draw it.
 *
 *   derivedOf(scene).away.offsideX   // x (m) of the offside line of the away defence (Law 11)
 */
import { backLine, offsideLine, teamLines, type PlayerSpot } from '../../../engine/geometry/lines.ts';
import { teamShape } from '../../../engine/geometry/shape.ts';
import { pitchSpace } from '../../../engine/geometry/space.ts';
import type { OverlayScene, ScenePlayer, TeamKey } from './contract.ts';

export interface Pt {
  x: number;
  y: number;
}

export interface TeamGeometry {
  /** Offside line of this team as the DEFENDING team (second-last defender or ball, Law 11). */
  offsideX?: number;
  /** Depth of this team's last outfield defender. */
  backX?: number;
  /** Outfield players in Jenks depth groups, from the own goal outwards. */
  lines: ScenePlayer[][];
  hull: Pt[];
  extent?: { minX: number; maxX: number; minY: number; maxY: number; length: number; width: number };
}

export interface SceneGeometry {
  home: TeamGeometry;
  away: TeamGeometry;
  /** Voronoi cell of every player, clipped to the pitch. */
  cells: { id: string; team: TeamKey; polygon: Pt[] }[];
}

/** +1 when `team`'s own goal is at +x at this moment, else -1. */
export function ownGoalSign(team: TeamKey, homeAttacks: 'positive_x' | 'negative_x'): 1 | -1 {
  const attacksPositive = (team === 'home') === (homeAttacks === 'positive_x');
  return attacksPositive ? -1 : 1;
}

const cache = new WeakMap<OverlayScene, SceneGeometry>();

export function derivedOf(scene: OverlayScene): SceneGeometry {
  let d = cache.get(scene);
  if (!d) cache.set(scene, (d = compute(scene)));
  return d;
}

function compute(scene: OverlayScene): SceneGeometry {
  const spots: PlayerSpot[] = scene.players.map((p) => ({ id: p.id, team: p.team, x: p.x, y: p.y, keeper: p.goalkeeper }));
  const byId = new Map(scene.players.map((p) => [p.id, p]));
  const ball = scene.ball ? { x: scene.ball.x, y: scene.ball.y } : null;
  const team = (t: TeamKey): TeamGeometry => {
    const off = offsideLine(spots, ball, t, scene.homeAttacks);
    const back = backLine(spots, t, scene.homeAttacks);
    const lines = teamLines(spots, t, scene.homeAttacks, scene.teamLineCount ?? 3).map((l) => l.playerIds.flatMap((id) => byId.get(id) ?? []));
    const shape = teamShape(spots, t);
    const hull = (shape?.hull ?? []).map(([x, y]) => ({ x, y }));
    const xs = hull.map((p) => p.x);
    const ys = hull.map((p) => p.y);
    return {
      ...(off ? { offsideX: off.x } : {}),
      ...(back ? { backX: back.x } : {}),
      lines,
      hull,
      ...(shape && hull.length ? { extent: { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys), length: shape.length, width: shape.width } } : {}),
    };
  };
  const cells = scene.layers.space.home || scene.layers.space.away ? pitchSpace(spots, scene.pitch).cells.map((c) => ({ id: c.id, team: c.team as TeamKey, polygon: c.polygon.map(([x, y]) => ({ x, y })) })) : [];
  return { home: team('home'), away: team('away'), cells };
}
