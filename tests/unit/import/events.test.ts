import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { EventMapping } from '../../../shared-types/import.ts';
import { defaultKindNames, detectSource, importEvents, isAbortError } from '../../../engine/import/index.ts';
import { chunked } from './helpers/synthetic.ts';

const fixture = (name: string) => readFileSync(new URL(`./fixtures/${name}`, import.meta.url), 'utf8');

async function detectAndImport(name: string, text: string, tweak?: (m: EventMapping) => void) {
  const d = detectSource(name, text);
  expect(d.kind).toBe('events');
  const mapping = d.mapping as EventMapping;
  tweak?.(mapping);
  return { d, m: mapping, r: await importEvents(chunked(text, 61), { fileName: name, mapping }) };
}

describe('event import: the demo layout (MM:SS.s continuing from 45:00, metres from the bottom-left corner)', () => {
  it('imports every row with kinds, sides, times and centre-origin positions', async () => {
    const { m, r } = await detectAndImport('events-demo-layout.csv', fixture('events-demo-layout.csv'));
    expect(m.clock).toBe('match_clock_continuing');
    expect(m.coordinates).toMatchObject({ unit: 'm', origin: 'bottom_left', yDown: false });
    expect(r.ok).toBe(true);
    const ev = r.data!.events;
    expect(ev).toHaveLength(14);
    expect(r.data!.teams).toEqual({ home: 'Amber XI', away: 'Slate XI' });
    // Law 8: kick-off from the centre mark, (52.5, 34) from the corner -> (0, 0).
    expect(ev[0]).toMatchObject({ id: 'e1', row: 1, period: 1, t: 0, kind: 'kick_off', team: 'home', player: '9', x: 0, y: 0 });
    // Law 16: a goal kick from the goal area, here its corner 5.5 m from the line and post.
    expect(ev[3]).toMatchObject({ kind: 'goal_kick', team: 'away', period: 1 });
    expect(ev[3].x).toBeCloseTo(-47, 9);
    expect(ev[3].y).toBeCloseTo(-(3.66 + 5.5), 9);
    expect(ev[3].t).toBeCloseTo(192.5, 9);
    // Law 17: a corner from the corner area, (105, 0) -> (52.5, -34).
    expect(ev[4]).toMatchObject({ kind: 'corner', x: 52.5, y: -34 });
    // Period 2 starts at 45:00 on a continuing clock (Law 7: 45-minute halves).
    expect(ev[9]).toMatchObject({ period: 2, t: 0, kind: 'kick_off', team: 'away' });
    expect(ev[10].t).toBeCloseTo(153.3, 9);
    // Law 14: penalty kick from the penalty mark 11 m from the goal line: (94, 34) -> (41.5, 0).
    expect(ev[11]).toMatchObject({ kind: 'penalty', x: 41.5, y: 0 });
    expect(ev[12]).toMatchObject({ kind: 'other', rawKind: 'Header, flick' });
    expect(ev[12].raw.event).toBe('Header, flick');
    expect(r.data!.columns).toEqual(['id', 'period', 'clock', 'team', 'player', 'event', 'x', 'y', 'end_x', 'end_y']);
  });

  it('a clock restarting at 0:00 read as continuing is an error naming the row', async () => {
    const { r } = await detectAndImport('events-restarting-clock.csv', fixture('events-restarting-clock.csv'), (m) => (m.clock = 'match_clock_continuing'));
    expect(r.ok).toBe(false);
    expect(r.data).toBeUndefined();
    expect(r.problems.find((p) => p.severity === 'error')).toMatchObject({ line: 4, column: 'time' });
  });
});

