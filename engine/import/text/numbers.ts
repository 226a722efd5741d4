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

/** Powers of ten for the fraction digits of the fast path (shared with the tokenizer's fused path). */
export const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * Parses text[start, end) as a decimal number. Returns NaN when the range is not a plain
 * number (missing or invalid alike; tell them apart with isMissingToken when it matters).
 */
export function parseNumberRange(text: string, start: number, end: number): number {
  if (start >= end) return NaN;
  let i = start;
  let c = text.charCodeAt(i);
  let neg = false;
  if (c === 45 /* - */) {
    neg = true;
    c = text.charCodeAt(++i);
  }
  let mantissa = 0;
  let digits = 0;
  // Integer part.
  while (c >= 48 && c <= 57 && i < end) {
    mantissa = mantissa * 10 + (c - 48);
    digits++;
    c = text.charCodeAt(++i);
  }
  let fracDigits = 0;
  if (c === 46 /* . */ && i < end) {
    c = text.charCodeAt(++i);
    while (c >= 48 && c <= 57 && i < end) {
      mantissa = mantissa * 10 + (c - 48);
      fracDigits++;
      c = text.charCodeAt(++i);
    }
  }
  if (i === end && digits + fracDigits > 0 && digits + fracDigits <= 15) {
    const v = fracDigits === 0 ? mantissa : mantissa / POW10[fracDigits];
    return neg ? -v : v;
  }
  return parseNumberSlow(text, start, end);
}

/** Anything unusual (spaces, '+', exponents, long mantissas): strict Number() on the trimmed text. */
function parseNumberSlow(text: string, start: number, end: number): number {
  const s = text.slice(start, end).trim();
  if (!s.length || !/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return NaN;
  const v = Number(s);
  return Number.isFinite(v) ? v : NaN;
}

/** Parses a whole string as a number, NaN when missing or invalid. */
export function parseNumber(s: string): number {
  return parseNumberRange(s, 0, s.length);
}
