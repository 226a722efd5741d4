/** Space: each player's Voronoi region clipped to the pitch, tinted in the team colour. */
import { derivedOf } from '../derived.ts';
import type { OverlayLayer } from './layer.ts';
import { strokePitchPath } from './layer.ts';

export const spaceLayer: OverlayLayer = {
  id: 'space',
  title: 'Space',
  key: 'V',
  order: 10,
  draw({ scene, view, g, teams }) {
    const { cells } = derivedOf(scene);
    for (const team of teams) {
      const colour = scene.teams[team].colour;
      let any = false;
      for (const cell of cells) {
        if (cell.team !== team || cell.polygon.length < 3) continue;
        strokePitchPath(g, view, cell.polygon.flatMap((p) => [p.x, p.y]), true);
        any = true;
      }
      if (any) g.fill({ color: colour, alpha: 0.16 }).stroke({ color: 0xffffff, width: 0.8 * view.unit, alpha: 0.35 });
    }
  },
};
