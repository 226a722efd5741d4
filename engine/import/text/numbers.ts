/**
 * Number parsing straight from a text range, without cutting a substring first. This is
 * where most of the import time goes, so it is written for speed; anything unusual
 * (exponents, very long mantissas) falls back to the engine's own parseFloat.
 */

/** Tokens that mean "no value" in tracking and event files (common practice). */
const MISSING_TOKENS = new Set(['', 'na', 'nan', 'null', 'n/a', 'none', '-', '?']);

export function isMissingToken(s: string): boolean {
  return MISSING_TOKENS.has(s.trim().toLowerCase());
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * Parses text[start, end) as a decimal number. Returns NaN when the range is not a plain
 * number (missing or invalid alike; tell them apart with isMissingToken when it matters).
 */
export function parseNumberRange(text: string, start: number, end: number): number {
  // Trim spaces (files written by spreadsheets often pad).
  while (start < end && text.charCodeAt(start) === 32) start++;
  while (end > start && text.charCodeAt(end - 1) === 32) end--;
  if (start >= end) return NaN;
  let i = start;
  let neg = false;
  let c = text.charCodeAt(i);
  if (c === 45 /* - */ || c === 43 /* + */) {
    neg = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fracDigits = 0;
  let seenDot = false;
  for (; i < end; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (seenDot) fracDigits++;
    } else if (c === 46 /* . */ && !seenDot) {
      seenDot = true;
    } else break;
  }
  if (digits === 0) return NaN;
  if (i < end || digits > 15 || fracDigits >= POW10.length) {
    // Exponent or something odd: let the built-in parser decide, strictly.
    const s = text.slice(start, end);
    const v = Number(s);
    return Number.isFinite(v) ? v : NaN;
  }
  const v = fracDigits === 0 ? mantissa : mantissa / POW10[fracDigits];
  return neg ? -v : v;
}

/** Parses a whole string as a number, NaN when missing or invalid. */
export function parseNumber(s: string): number {
  return parseNumberRange(s, 0, s.length);
}
