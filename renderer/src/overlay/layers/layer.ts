/**
 * The one interface every overlay layer implements (one file per layer in this folder).
 * A layer owns a pixi Graphics and, if it writes text, a label pool; `draw` redraws both
 * from the scene through the view's projector. The same code draws the footage view, the
 * 2-D pitch view and exported clips.
 */
import type { Graphics } from 'pixi.js';
import type { LayerId, OverlayScene, ScenePlayer, TeamKey } from '../contract.ts';
import type { LabelPool } from '../labels.ts';
import type { Projector } from '../project.ts';

export interface LayerContext {
  scene: OverlayScene;
  view: Projector;
  g: Graphics;
  labels: LabelPool;
  /** Teams this layer is switched on for. */
  teams: TeamKey[];
}

export interface OverlayLayer {
  id: LayerId;
  /** Name shown on the toggle. */
  title: string;
  /** Toggle key on the Watch screen (home = key, away = Shift+key). */
  key: string;
  /** Drawn under positions (space, shape) or over them (lines, labels). */
  order: number;
  draw(ctx: LayerContext): void;
}

export function playersOf(scene: OverlayScene, team: TeamKey, withKeeper = true): ScenePlayer[] {
  return scene.players.filter((p) => p.team === team && (withKeeper || !p.goalkeeper));
}

/** Draws a pitch polyline (straight pieces) through the projector, skipping unseen points. */
export function strokePitchPath(g: Graphics, view: Projector, pts: ArrayLike<number>, closed = false): void {
  let started = false;
  const n = pts.length / 2;
  for (let i = 0; i < n; i++) {
    const p = view.project(pts[2 * i], pts[2 * i + 1]);
    if (!p) {
      started = false;
      continue;
    }
    if (!started) g.moveTo(p[0], p[1]);
    else g.lineTo(p[0], p[1]);
    started = true;
  }
  if (closed && started && n > 2) g.closePath();
}

/**
 * The part of segment a→b inside the output (plus a margin), as fractions [t0, t1] of it, or
 * null when none is (Liang–Barsky clipping).
 */
export function visibleSpan(a: [number, number], b: [number, number], width: number, height: number, margin: number): [number, number] | null {
  let t0 = 0;
  let t1 = 1;
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const edges: [number, number][] = [
    [-dx, a[0] + margin],
    [dx, width + margin - a[0]],
    [-dy, a[1] + margin],
    [dy, height + margin - a[1]],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const r = q / p;
    if (p < 0) t0 = Math.max(t0, r);
    else t1 = Math.min(t1, r);
    if (t0 > t1) return null;
  }
  return [t0, t1];
}

/**
 * A dashed straight segment between two pitch points (dash and gap in output pixels). Only the
 * dashes inside the picture are drawn: a pitch corner near the horizon can project thousands of
 * pixels away, and every dash is a sub-path pixi strokes on its own (that once made the
 * length-and-width box the dearest layer, 21 ms of a 30 ms frame). Dashes keep their phase
 * from `a`, so they do not crawl as the far end moves off screen.
 */
export function dashedPitchLine(g: Graphics, view: Projector, x0: number, y0: number, x1: number, y1: number, dash: number, gap: number): void {
  const a = view.project(x0, y0);
  const b = view.project(x1, y1);
  if (!a || !b) return;
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  if (len < 1e-6) return;
  const span = visibleSpan(a, b, view.width, view.height, dash + gap);
  if (!span) return;
  const ux = (b[0] - a[0]) / len;
  const uy = (b[1] - a[1]) / len;
  const period = dash + gap;
  const end = span[1] * len;
  for (let s = Math.floor((span[0] * len) / period) * period; s < end; s += period) {
    const e = Math.min(len, s + dash);
    g.moveTo(a[0] + ux * s, a[1] + uy * s).lineTo(a[0] + ux * e, a[1] + uy * e);
  }
}
