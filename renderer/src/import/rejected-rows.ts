/** The rejected rows of a refused or partial import as a CSV the analyst can fix and re-open. */
import type { ImportProblem, RejectedRow } from '../../../shared-types/index.ts';

function csvField(s: string): string {
  // RFC 4180: quote fields with comma, quote or line break; double inner quotes.
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function rejectedRowsCsv(rows: RejectedRow[], problems: ImportProblem[]): string {
  const lines = ['line,reason,text'];
  for (const r of rows) lines.push([String(r.line), csvField(r.reason), csvField(r.text)].join(','));
  // Problems with a line but no rejected row (e.g. a bad header) are listed too.
  const seen = new Set(rows.map((r) => r.line));
  for (const p of problems) {
    if (p.line !== undefined && !seen.has(p.line)) lines.push([String(p.line), csvField(p.message), ''].join(','));
  }
  return lines.join('\r\n') + '\r\n';
}
