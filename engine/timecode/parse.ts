/**
 * Strict timecode parsing: exactly `HH:MM:SS:FF` (non-drop) or `HH:MM:SS;FF` (drop-frame),
 * two digits a field. A mistake names the column where it is and says what to write.
 *
 * Example: `parseTimecode('00:01:00;02', RATES.fps2997df)` → 1800
 */
import { type TimecodeRate } from './rate.ts';
import { labelProblem, timecodeToFrame, type Timecode } from './timecode.ts';

export class TimecodeParseError extends Error {
  /** 1-based column in the text where the problem starts. */
  readonly column: number;
  readonly text: string;
  constructor(text: string, column: number, problem: string, hint: string) {
    super(`timecode "${text}", column ${column}: ${problem}. ${hint}`);
    this.name = 'TimecodeParseError';
    this.text = text;
    this.column = column;
  }
}

const SHAPE = /^(\d{2}):(\d{2}):(\d{2})([:;])(\d{2})$/;

/** Parses a label and checks it exists at this rate. Returns its frame number. */
export function parseTimecode(text: string, rate: TimecodeRate): number {
  return timecodeToFrame(parseTimecodeFields(text, rate), rate);
}

/** Parses a label into its fields, with the same checks as parseTimecode. */
export function parseTimecodeFields(text: string, rate: TimecodeRate): Timecode {
  const expected = rate.dropFrame ? 'HH:MM:SS;FF' : 'HH:MM:SS:FF';
  const m = SHAPE.exec(text);
  if (!m) {
    const column = firstBadColumn(text);
    throw new TimecodeParseError(text, column, 'not a timecode', `Write it as ${expected}, two digits a field`);
  }
  const sep = m[4];
  if ((sep === ';') !== rate.dropFrame) {
    throw new TimecodeParseError(
      text,
      9,
      sep === ';' ? 'the ";" separator marks drop-frame, but this rate is non-drop' : 'the ":" separator marks non-drop, but this rate is drop-frame',
      `Write it as ${expected}`,
    );
  }
  const tc: Timecode = { hours: +m[1], minutes: +m[2], seconds: +m[3], frames: +m[5] };
  const problem = labelProblem(tc, rate);
  if (problem) {
    const column = problem.startsWith('hours') ? 1 : problem.startsWith('minutes') ? 4 : problem.startsWith('seconds') ? 7 : 10;
    throw new TimecodeParseError(text, column, problem, 'Check the label against the footage');
  }
  return tc;
}

/** Where the text first departs from the NN:NN:NN:NN shape (1-based). */
function firstBadColumn(text: string): number {
  const pattern = 'dd:dd:dd:dd';
  for (let i = 0; i < pattern.length; i++) {
    const c = text[i];
    if (c === undefined) return i + 1;
    const ok = pattern[i] === 'd' ? c >= '0' && c <= '9' : i === 8 ? c === ':' || c === ';' : c === ':';
    if (!ok) return i + 1;
  }
  return pattern.length + 1;
}
