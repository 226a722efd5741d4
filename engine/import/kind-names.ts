/**
 * Plain-English event names -> canonical kinds. Editable by the analyst through the
 * mapping; matching ignores case, spaces, hyphens and underscores ("Kick-off" = "kickoff").
 */
import type { EventKind } from '../../shared-types/domain.ts';

export const defaultKindNames: Record<string, EventKind> = {
  pass: 'pass',
  Pass: 'pass',
  cross: 'pass',
  'long ball': 'pass',
  'kick off': 'kick_off',
  'kick-off': 'kick_off',
  kickoff: 'kick_off',
  'Kick Off': 'kick_off',
  'goal kick': 'goal_kick',
  goalkick: 'goal_kick',
  'corner kick': 'corner',
  corner: 'corner',
  'throw in': 'throw_in',
  'throw-in': 'throw_in',
  throw: 'throw_in',
  'free kick': 'free_kick',
  'free-kick': 'free_kick',
  freekick: 'free_kick',
  'penalty kick': 'penalty',
  penalty: 'penalty',
  shot: 'shot',
  'shot on target': 'shot',
  'shot off target': 'shot',
  goal: 'goal',
  'period start': 'period_start',
  'half start': 'period_start',
  'start of half': 'period_start',
  'period end': 'period_end',
  'half end': 'period_end',
  'end of half': 'period_end',
  'full time': 'period_end',
  'half time': 'period_end',
  other: 'other',
};

/** Key used to compare names: lower case, letters and digits only. */
export const kindKey = (name: string): string => name.toLowerCase().replace(/[^a-z0-9]/g, '');

/** Builds a lookup that tolerates case and punctuation, including canonical kind names. */
export function makeKindLookup(kindNames: Record<string, EventKind>): (raw: string) => EventKind | undefined {
  const table = new Map<string, EventKind>();
  for (const [name, kind] of Object.entries(defaultKindNames)) table.set(kindKey(name), kind);
  for (const [name, kind] of Object.entries(kindNames)) table.set(kindKey(name), kind);
  const exact = new Map(Object.entries(kindNames));
  return (raw) => exact.get(raw) ?? table.get(kindKey(raw));
}
