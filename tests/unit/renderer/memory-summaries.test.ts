import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import { chooseMapping, headerSignature, recallMapping, rememberMapping } from '../../../renderer/src/mapping/memory.ts';
import { formatBytes, formatDuration, summariseEvents, summariseTracking } from '../../../renderer/src/summaries.ts';
import type { EventMapping, MatchEvent } from '../../../shared-types/index.ts';
import { DEFAULT_PITCH } from '../../../shared-types/index.ts';

const evMapping: EventMapping = {
  kind: 'events',
  format: 'csv',
  columns: { period: 'half', time: 'clock', kind: 'what' },
  clock: 'match_clock_continuing',
  kindNames: { GK: 'goal_kick' },
  teamNames: {},
  coordinates: { unit: 'm', origin: 'centre', yDown: false, pitch: DEFAULT_PITCH },
};

describe('mapping memory', () => {
  it('gives the same signature whatever the case and spaces, a different one for other columns', () => {
    expect(headerSignature('events', ['Half', ' Clock ', 'What'])).toBe(headerSignature('events', ['half', 'clock', 'what']));
    expect(headerSignature('events', ['half', 'clock', 'what'])).not.toBe(headerSignature('events', ['half', 'what', 'clock']));
    expect(headerSignature('events', ['a'])).not.toBe(headerSignature('tracking', ['a']));
  });

  it('remembers a mapping and offers it again only when its columns exist', async () => {
    const db = new WhistlemarkDb('wm-memory-test');
    const sig = headerSignature('events', ['half', 'clock', 'what']);
    await rememberMapping(db, sig, evMapping, 'events.csv');
    const back = await recallMapping(db, sig);
    expect(back).toEqual(evMapping);
    expect(chooseMapping(undefined, back, ['half', 'clock', 'what']).fromMemory).toBe(true);
    // A remembered mapping naming a column the file lacks is not offered.
    expect(chooseMapping(evMapping, back, ['half', 'clock']).fromMemory).toBe(false);
    db.close();
  });
});

describe('summaries', () => {
  it('counts events by kind and period spans', () => {
    const ev = (row: number, period: number, t: number, kind: MatchEvent['kind']): MatchEvent => ({ id: `e${row}`, row, period, t, kind, rawKind: kind, raw: {} });
    const s = summariseEvents({ pitch: DEFAULT_PITCH, teams: { home: 'A' }, columns: [], events: [ev(1, 1, 0, 'kick_off'), ev(2, 1, 100, 'pass'), ev(3, 1, 2700, 'pass'), ev(4, 2, 0, 'kick_off'), ev(5, 2, 2800, 'goal_kick')] });
    expect(s.eventCount).toBe(5);
    expect(s.eventsByKind).toEqual({ kick_off: 2, pass: 2, goal_kick: 1 });
    expect(s.periods).toEqual([
      { period: 1, start: 0, end: 2700, events: 3 },
      { period: 2, start: 0, end: 2800, events: 2 },
    ]);
    expect(s.duration).toBe(5500);
  });

  it('counts frames, missing frames and players per team', () => {
    const present = new Uint8Array([1, 1, 0, 1]);
    const s = summariseTracking({
      rate: 25,
      pitch: DEFAULT_PITCH,
      objects: [{ id: 'h', role: 'player', team: 'home' }, { id: 'a', role: 'player', team: 'away' }, { id: 'b', role: 'ball' }],
      ballIndex: 2,
      periods: [{ period: 1, firstFrame: 0, frameCount: 4, present, x: new Float32Array(12), y: new Float32Array(12), homeAttacks: 'positive_x' }],
    });
    expect(s).toMatchObject({ rate: 25, frames: 4, objects: 3, hasBall: true, players: { home: 1, away: 1, unknown: 0 } });
    expect(s.periods[0]).toMatchObject({ missingFrames: 1, end: 4 / 25, homeAttacks: 'positive_x' });
  });

  it('formats durations and sizes', () => {
    // 45 minutes of a half (Law 7, Laws of the Game) shows as 45:00.0.
    expect(formatDuration(45 * 60)).toBe('45:00.0');
    expect(formatDuration(5423.2)).toBe('1:30:23');
    expect(formatDuration(83.44)).toBe('1:23.4');
    expect(formatBytes(1536)).toBe('1.5 KB');
    expect(formatBytes(5 * 1024 * 1024)).toBe('5.0 MB');
  });
});
