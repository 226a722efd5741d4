/**
 * The overlay renderer: pixi.js (WebGL, or its canvas renderer where WebGL is missing —
 * never WebGPU, which draws nothing on this software stack) onto a transparent canvas.
 * Antialiasing is off: about 3x faster on software rendering, and markers are large
 * enough at 720p not to need it.
 *
 *   const r = await createOverlayRenderer({ width: 1280, height: 720 });
 *   r.draw(scene);   // synchronous; r.canvas now shows the scene
 */
// The app's content security policy forbids eval; pixi's shader and uniform code then needs its eval-free polyfills.
import 'pixi.js/unsafe-eval';
import { autoDetectRenderer, Container, Graphics, type Renderer } from 'pixi.js';
import type { CreateOverlayRenderer, LayerId, OverlayRenderer, OverlayScene, TeamKey } from './contract.ts';
import { LabelPool } from './labels.ts';
import { LAYERS } from './layers/index.ts';
import { strokePitchPath } from './layers/layer.ts';
import { viewProjector } from './project.ts';
import { webglIsSoftware } from './software-webgl.ts';

const TEAMS: TeamKey[] = ['home', 'away'];

/** 'auto' (no preference): the canvas renderer when WebGL is only a software rasteriser. */
function preferCanvas(prefer: 'webgl' | 'canvas' | 'auto' | undefined): boolean {
  if (prefer === 'canvas') return true;
  if (prefer === 'webgl') return false;
  return webglIsSoftware();
}

interface LayerSlot {
  id: LayerId;
  g: Graphics;
  labels: LabelPool;
}

export const createOverlayRenderer: CreateOverlayRenderer = async (options) => {
  const renderer: Renderer = await autoDetectRenderer({
    preference: (preferCanvas(options.prefer) ? ['canvas'] : ['webgl', 'canvas']) as unknown as 'webgl',
    width: options.width,
    height: options.height,
    backgroundAlpha: 0,
    antialias: false,
    resolution: options.resolution ?? 1,
    preserveDrawingBuffer: options.preserveDrawingBuffer ?? false,
    failIfMajorPerformanceCaveat: false,
    ...(options.canvas ? { canvas: options.canvas as HTMLCanvasElement } : {}),
  });
  const stage = new Container();
  const ground = new Graphics();
  stage.addChild(ground);
  const slots: LayerSlot[] = LAYERS.map((l) => {
    const g = new Graphics();
    const labels = new LabelPool();
    stage.addChild(g, labels.container);
    return { id: l.id, g, labels };
  });
  const indicator = new Graphics();
  const indicatorLabel = new LabelPool();
  stage.addChild(indicator, indicatorLabel.container);
  const backend: 'webgl' | 'canvas' = renderer.name === 'webgl' ? 'webgl' : 'canvas';

  const draw = (scene: OverlayScene) => {
    const view = viewProjector(scene);
    ground.clear();
    indicator.clear();
    indicatorLabel.begin();
    const footage = scene.view.kind === 'footage';
    if (!footage) {
      const { length: L, width: W } = scene.pitch;
      const a = view.project(-L / 2, W / 2)!;
      const b = view.project(L / 2, -W / 2)!;
      const pad = 4 * view.unit;
      ground.rect(a[0] - pad, a[1] - pad, b[0] - a[0] + 2 * pad, b[1] - a[1] + 2 * pad).fill({ color: 0x20382a });
    }
    const showPositions = scene.live || !footage;
    if (scene.markings && (!footage || scene.showMarkings)) {
      for (const m of scene.markings) strokePitchPath(ground, view, m);
      ground.stroke({ color: footage ? 0xff3df2 : 0xdfe8e0, width: (footage ? 1.5 : 1.2) * view.unit, alpha: footage ? 0.95 : 0.6 });
    }
    for (let i = 0; i < LAYERS.length; i++) {
      const slot = slots[i];
      slot.g.clear();
      slot.labels.begin();
      const teams = showPositions ? TEAMS.filter((t) => scene.layers[slot.id]?.[t]) : [];
      if (teams.length) LAYERS[i].draw({ scene, view, g: slot.g, labels: slot.labels, teams });
      slot.labels.end();
    }
    if (!scene.live) {
      // Quiet indicator: a small grey tag in the corner, no positions on the footage.
      const s = Math.max(11, 12 * view.unit);
      const text = footage ? `${scene.notLiveReason ?? 'Not live'} · no overlay` : `${scene.notLiveReason ?? 'Not live'} · showing last live moment`;
      const w = text.length * s * 0.62 + 16 * view.unit;
      // Bottom-left: broadcast graphics (score, clock, replay marks) sit at the top.
      const top = footage ? scene.height - 10 * view.unit - s * 2 : 10 * view.unit;
      indicator.roundRect(10 * view.unit, top, w, s * 2, 4 * view.unit).fill({ color: 0x1b1b1b, alpha: 0.6 });
      indicatorLabel.place(text, 10 * view.unit + w / 2, top + s, s, 0xd0d0d0);
    }
    indicatorLabel.end();
    renderer.render(stage);
  };

  const self: OverlayRenderer = {
    draw,
    resize(width, height) {
      renderer.resize(width, height);
    },
    get canvas() {
      return renderer.canvas as HTMLCanvasElement;
    },
    backend,
    destroy() {
      stage.destroy({ children: true });
      renderer.destroy();
    },
  };
  return self;
};
