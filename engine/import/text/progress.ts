import type { ImportProgress } from '../../../shared-types/import.ts';

/** UTF-8 byte length of a string (progress is reported in bytes of the file). */
export function utf8Length(s: string): number {
  // Most tracking files are ASCII: one native regex scan settles it.
  if (!/[^\x00-\x7f]/.test(s)) return s.length;
  let n = s.length;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) continue;
    if (c < 0x800) n += 1;
    else if (c >= 0xd800 && c <= 0xdbff) {
      n += 2; // surrogate pair: 4 bytes for 2 UTF-16 units
      i++;
    } else n += 2;
  }
  return n;
}

/** Counts bytes and rows and tells the caller, at most once per chunk. */
export class ProgressCounter {
  bytesRead = 0;
  rows = 0;
  constructor(
    private readonly bytesTotal: number,
    private readonly onProgress?: (p: ImportProgress) => void,
  ) {}
  chunk(text: string): void {
    this.bytesRead += utf8Length(text);
    this.report('reading');
  }
  report(phase: ImportProgress['phase']): void {
    this.onProgress?.({
      bytesRead: this.bytesRead,
      bytesTotal: Math.max(this.bytesTotal, this.bytesRead),
      rows: this.rows,
      phase,
    });
  }
}
