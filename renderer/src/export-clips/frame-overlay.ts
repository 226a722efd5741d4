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
import { drawCaption, layerSelection, type OverlayInput } from './embedded.ts';
import { matchClockText, trackingToEventClock, type ClipPlan } from './plan.ts';

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
