/** Every overlay layer, in drawing order (under to over). */
import type { OverlayLayer } from './layer.ts';
import { backLineLayer } from './back-line.ts';
import { ballLayer } from './ball.ts';
import { distanceLayer } from './distance.ts';
import { dotsLayer } from './dots.ts';
import { extentLayer } from './extent.ts';
import { hullLayer } from './hull.ts';
import { offsideLayer } from './offside.ts';
import { spaceLayer } from './space.ts';
import { teamLinesLayer } from './team-lines.ts';
import { trailsLayer } from './trails.ts';

/** Layers whose geometry the engine computes (overlay/derived.ts): listed once it is wired in. */
export const GEOMETRY_LAYERS: OverlayLayer[] = [spaceLayer, hullLayer, teamLinesLayer, backLineLayer, offsideLayer, extentLayer];
const GEOMETRY_WIRED = true;

export const LAYERS: OverlayLayer[] = [trailsLayer, dotsLayer, ballLayer, distanceLayer, ...(GEOMETRY_WIRED ? GEOMETRY_LAYERS : [])].sort((a, b) => a.order - b.order);

/** The same layers in the order the analyst reads them (toggle list, key list). */
export const LAYER_MENU: OverlayLayer[] = ['dots', 'ball', 'trails', 'distance', 'offside', 'backLine', 'teamLines', 'hull', 'extent', 'space'].flatMap((id) => LAYERS.filter((l) => l.id === id));

export type { OverlayLayer, LayerContext } from './layer.ts';
