/** Shape: the convex hull of a team's outfield players, a light fill with an outline. */
import { derivedOf } from '../derived.ts';
import type { OverlayLayer } from './layer.ts';
import { strokePitchPath } from './layer.ts';

export const hullLayer: OverlayLayer = {
  id: 'hull',
  title: 'Shape',
  key: 'H',
  order: 15,
  draw({ scene, view, g, teams }) {
    for (const team of teams) {
      const hull = derivedOf(scene)[team].hull;
      if (hull.length < 3) continue;
      const flat = hull.flatMap((p) => [p.x, p.y]);
      strokePitchPath(g, view, flat, true);
      g.fill({ color: scene.teams[team].colour, alpha: 0.14 }).stroke({ color: scene.teams[team].colour, width: 1.5 * view.unit, alpha: 0.7 });
    }
  },
};
