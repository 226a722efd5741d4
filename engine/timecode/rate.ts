/**
 * Timecode frame rates (SMPTE ST 12-1): an exact rational rate plus the integer "nominal"
 * rate the labels count in, and whether labels are dropped to keep the clock on time.
 *
 * Example: `timecodeRate(30000, 1001, true)` → { nominal: 30, dropPerMinute: 2, ... }
 */
export interface TimecodeRate {
  /** Exact rate = num / den frames per second, e.g. 30000/1001. */
  num: number;
  den: number;
  /** Frames per timecode second: the FF field runs 0 .. nominal-1. */
  nominal: number;
  dropFrame: boolean;
  /** Labels skipped at the start of each minute not divisible by ten (0 when non-drop). */
  dropPerMinute: number;
}

/**
 * Builds a rate and refuses combinations the standard does not define: drop-frame exists
 * only for the 1000/1001 family of 30 and 60 (2 and 4 labels a minute respectively).
 */
export function timecodeRate(num: number, den = 1, dropFrame = false): TimecodeRate {
  if (!Number.isInteger(num) || !Number.isInteger(den) || num <= 0 || den <= 0) {
    throw new RangeError(`timecode rate ${num}/${den}: numerator and denominator must be positive integers`);
  }
  const nominal = Math.round(num / den);
  if (nominal < 1 || nominal > 120) throw new RangeError(`timecode rate ${num}/${den}: outside 1..120 fps`);
  if (dropFrame && !(den === 1001 && (nominal === 30 || nominal === 60))) {
    throw new RangeError(
      `timecode rate ${num}/${den}: drop-frame is defined only for 30000/1001 and 60000/1001; use non-drop timecode`,
    );
  }
  return { num, den, nominal, dropFrame, dropPerMinute: dropFrame ? nominal / 15 : 0 };
}

/** The rates broadcast footage uses (common practice), ready made. */
export const RATES = {
  fps24: timecodeRate(24),
  fps25: timecodeRate(25),
  fps30: timecodeRate(30),
  fps50: timecodeRate(50),
  fps60: timecodeRate(60),
  fps2997df: timecodeRate(30000, 1001, true),
  fps5994df: timecodeRate(60000, 1001, true),
  fps2997ndf: timecodeRate(30000, 1001, false),
  fps5994ndf: timecodeRate(60000, 1001, false),
} as const;

/** Frames in one 24-hour timecode day: labels wrap after 23:59:59:FF. */
export function framesPerDay(rate: TimecodeRate): number {
  return 24 * framesPerHour(rate);
}

export function framesPerHour(rate: TimecodeRate): number {
  return 6 * framesPerTenMinutes(rate);
}

/** Ten minutes: the drop-frame pattern repeats exactly on this period. */
export function framesPerTenMinutes(rate: TimecodeRate): number {
  return 600 * rate.nominal - 9 * rate.dropPerMinute;
}
