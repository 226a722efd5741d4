/** Small readers for tracking fields shared by the CSV and JSON Lines parsers. */

/** Period labels: "1", "2", "1H", "2nd"; 0 when unreadable. Periods are 1..5 (extra time, shoot-out). */
export function parsePeriodLabel(v: string | number | null | undefined): number {
  if (typeof v === 'number') return Number.isInteger(v) && v >= 1 && v <= 5 ? v : 0;
  if (typeof v !== 'string') return 0;
  const m = /^\s*([1-5])\s*(h|st|nd|rd|th|half)?\s*$/i.exec(v);
  return m ? Number(m[1]) : 0;
}

/** Numbers from JSON: numbers as they are, numeric strings parsed, null/absent -> NaN. */
export function jsonNumber(v: unknown): { value: number; invalid: boolean } {
  if (v === null || v === undefined || v === '') return { value: NaN, invalid: false };
  if (typeof v === 'number') return { value: v, invalid: !Number.isFinite(v) };
  if (typeof v === 'string') {
    const s = v.trim().toLowerCase();
    if (s === '' || s === 'na' || s === 'nan' || s === 'null') return { value: NaN, invalid: false };
    const n = Number(s);
    return Number.isFinite(n) ? { value: n, invalid: false } : { value: NaN, invalid: true };
  }
  return { value: NaN, invalid: true };
}
