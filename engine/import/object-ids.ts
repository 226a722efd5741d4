/**
 * Reading role, team and shirt from object ids such as `home_7`, `away_11`, `ball`.
 *
 * parseObjectId('home_7') -> { role: 'player', team: 'home', shirt: 7 }
 */
import type { ObjectRole, TeamSide } from '../../shared-types/domain.ts';

export interface IdInfo {
  role: ObjectRole;
  team?: TeamSide;
  shirt?: number;
}

export function parseObjectId(id: string): IdInfo {
  const s = id.trim().toLowerCase();
  if (s === 'ball' || s === 'b') return { role: 'ball' };
  if (/^(referee|ref|official|linesman|assistant)([ _-]?\d+)?$/.test(s)) return { role: 'official' };
  const m = /^(home|away|h|a|team_?a|team_?b)[ _-]?(\d{1,3})$/.exec(s);
  if (m) {
    const t = m[1];
    const team: TeamSide = t === 'home' || t === 'h' || t.replace('_', '') === 'teama' ? 'home' : 'away';
    return { role: 'player', team, shirt: Number(m[2]) };
  }
  return { role: 'player' };
}

/** Team column values: 'home'/'away' and their initials; anything else is undecided. */
export function parseTeamValue(v: string): TeamSide | 'ball' | undefined {
  const s = v.trim().toLowerCase();
  if (s === 'home' || s === 'h') return 'home';
  if (s === 'away' || s === 'a') return 'away';
  if (s === 'ball') return 'ball';
  return undefined;
}
