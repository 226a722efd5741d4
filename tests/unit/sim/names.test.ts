import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { NAME_SYLLABLES, TEAM_NAMES } from '../../../fixtures/sim/teams.ts';

// The demo is an invented scenario: names come only from the generator's own syllables.
const demo = new URL('../../../fixtures/demo/', import.meta.url).pathname;
const truth = JSON.parse(readFileSync(demo + 'truth.json', 'utf8'));

describe('no real names (simple check)', () => {
  it('player names are built from the invented syllable table only', () => {
    const s = NAME_SYLLABLES;
    const first = new RegExp(`^(${s.first.join('|')})(${s.firstEnd.join('|')})$`);
    const last = new RegExp(`^(${s.last.join('|')})(${s.lastEnd.join('|')})$`);
    for (const side of ['home', 'away'] as const)
      for (const p of truth.teams[side].players as { name: string }[]) {
        const [a, b, ...rest] = p.name.split(' ');
        expect(rest).toEqual([]);
        expect(a).toMatch(first);
        expect(b).toMatch(last);
      }
  });

  it('the event log names only the two invented clubs', () => {
    const rows = readFileSync(demo + 'events.csv', 'utf8').trim().split('\n').slice(1);
    const teams = new Set(rows.map((r) => r.split(',')[3]).filter(Boolean));
    expect(teams).toEqual(new Set([TEAM_NAMES.home.name, TEAM_NAMES.away.name]));
  });
});
