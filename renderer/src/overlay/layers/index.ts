/** Every overlay layer, in drawing order (under to over). */
import type { OverlayLayer } from './layer.ts';
import { ballLayer } from './ball.ts';
import { distanceLayer } from './distance.ts';
import { dotsLayer } from './dots.ts';
import { trailsLayer } from './trails.ts';

export const LAYERS: OverlayLayer[] = [trailsLayer, dotsLayer, ballLayer, distanceLayer].sort((a, b) => a.order - b.order);

export type { OverlayLayer, LayerContext } from './layer.ts';
