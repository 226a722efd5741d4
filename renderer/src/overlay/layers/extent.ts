/** Length and width: the depth and breadth of a team's outfield block, a dotted box with labels in metres. */
import { derivedOf } from '../derived.ts';
import type { OverlayLayer } from './layer.ts';
import { dashedPitchLine } from './layer.ts';

export const extentLayer: OverlayLayer = {
  id: 'extent',
  title: 'Length & width',
  key: 'X',
  order: 46,
  draw({ scene, view, g, labels, teams }) {
    for (const team of teams) {
      const e = derivedOf(scene)[team].extent;
      if (!e) continue;
      const c = scene.teams[team].colour;
      const d = 3 * view.unit;
      dashedPitchLine(g, view, e.minX, e.minY, e.maxX, e.minY, d, d);
      dashedPitchLine(g, view, e.maxX, e.minY, e.maxX, e.maxY, d, d);
      dashedPitchLine(g, view, e.maxX, e.maxY, e.minX, e.maxY, d, d);
      dashedPitchLine(g, view, e.minX, e.maxY, e.minX, e.minY, d, d);
      g.stroke({ color: c, width: 1.4 * view.unit, alpha: 0.9 });
      const bottom = view.project((e.minX + e.maxX) / 2, e.minY);
      const side = view.project(e.maxX, (e.minY + e.maxY) / 2);
      const s = 9 * view.unit;
      if (bottom) labels.place(`L ${e.length.toFixed(1)} m`, bottom[0], bottom[1] + 3 * view.unit, s, c, 0.5, 0);
      if (side) labels.place(`W ${e.width.toFixed(1)} m`, side[0] + 4 * view.unit, side[1], s, c, 0, 0.5);
    }
  },
};
