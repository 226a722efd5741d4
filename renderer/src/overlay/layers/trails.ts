/** Trails: where each player (and the ball) was over the last seconds, fading with age. */
import { BALL_FILL } from '../style.ts';
import type { OverlayLayer } from './layer.ts';

export const trailsLayer: OverlayLayer = {
  id: 'trails',
  title: 'Trails',
  key: 'T',
  order: 20,
  draw({ scene, view, g, teams }) {
    const w = 2 * view.unit;
    for (const tr of scene.trails) {
      const colour = tr.team === 'ball' ? BALL_FILL : scene.teams[tr.team].colour;
      if (tr.team !== 'ball' && !teams.includes(tr.team)) continue;
      // The ball's trail goes with the ball layer.
      if (tr.team === 'ball' && !(scene.layers.ball.home || scene.layers.ball.away)) continue;
      const n = tr.points.length / 2;
      // Four age bands, older fainter: four strokes instead of one per segment.
      const bands = 4;
      for (let b = 0; b < bands; b++) {
        const from = Math.floor((b * (n - 1)) / bands);
        const to = Math.floor(((b + 1) * (n - 1)) / bands);
        let started = false;
        for (let i = from; i <= to; i++) {
          const p = view.project(tr.points[2 * i], tr.points[2 * i + 1]);
          if (!p) continue;
          if (!started) g.moveTo(p[0], p[1]);
          else g.lineTo(p[0], p[1]);
          started = true;
        }
        if (started) g.stroke({ color: colour, width: w, alpha: 0.15 + (0.55 * (b + 1)) / bands, cap: 'round', join: 'round' });
      }
    }
  },
};
