/** Dots: one marker per player in the team's colour and shape, shirt number on it. */
import type { OverlayLayer } from './layer.ts';
import { playersOf } from './layer.ts';

export const dotsLayer: OverlayLayer = {
  id: 'dots',
  title: 'Dots',
  key: 'D',
  order: 50,
  draw({ scene, view, g, labels, teams }) {
    const r = 7.5 * view.unit;
    for (const team of teams) {
      const st = scene.teams[team];
      for (const p of playersOf(scene, team)) {
        const c = view.project(p.x, p.y);
        if (!c) continue;
        const [u, v] = c;
        if (st.shape === 'diamond') {
          const d = r * 1.25;
          g.poly([u, v - d, u + d, v, u, v + d, u - d, v]);
        } else g.circle(u, v, r);
        g.fill({ color: st.colour, alpha: 0.92 }).stroke({ color: st.outline, width: 1.6 * view.unit, alpha: 1 });
        if (p.goalkeeper) g.circle(u, v, r + 3 * view.unit).stroke({ color: st.colour, width: 1.2 * view.unit });
        if (p.shirt !== undefined) labels.place(String(p.shirt), u, v + 0.5, 8.5 * view.unit, st.label);
      }
    }
  },
};
