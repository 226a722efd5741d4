/**
 * The analyst's overlay choices (team colours, layers per team, trail length, distance
 * pair) per project in db.settings. A view preference, not match data: not in the undo
 * history, like the chosen screen.
 */
import type { WhistlemarkDb } from '../db/database.ts';
import { LAYER_IDS, type OverlaySettings } from '../overlay/contract.ts';
import { defaultSettings } from '../overlay/style.ts';

export const settingsKey = (projectId: number) => `overlay:${projectId}`;

/** Stored settings merged over the defaults (a layer added later starts at its default). */
export function mergeSettings(stored: unknown): OverlaySettings {
  const d = defaultSettings();
  if (!stored || typeof stored !== 'object') return d;
  const s = stored as Partial<OverlaySettings>;
  const layers = { ...d.layers };
  for (const id of LAYER_IDS) if (s.layers?.[id]) layers[id] = { ...d.layers[id], ...s.layers[id] };
  return {
    teams: { home: { ...d.teams.home, ...s.teams?.home }, away: { ...d.teams.away, ...s.teams?.away } },
    layers,
    trailSeconds: typeof s.trailSeconds === 'number' ? s.trailSeconds : d.trailSeconds,
    teamLineCount: typeof s.teamLineCount === 'number' ? s.teamLineCount : d.teamLineCount,
    ...(s.distancePair ? { distancePair: s.distancePair } : {}),
  };
}

export async function saveSettings(db: WhistlemarkDb, projectId: number, s: OverlaySettings): Promise<void> {
  await db.settings.put({ key: settingsKey(projectId), value: s });
}