describe('event import: other clocks and grids', () => {
  it('restarting match clock, 0..100 grid', async () => {
    const { m, r } = await detectAndImport('events-restarting-clock.csv', fixture('events-restarting-clock.csv'));
    expect(m.clock).toBe('match_clock_restarting');
    expect(m.coordinates).toMatchObject({ gridLength: 100, gridWidth: 100 });
    expect(r.data!.events.map((e) => [e.period, e.t])).toEqual([
      [1, 0],
      [1, 750.5],
      [2, 0],
      [2, 190],
    ]);
    // (50, 50) on a 0..100 grid is the centre mark (Law 1); (60, 100) is on the upper touchline.
    expect(r.data!.events[0]).toMatchObject({ x: 0, y: 0 });
    expect(r.data!.events[3].y).toBeCloseTo(34, 9);
    // Team names by order of first appearance, home first.
    expect(r.data!.teams).toEqual({ home: 'Slate XI', away: 'Amber XI' });
    expect(r.data!.events[0].team).toBe('home');
  });

  it('ISO-8601 wall clock in JSON: period starts from period-start rows, offsets respected (ISO 8601)', async () => {
    const { m, r } = await detectAndImport('events-iso.json', fixture('events-iso.json'));
    expect(m).toMatchObject({ format: 'json', clock: 'iso8601' });
    expect(r.ok).toBe(true);
    const ev = r.data!.events;
    expect(ev.map((e) => [e.period, e.kind, Math.round(e.t * 1000) / 1000])).toEqual([
      [1, 'period_start', 0],
      [1, 'kick_off', 1.5],
      [1, 'goal_kick', 248.25],
      [1, 'period_end', 2848],
      [2, 'period_start', 0],
      [2, 'kick_off', 1.2],
      [2, 'throw_in', 420],
    ]);
    // Normalised 0.5, 0.5 is the centre mark.
    expect(ev[1]).toMatchObject({ x: 0, y: 0 });
  });

  it('ISO-8601 without period-start rows: the first row of each period is its start, with a warning', async () => {
    const text = JSON.stringify(JSON.parse(fixture('events-iso.json')).filter((o: { type: string }) => o.type !== 'period start'));
    const { r } = await detectAndImport('no-start.json', text);
    expect(r.ok).toBe(true);
    expect(r.data!.events[0].t).toBe(0);
    expect(r.problems.filter((p) => /no period-start row/.test(p.message))).toHaveLength(2);
  });

  it('JSON Lines events', async () => {
    const text = (JSON.parse(fixture('events-iso.json')) as object[]).map((o) => JSON.stringify(o)).join('\n');
    const { m, r } = await detectAndImport('ev.jsonl', text);
    expect(m.format).toBe('json');
    expect(r.data!.events).toHaveLength(7);
  });

  it('seconds since the period start, tab-separated, centre-origin metres', async () => {
    const { m, r } = await detectAndImport('events-seconds-restart.tsv', fixture('events-seconds-restart.tsv'));
    expect(m).toMatchObject({ clock: 'seconds', delimiter: '\t' });
    expect(r.data!.events.map((e) => [e.period, e.t, e.kind])).toEqual([
      [1, 0, 'kick_off'],
      [1, 61.5, 'pass'],
      [1, 2710, 'period_end'],
      [2, 0, 'kick_off'],
      [2, 30.25, 'corner'],
      [2, 100, 'other'],
    ]);
    expect(r.data!.events[4]).toMatchObject({ x: 52.5, y: -34, team: 'away' });
  });

  it('seconds counting on across periods: detected and brought back to seconds since the period start', async () => {
    const text = 'period,seconds,type\n1,0,kick off\n1,1200,pass\n2,2700,kick off\n2,2760.5,shot\n';
    const { m, r } = await detectAndImport('cont.csv', text);
    expect(m.periodStartsS?.[2]).toBe(2700);
    expect(r.data!.events.map((e) => e.t)).toEqual([0, 1200, 0, 60.5]);
  });
});

