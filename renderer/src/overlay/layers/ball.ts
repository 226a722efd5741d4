/** Ball: a small white ring with a dark rim (no team uses white markers). */
import { BALL_FILL, BALL_OUTLINE } from '../style.ts';
import type { OverlayLayer } from './layer.ts';

export const ballLayer: OverlayLayer = {
  id: 'ball',
  title: 'Ball',
  key: 'B',
  order: 60,
  draw({ scene, view, g, teams }) {
    if (!scene.ball || !teams.length) return;
    const c = view.project(scene.ball.x, scene.ball.y);
    if (!c) return;
    const r = 4 * view.unit;
    g.circle(c[0], c[1], r).fill({ color: BALL_FILL }).stroke({ color: BALL_OUTLINE, width: 1.5 * view.unit });
    g.circle(c[0], c[1], r * 0.35).fill({ color: BALL_OUTLINE });
  },
};
