import Timecode from 'smpte-timecode';
import { describe, expect, it } from 'vitest';
import {
  RATES,
  formatFrame,
  framesPerDay,
  framesPerHour,
  frameToSeconds,
  parseTimecode,
  secondsToFrame,
  TimecodeParseError,
  timecodeRate,
  type TimecodeRate,
} from '../../../engine/timecode/index.ts';

// Worked values: SMPTE ST 12-1 as written down in ../shared/REFERENCES.md (from memory).
describe('SMPTE ST 12-1 worked values (REFERENCES.md, from memory)', () => {
  const df = RATES.fps2997df;
  it('30000/1001 DF: 10 minutes = 17,982 frames, 1 hour = 107,892', () => {
    expect(parseTimecode('00:10:00;00', df)).toBe(17_982);
    expect(framesPerHour(df)).toBe(107_892);
    expect(parseTimecode('01:00:00;00', df)).toBe(107_892);
  });
  it('30000/1001 DF: 00:00:59;29 is frame 1,799 and the next label is 00:01:00;02 (frame 1,800)', () => {
    expect(parseTimecode('00:00:59;29', df)).toBe(1_799);
    expect(formatFrame(1_799, df)).toBe('00:00:59;29');
    expect(formatFrame(1_800, df)).toBe('00:01:00;02');
    expect(parseTimecode('00:01:00;02', df)).toBe(1_800);
  });
  it('30000/1001 DF: minute 10 keeps ;00 and ;01 (frame 17,982 is 00:10:00;00)', () => {
    expect(formatFrame(17_982, df)).toBe('00:10:00;00');
    expect(formatFrame(17_981, df)).toBe('00:09:59;29');
  });
  it('60000/1001 DF skips ;00-;03: 1 hour = 215,784 frames', () => {
    expect(framesPerHour(RATES.fps5994df)).toBe(215_784);
    expect(formatFrame(3_599, RATES.fps5994df)).toBe('00:00:59;59');
    expect(formatFrame(3_600, RATES.fps5994df)).toBe('00:01:00;04');
  });
  it('25 fps non-drop: 01:00:00:00 is frame 90,000', () => {
    expect(parseTimecode('01:00:00:00', RATES.fps25)).toBe(90_000);
    expect(formatFrame(90_000, RATES.fps25)).toBe('01:00:00:00');
  });
});

// Cross-check library from the npm registry: smpte-timecode 1.3.6.
function libraryLabel(frame: number, rate: TimecodeRate): string {
  return Timecode(frame, [rate.num, rate.den], rate.dropFrame).toString();
}
function libraryFrame(label: string, rate: TimecodeRate): number {
  return Timecode(label, [rate.num, rate.den], rate.dropFrame).frameCount;
}

function expectAgreement(rate: TimecodeRate, frames: Iterable<number>): number {
  let checked = 0;
  const mismatches: string[] = [];
  for (const f of frames) {
    const ours = formatFrame(f, rate);
    const theirs = libraryLabel(f, rate);
    if (ours !== theirs) mismatches.push(`frame ${f}: ours ${ours}, smpte-timecode ${theirs}`);
    else if (parseTimecode(ours, rate) !== f || libraryFrame(ours, rate) !== f) mismatches.push(`frame ${f}: round trip`);
    checked++;
    if (mismatches.length > 5) break;
  }
  expect(mismatches).toEqual([]);
  return checked;
}

function* range(from: number, to: number, step = 1) {
  for (let f = from; f < to; f += step) yield f;
}

describe('agrees with smpte-timecode (npm) on sweeps', () => {
  const cases: [string, TimecodeRate][] = [
    ['29.97 DF', RATES.fps2997df],
    ['25 NDF', RATES.fps25],
    ['30 NDF', RATES.fps30],
  ];
  for (const [name, rate] of cases) {
    it(`${name}: every frame of the first 11 minutes`, () => {
      const end = Math.ceil(11 * 60 * (rate.num / rate.den));
      expect(expectAgreement(rate, range(0, end))).toBe(end);
    });
    it(`${name}: strided sweep across 24 hours, and the last frame of the day`, () => {
      const day = framesPerDay(rate);
      // 997 is prime, so the stride visits every phase of the minute and ten-minute patterns.
      expectAgreement(rate, range(0, day, 997));
      expectAgreement(rate, [day - 1]);
    });
  }
  it('59.94 DF: strided sweep across 24 hours', () => {
    expectAgreement(RATES.fps5994df, range(0, framesPerDay(RATES.fps5994df), 1009));
  });
});

describe('strict parsing says what and where', () => {
  const df = RATES.fps2997df;
  it('refuses a dropped label, naming the column of the frames field', () => {
    const err = (() => {
      try {
        parseTimecode('00:01:00;01', df);
      } catch (e) {
        return e as TimecodeParseError;
      }
    })();
    expect(err).toBeInstanceOf(TimecodeParseError);
    expect(err?.column).toBe(10);
    expect(err?.message).toMatch(/skips labels ;00..;01/);
  });
  it('accepts ;00 at minutes divisible by ten (rule of ST 12-1, from memory)', () => {
    expect(parseTimecode('00:20:00;00', df)).toBe(2 * 17_982);
  });
  it('refuses the wrong separator for the rate', () => {
    expect(() => parseTimecode('00:00:01:00', df)).toThrow(/":" separator marks non-drop/);
    expect(() => parseTimecode('00:00:01;00', RATES.fps25)).toThrow(/";" separator marks drop-frame/);
  });
  it('refuses fields out of range and malformed text, with the column', () => {
    expect(() => parseTimecode('00:00:00:25', RATES.fps25)).toThrow(/column 10: frames 25 is above 24/);
    expect(() => parseTimecode('24:00:00:00', RATES.fps25)).toThrow(/column 1: hours 24/);
    expect(() => parseTimecode('00:60:00:00', RATES.fps25)).toThrow(/column 4: minutes 60/);
    expect(() => parseTimecode('0:00:00:00', RATES.fps25)).toThrow(/column 2: not a timecode/);
    expect(() => parseTimecode('00:00:00:00 ', RATES.fps25)).toThrow(/column 12/);
    expect(() => parseTimecode('00-00:00:00', RATES.fps25)).toThrow(/column 3/);
  });
  it('refuses frame numbers outside one day and undefined drop-frame rates', () => {
    expect(() => formatFrame(-1, RATES.fps25)).toThrow(RangeError);
    expect(() => formatFrame(framesPerDay(RATES.fps25), RATES.fps25)).toThrow(/one day/);
    expect(() => timecodeRate(25, 1, true)).toThrow(/drop-frame is defined only/);
  });
});

describe('frame <-> seconds at the exact rate', () => {
  it('frame 1,800 at 30000/1001 starts at 60.06 s (1800 x 1001 / 30000, arithmetic)', () => {
    expect(frameToSeconds(1_800, RATES.fps2997df)).toBeCloseTo(60.06, 9);
    expect(secondsToFrame(60.06, RATES.fps2997df)).toBe(1_800);
    expect(secondsToFrame(60.059, RATES.fps2997df)).toBe(1_799);
  });
  it('round-trips every frame of an hour at 24, 50 and 60 fps', () => {
    for (const rate of [RATES.fps24, RATES.fps50, RATES.fps60]) {
      const wrong: number[] = [];
      for (let f = 0; f < framesPerHour(rate); f++) if (secondsToFrame(frameToSeconds(f, rate), rate) !== f) wrong.push(f);
      expect(wrong.slice(0, 5)).toEqual([]);
    }
  });
});
