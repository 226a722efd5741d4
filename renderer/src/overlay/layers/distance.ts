/** Distance: a line between two chosen players, labelled in metres at its middle. */
import { LINE_COLOUR } from '../style.ts';
import type { OverlayLayer } from './layer.ts';

export const distanceLayer: OverlayLayer = {
  id: 'distance',
  title: 'Distance',
  key: 'Q',
  order: 80,
  draw({ scene, view, g, labels, teams }) {
    const pair = scene.distancePair;
    if (!pair) return;
    const a = scene.players.find((p) => p.id === pair[0]);
    const b = scene.players.find((p) => p.id === pair[1]);
    if (!a || !b || !(teams.includes(a.team) || teams.includes(b.team))) return;
    const pa = view.project(a.x, a.y);
    const pb = view.project(b.x, b.y);
    if (!pa || !pb) return;
    g.moveTo(pa[0], pa[1]).lineTo(pb[0], pb[1]).stroke({ color: LINE_COLOUR, width: 2 * view.unit, alpha: 0.95 });
    const metres = Math.hypot(b.x - a.x, b.y - a.y);
    const mx = (pa[0] + pb[0]) / 2;
    const my = (pa[1] + pb[1]) / 2;
    const text = `${metres.toFixed(1)} m`;
    const s = 11 * view.unit;
    g.roundRect(mx - text.length * s * 0.33, my - s * 0.8, text.length * s * 0.66, s * 1.6, 3 * view.unit).fill({ color: 0x111111, alpha: 0.75 });
    labels.place(text, mx, my, s, LINE_COLOUR);
  },
};
