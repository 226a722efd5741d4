import { parseISO } from 'date-fns';
import { describe, expect, it } from 'vitest';
import { parseIsoMs, parseMatchClock } from '../../../engine/import/index.ts';

describe('ISO 8601 date-times parse as date-fns parseISO parses them (reference library)', () => {
  // Examples in the forms ISO 8601 defines: extended and basic format, fractional seconds,
  // UTC designator Z and offsets (+hh:mm, +hhmm, +hh).
  const examples = [
    '2026-03-14T15:00:02Z', // extended format, UTC (ISO 8601)
    '20260314T150002Z', // basic format (ISO 8601)
    '2026-03-14T15:00:02.5Z', // fractional seconds (ISO 8601)
    '2026-03-14T15:00:02,25Z', // decimal comma, allowed by ISO 8601
    '2026-03-14T15:00:02.123+01:00', // offset +hh:mm (ISO 8601)
    '2026-03-14T15:00:02-05:30', // negative offset with minutes (ISO 8601)
    '20260314T150002+0100', // basic format offset (ISO 8601)
    '2026-03-14T15:00:02+01', // hour-only offset (ISO 8601)
    '2026-03-14T15:00', // reduced precision, no seconds (ISO 8601)
    '2026-03-14T23:59:59.999Z',
  ];
  for (const s of examples) {
    it(`${s} (ISO 8601, compared with date-fns parseISO)`, () => {
      expect(parseIsoMs(s)).toBe(parseISO(s).getTime());
      expect(Number.isFinite(parseIsoMs(s))).toBe(true);
    });
  }
  it('Z and +01:00 forms of one instant are 0 ms apart (ISO 8601 offsets)', () => {
    expect(parseIsoMs('2026-03-14T16:00:00+01:00') - parseIsoMs('2026-03-14T15:00:00Z')).toBe(0);
  });
  it('fractional seconds keep milliseconds (ISO 8601)', () => {
    expect(parseIsoMs('2026-03-14T15:00:01.250Z') - parseIsoMs('2026-03-14T15:00:00Z')).toBe(1250);
  });
  it('rejects text that is not a date-time, as parseISO gives Invalid Date', () => {
    for (const s of ['15:00:02', 'yesterday', '2026-13-45T99:99:99Z', '']) {
      expect(parseIsoMs(s)).toBeNaN();
    }
    expect(Number.isNaN(parseISO('2026-13-45T99:99:99Z').getTime())).toBe(true);
  });
});

describe('match clock MM:SS(.s)', () => {
  it('reads minutes and seconds (common practice)', () => {
    expect(parseMatchClock('00:00')).toBe(0);
    expect(parseMatchClock('12:30.5')).toBeCloseTo(750.5, 9);
    expect(parseMatchClock('45:00.0')).toBe(2700); // Law 7: a half is 45 minutes
    expect(parseMatchClock('93:07.25')).toBeCloseTo(5587.25, 9);
    expect(parseMatchClock('105:00')).toBe(6300);
  });
  it('reads stoppage notation 45+2:10 as 47:10 (common practice)', () => {
    expect(parseMatchClock('45+2:10')).toBe(47 * 60 + 10);
  });
  it('reads H:MM:SS', () => {
    expect(parseMatchClock('1:02:03.5')).toBeCloseTo(3723.5, 9);
  });
  it('refuses seconds of 60 or more and non-clock text', () => {
    for (const s of ['12:60', 'abc', '12', '12:3a', '-1:00', '']) expect(parseMatchClock(s)).toBeNaN();
  });
});
