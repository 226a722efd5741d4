/**
 * Geometry derived from a scene's positions, computed once per scene by the geometry
 * engine (engine/geometry/) and shared by the layers that draw it.
 *
 *   derivedOf(scene).home.offsideX   // x (m) of the offside line home attackers face... see below
 */
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

function compute(_scene: OverlayScene): SceneGeometry {
  const empty = (): TeamGeometry => ({ lines: [], hull: [] });
  return { home: empty(), away: empty(), cells: [] };
}
