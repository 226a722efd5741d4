/**
 * The default visual language. Team colours are the orange / blue pair of the Okabe & Ito
 * colour-universal palette (Okabe M., Ito K., "Color Universal Design", 2008: orange
 * #E69F00, blue #0072B2), which stays apart under deuteranopia and protanopia; the teams
 * also differ in shape (disc v diamond) and outline (dark v light), so nothing relies on
 * colour alone. Lines use a pale yellow / white that neither team uses.
 */
import { LAYER_IDS, type LayerId, type LayerSelection, type OverlaySettings, type TeamKey, type TeamStyle } from './contract.ts';

export const DEFAULT_TEAMS: Record<TeamKey, TeamStyle> = {
  home: { colour: 0xe69f00, outline: 0x1a1a1a, shape: 'disc', label: 0x111111 },
  away: { colour: 0x0072b2, outline: 0xf4f4f4, shape: 'diamond', label: 0xffffff },
};

export const LINE_COLOUR = 0xfff3a0;
export const BALL_FILL = 0xffffff;
export const BALL_OUTLINE = 0x111111;

/** Layers on by default: the positions and the offside line; the rest on demand. */
const DEFAULT_ON: LayerId[] = ['dots', 'ball', 'trails', 'offside'];

export function defaultLayers(): LayerSelection {
  const sel = {} as LayerSelection;
  for (const id of LAYER_IDS) sel[id] = { home: DEFAULT_ON.includes(id), away: DEFAULT_ON.includes(id) };
  return sel;
}

export function allLayers(on = true): LayerSelection {
  const sel = {} as LayerSelection;
  for (const id of LAYER_IDS) sel[id] = { home: on, away: on };
  return sel;
}

export function defaultSettings(): OverlaySettings {
  return { teams: structuredClone(DEFAULT_TEAMS), layers: defaultLayers(), trailSeconds: 3, teamLineCount: 3 };
}

/** '#rrggbb' <-> 0xRRGGBB for colour inputs. */
export const toHex = (c: number) => `#${c.toString(16).padStart(6, '0')}`;
export const fromHex = (s: string) => parseInt(s.replace('#', ''), 16) || 0;
