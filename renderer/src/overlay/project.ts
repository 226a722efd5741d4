/**
 * Pitch metres -> output pixels for a scene's view. Homographies map straight lines to
 * straight lines, so layers project segment end points and polygon vertices only.
 *
 *   const p = viewProjector(scene);  p.project(0, 0)  -> [u, v] | null (behind the camera)
 */
import type { OverlayScene } from './contract.ts';

export interface Projector {
  /** Output pixels of pitch point (x, y), or null when it cannot be seen (behind the camera). */
  project(x: number, y: number): [number, number] | null;
  /** Output pixels per pitch metre near (x, y) (for sizes that follow perspective). */
  scaleAt(x: number, y: number): number;
  /** Marker size unit: 1 at 720 output lines, so markers read the same at 720p and 1080p. */
  unit: number;
  /** Output size in pixels (what is worth drawing). */
  width: number;
  height: number;
}

export function viewProjector(scene: OverlayScene): Projector {
  if (scene.view.kind === 'pitch') {
    // The pitch view is small beside the footage: markers scale with the pitch drawn, not the output height.
    const unit = Math.max(0.7, Math.min(scene.width / 105, scene.height / 68) / 9);
    const { margin } = scene.view;
    const { length, width } = scene.pitch;
    const s = Math.min((scene.width - 2 * margin) / length, (scene.height - 2 * margin) / width);
    const ox = scene.width / 2;
    const oy = scene.height / 2;
    return {
      project: (x, y) => [ox + x * s, oy - y * s],
      scaleAt: () => s,
      unit,
      width: scene.width,
      height: scene.height,
    };
  }
  const unit = Math.max(0.5, scene.height / 720);
  const h = scene.view.homography;
  const sx = scene.width / scene.view.imageWidth;
  const sy = scene.height / scene.view.imageHeight;
  const project = (x: number, y: number): [number, number] | null => {
    const w = h[6] * x + h[7] * y + h[8];
    if (!(w > 1e-9)) return null;
    return [((h[0] * x + h[1] * y + h[2]) / w) * sx, ((h[3] * x + h[4] * y + h[5]) / w) * sy];
  };
  return {
    project,
    scaleAt: (x, y) => {
      const a = project(x - 0.5, y);
      const b = project(x + 0.5, y);
      return a && b ? Math.hypot(b[0] - a[0], b[1] - a[1]) : 0;
    },
    unit,
    width: scene.width,
    height: scene.height,
  };
}
