/** Offside line: across the pitch at the second-last defender (or the ball, Law 11), per defending team. */
import { LINE_COLOUR } from '../style.ts';
import { derivedOf } from '../derived.ts';
import type { OverlayLayer } from './layer.ts';
import { dashedPitchLine } from './layer.ts';

export const offsideLayer: OverlayLayer = {
  id: 'offside',
  title: 'Offside line',
  key: 'O',
  order: 44,
  draw({ scene, view, g, labels, teams }) {
    const W = scene.pitch.width / 2;
    for (const team of teams) {
      const x = derivedOf(scene)[team].offsideX;
      if (x === undefined) continue;
      // Dashed in the defending team's colour over a pale core: reads on grass and says whose line it is.
      dashedPitchLine(g, view, x, -W, x, W, 14 * view.unit, 7 * view.unit);
      g.stroke({ color: LINE_COLOUR, width: 2.6 * view.unit, alpha: 0.95 });
      dashedPitchLine(g, view, x, -W, x, W, 14 * view.unit, 7 * view.unit);
      g.stroke({ color: scene.teams[team].colour, width: 1 * view.unit, alpha: 1 });
      const end = view.project(x, W);
      if (end) labels.place('offside', end[0], end[1] - 8 * view.unit, 9 * view.unit, LINE_COLOUR, 0.5, 1);
    }
  },
};
