/**
 * What is burned into one exported picture besides the footage: the Watch screen's overlay
 * layers (buildOverlayScene + the overlay renderer), the match clock caption and, for the
 * first seconds when there is no title card, the clip title. Both export paths draw through
 * here, so a clip looks the same whichever path wrote it.
 *
 *   const draw = overlayPainter(plan, overlay, { width, height, caption: true, titleS: 2 });
 *   draw(ctx, index, srcT, clipS);   // after the picture itself (embedded) or onto a clear canvas (native)
 */
import { footageToTracking } from '../../../engine/fit/footage-map.ts';
import { buildOverlayScene } from '../overlay/scene.ts';
import { LAYER_IDS, type LayerSelection } from '../overlay/contract.ts';
import type { OverlayInput } from './embedded.ts';
import { matchClockText, trackingToEventClock, type ClipPlan } from './plan.ts';

/** The layer selection of a clip: the listed layers on for both teams. */
export function layerSelection(layers: string[]): LayerSelection {
  const sel = {} as LayerSelection;
  for (const id of LAYER_IDS) sel[id] = { home: layers.includes(id), away: layers.includes(id) };
  return sel;
}

/** Caption and title drawn over the picture (canvas 2-D), scaled to the output height. */
export function drawCaption(ctx: OffscreenCanvasRenderingContext2D | CanvasRenderingContext2D, w: number, h: number, clock: string | undefined, title: string | undefined): void {
  const u = h / 720;
  ctx.save();
  ctx.textBaseline = 'middle';
  if (clock) {
    ctx.font = `600 ${Math.round(22 * u)}px system-ui, sans-serif`;
    const tw = ctx.measureText(clock).width;
    ctx.fillStyle = 'rgba(12,16,20,0.78)';
    ctx.fillRect(16 * u, h - 52 * u, tw + 24 * u, 36 * u);
    ctx.fillStyle = '#f4f4f4';
    ctx.fillText(clock, 28 * u, h - 34 * u);
  }
  if (title) {
    ctx.font = `700 ${Math.round(30 * u)}px system-ui, sans-serif`;
    const tw = ctx.measureText(title).width;
    ctx.fillStyle = 'rgba(12,16,20,0.82)';
    ctx.fillRect(0, 24 * u, tw + 56 * u, 52 * u);
    ctx.fillStyle = '#ffd27a';
    ctx.fillRect(0, 24 * u, 8 * u, 52 * u);
    ctx.fillStyle = '#ffffff';
    ctx.fillText(title, 28 * u, 50 * u);
  }
  ctx.restore();
}

export interface PainterOptions {
  width: number;
  height: number;
  /** Draw the match clock caption. */
  caption: boolean;
  /** Seconds the lower-third title stays at the start (0: none, e.g. when a title card is on). */
  titleS: number;
}

export type OverlayPainter = (ctx: OffscreenCanvasRenderingContext2D | CanvasRenderingContext2D, index: number, srcT: number, clipS: number) => void;

export function overlayPainter(plan: ClipPlan, ov: OverlayInput | undefined, opts: PainterOptions): OverlayPainter {
  const { width, height } = opts;
  const settings = ov ? { ...ov.settings, layers: layerSelection(plan.layers) } : undefined;
  return (ctx, index, srcT, clipS) => {
    if (ov && settings) {
      const scene = buildOverlayScene(ov.data, { index, t: srcT }, settings, { width, height });
      ov.renderer.draw(scene);
      // Drawing into its own canvas (the native path hands it over): nothing to copy.
      if (ov.renderer.canvas !== ctx.canvas) ctx.drawImage(ov.renderer.canvas, 0, 0, width, height);
    }
    let clock: string | undefined;
    if (opts.caption) {
      const m = ov?.data.fit ? footageToTracking(ov.data.fit, srcT) : undefined;
      clock = m ? matchClockText(m.period, trackingToEventClock(ov?.eventFit, m.period, m.t)) : undefined;
    }
    drawCaption(ctx, width, height, clock, clipS < opts.titleS ? plan.title : undefined);
  };
}
