/** Team lines: players of each Jenks depth group joined across the pitch (defence, midfield, attack). */
import { derivedOf } from '../derived.ts';
import type { OverlayLayer } from './layer.ts';

export const teamLinesLayer: OverlayLayer = {
  id: 'teamLines',
  title: 'Team lines',
  key: 'I',
  order: 40,
  draw({ scene, view, g, teams }) {
    for (const team of teams) {
      const colour = scene.teams[team].colour;
      for (const group of derivedOf(scene)[team].lines) {
        const pts = [...group].sort((a, b) => a.y - b.y);
        if (pts.length < 2) continue;
        let started = false;
        for (const p of pts) {
          const c = view.project(p.x, p.y);
          if (!c) continue;
          if (!started) g.moveTo(c[0], c[1]);
          else g.lineTo(c[0], c[1]);
          started = true;
        }
        g.stroke({ color: colour, width: 2.2 * view.unit, alpha: 0.8, join: 'round' });
      }
    }
  },
};