describe('event import: kind names, teams and validation', () => {
  it('defaultKindNames covers the plain-English names of the restarts (Laws 8, 13-17)', () => {
    expect(defaultKindNames['kick off']).toBe('kick_off');
    expect(defaultKindNames['kick-off']).toBe('kick_off');
    expect(defaultKindNames.kickoff).toBe('kick_off');
    expect(defaultKindNames['goal kick']).toBe('goal_kick');
    expect(defaultKindNames['corner kick']).toBe('corner');
    expect(defaultKindNames['throw in']).toBe('throw_in');
    expect(defaultKindNames['free kick']).toBe('free_kick');
    expect(defaultKindNames['penalty kick']).toBe('penalty');
    expect(defaultKindNames['period start']).toBe('period_start');
    expect(defaultKindNames['half end']).toBe('period_end');
    expect(defaultKindNames.Pass).toBe('pass');
  });

  it('an edited kind-name mapping is used; an unknown name becomes other with one warning per name', async () => {
    const text = 'period,clock,event\n1,00:01,Tackle\n1,00:02,Tackle\n1,00:03,Shove\n';
    const { r } = await detectAndImport('k.csv', text, (m) => {
      m.kindNames = { Tackle: 'other' };
    });
    expect(r.ok).toBe(true);
    expect(r.data!.events.map((e) => e.kind)).toEqual(['other', 'other', 'other']);
    expect(r.problems.filter((p) => p.message.includes('"Shove"'))).toHaveLength(1);
    expect(r.problems.filter((p) => p.message.includes('"Tackle"'))).toHaveLength(0);
  });

  it('an unparseable time rejects the row with its line, text and reason', async () => {
    const lines = fixture('events-demo-layout.csv').split('\n');
    lines[3] = lines[3].replace('00:07.9', '7 sec');
    const { r } = await detectAndImport('t.csv', lines.join('\n'));
    expect(r.rejectedRows).toEqual([{ line: 4, text: lines[3], reason: 'time "7 sec" is not a match clock (MM:SS)' }]);
    // 1 of 14 rows is more than 5%: the import refuses as a whole.
    expect(r.ok).toBe(false);
    expect(r.data).toBeUndefined();
  });

  it('an unknown period rejects the row', async () => {
    const rows = ['period,clock,event'];
    for (let i = 0; i < 40; i++) rows.push(`1,${String(i).padStart(2, '0')}:00,pass`);
    rows.push('9,41:00,pass');
    const { r } = await detectAndImport('p.csv', rows.join('\n'));
    expect(r.ok).toBe(true);
    expect(r.rejectedRows[0]).toMatchObject({ line: 42, reason: 'unknown period "9"' });
    expect(r.data!.events).toHaveLength(40);
  });

  it('missing time column -> error at line 1', async () => {
    const { r } = await detectAndImport('c.csv', fixture('events-demo-layout.csv'), (m) => (m.columns.time = 'timestamp'));
    expect(r.ok).toBe(false);
    expect(r.problems[0]).toMatchObject({ severity: 'error', line: 1, column: 'timestamp' });
  });

  it('a third team name keeps no side and says so', async () => {
    const text = 'period,clock,team,event\n1,00:01,Amber XI,pass\n1,00:02,Slate XI,pass\n1,00:03,Gull XI,pass\n';
    const { r } = await detectAndImport('3.csv', text);
    expect(r.data!.events[2].team).toBeUndefined();
    expect(r.problems.some((p) => /third team/.test(p.message) && p.line === 4)).toBe(true);
  });

  it('positions far off the pitch are warned about with their line', async () => {
    const text = 'period,clock,event,x,y\n1,00:01,pass,52.5,34\n1,00:02,pass,300,34\n';
    const { r } = await detectAndImport('o.csv', text, (m) => (m.coordinates = { ...m.coordinates, unit: 'm', origin: 'bottom_left', gridLength: undefined, gridWidth: undefined }));
    expect(r.problems.some((p) => p.severity === 'warning' && p.line === 3 && /off the pitch/.test(p.message))).toBe(true);
  });

  it('abort rejects with an AbortError', async () => {
    const ctl = new AbortController();
    ctl.abort();
    const d = detectSource('e.csv', fixture('events-demo-layout.csv'));
    const err = await importEvents(chunked(fixture('events-demo-layout.csv')), { fileName: 'e.csv', mapping: d.mapping as EventMapping, signal: ctl.signal }).catch((e) => e);
    expect(isAbortError(err)).toBe(true);
  });

  it('a JSON array cut short: error saying so, no data', async () => {
    const text = fixture('events-iso.json');
    const { r } = await detectAndImport('cut.json', text.slice(0, text.length - 80));
    expect(r.ok).toBe(false);
    expect(r.problems.some((p) => /cut short/.test(p.message))).toBe(true);
  });
});
