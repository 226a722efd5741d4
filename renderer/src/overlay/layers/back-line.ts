/** Back line: the depth of a team's last outfield defender, a solid thin line in the team colour. */
import { derivedOf } from '../derived.ts';
import type { OverlayLayer } from './layer.ts';

export const backLineLayer: OverlayLayer = {
  id: 'backLine',
  title: 'Back line',
  key: 'E',
  order: 42,
  draw({ scene, view, g, teams }) {
    const W = scene.pitch.width / 2;
    for (const team of teams) {
      const x = derivedOf(scene)[team].backX;
      if (x === undefined) continue;
      const a = view.project(x, -W);
      const b = view.project(x, W);
      if (!a || !b) continue;
      g.moveTo(a[0], a[1]).lineTo(b[0], b[1]).stroke({ color: scene.teams[team].colour, width: 2 * view.unit, alpha: 0.85 });
    }
  },
};
