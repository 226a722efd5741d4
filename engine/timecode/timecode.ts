/**
 * SMPTE ST 12-1 timecode labels <-> frame numbers (frame 0 = 00:00:00:00).
 *
 * Drop-frame: labels FF = 0 .. dropPerMinute-1 are skipped at the start of every minute
 * except minutes divisible by ten, so 30000/1001 DF labels run 00:00:59;29 -> 00:01:00;02.
 * Written from the rule itself; checked against `smpte-timecode` in the tests.
 *
 * Example: `frameToTimecode(1800, RATES.fps2997df)` → { hours: 0, minutes: 1, seconds: 0, frames: 2 }
 */
import { framesPerDay, framesPerTenMinutes, type TimecodeRate } from './rate.ts';

export interface Timecode {
  hours: number;
  minutes: number;
  seconds: number;
  frames: number;
}

/** Label of a frame number in [0, one day). Throws RangeError outside it. */
export function frameToTimecode(frame: number, rate: TimecodeRate): Timecode {
  const day = framesPerDay(rate);
  if (!Number.isInteger(frame) || frame < 0 || frame >= day) {
    throw new RangeError(`frame ${frame}: timecode labels exist only for whole frames 0..${day - 1} (one day)`);
  }
  const labelIndex = rate.dropFrame ? frameToLabelIndex(frame, rate) : frame;
  const n = rate.nominal;
  return {
    hours: Math.floor(labelIndex / (3600 * n)),
    minutes: Math.floor(labelIndex / (60 * n)) % 60,
    seconds: Math.floor(labelIndex / n) % 60,
    frames: labelIndex % n,
  };
}

/**
 * Drop-frame: the frame's position counting every label, skipped ones included.
 * Within each ten-minute block the first minute keeps all labels, the other nine lose
 * `drop` labels at their start.
 */
function frameToLabelIndex(frame: number, rate: TimecodeRate): number {
  const drop = rate.dropPerMinute;
  const perTen = framesPerTenMinutes(rate);
  const perMinute = 60 * rate.nominal - drop;
  const tens = Math.floor(frame / perTen);
  const rem = frame % perTen;
  // The first minute of the block has 60*nominal frames; later minutes perMinute each.
  const droppedMinutes = rem < drop ? 0 : Math.floor((rem - drop) / perMinute);
  return frame + 9 * drop * tens + drop * droppedMinutes;
}

/** Frame number of a label. Throws RangeError for a label that does not exist. */
export function timecodeToFrame(tc: Timecode, rate: TimecodeRate): number {
  const problem = labelProblem(tc, rate);
  if (problem) throw new RangeError(`${formatTimecode(tc, rate)}: ${problem}`);
  const totalMinutes = 60 * tc.hours + tc.minutes;
  const labelIndex = (3600 * tc.hours + 60 * tc.minutes + tc.seconds) * rate.nominal + tc.frames;
  const skipped = rate.dropPerMinute * (totalMinutes - Math.floor(totalMinutes / 10));
  return labelIndex - skipped;
}

/** Why a label is not a valid one at this rate, or undefined when it is. */
export function labelProblem(tc: Timecode, rate: TimecodeRate): string | undefined {
  const whole = [tc.hours, tc.minutes, tc.seconds, tc.frames].every((v) => Number.isInteger(v) && v >= 0);
  if (!whole) return 'fields must be whole numbers >= 0';
  if (tc.hours > 23) return `hours ${tc.hours} is above 23`;
  if (tc.minutes > 59) return `minutes ${tc.minutes} is above 59`;
  if (tc.seconds > 59) return `seconds ${tc.seconds} is above 59`;
  if (tc.frames >= rate.nominal) return `frames ${tc.frames} is above ${rate.nominal - 1} at ${rate.nominal} fps`;
  if (rate.dropFrame && tc.seconds === 0 && tc.frames < rate.dropPerMinute && tc.minutes % 10 !== 0) {
    const last = String(rate.dropPerMinute - 1).padStart(2, '0');
    return `drop-frame skips labels ;00..;${last} at the start of minute ${tc.minutes} (only minutes divisible by ten keep them)`;
  }
  return undefined;
}

/** `HH:MM:SS:FF`, or `HH:MM:SS;FF` for drop-frame. */
export function formatTimecode(tc: Timecode, rate: TimecodeRate): string {
  const two = (v: number) => String(v).padStart(2, '0');
  const sep = rate.dropFrame ? ';' : ':';
  return `${two(tc.hours)}:${two(tc.minutes)}:${two(tc.seconds)}${sep}${two(tc.frames)}`;
}

/** Shorthand: label text of a frame number. */
export function formatFrame(frame: number, rate: TimecodeRate): string {
  return formatTimecode(frameToTimecode(frame, rate), rate);
}

/** Seconds from frame 0 to the start of a frame at the exact rate (num/den). */
export function frameToSeconds(frame: number, rate: TimecodeRate): number {
  return (frame * rate.den) / rate.num;
}

/** The frame showing at a time (at or before it), at the exact rate. */
export function secondsToFrame(seconds: number, rate: TimecodeRate): number {
  // A tiny allowance so that frameToSeconds(n) maps back to n despite float rounding.
  return Math.floor((seconds * rate.num) / rate.den + 1e-9);
}
