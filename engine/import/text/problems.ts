import type { ImportProblem, RejectedRow } from '../../../shared-types/import.ts';

/** Most messages of one sort kept in full; the rest are counted in one summary line. */
const MAX_PER_SORT = 20;
const MAX_REJECTED_ROWS = 10_000;

/**
 * Collects problems and rejected rows for one import. Repeated problems of one sort are
 * capped so a wholly wrong file gives a readable list rather than a million lines.
 */
export class ProblemLog {
  readonly problems: ImportProblem[] = [];
  readonly rejectedRows: RejectedRow[] = [];
  rejectedCount = 0;
  private readonly counts = new Map<string, number>();
  private readonly firstOfSort = new Map<string, ImportProblem>();

  constructor(readonly file: string) {}

  add(sort: string, p: Omit<ImportProblem, 'file'>): void {
    const n = (this.counts.get(sort) ?? 0) + 1;
    this.counts.set(sort, n);
    if (n <= MAX_PER_SORT) {
      const full = { file: this.file, ...p };
      this.problems.push(full);
      if (n === 1) this.firstOfSort.set(sort, full);
    }
  }
  error(sort: string, p: Omit<ImportProblem, 'file' | 'severity'>): void {
    this.add(sort, { severity: 'error', ...p });
  }
  warn(sort: string, p: Omit<ImportProblem, 'file' | 'severity'>): void {
    this.add(sort, { severity: 'warning', ...p });
  }
  reject(line: number, text: string, reason: string): void {
    this.rejectedCount++;
    if (this.rejectedRows.length < MAX_REJECTED_ROWS) this.rejectedRows.push({ line, text, reason });
  }
  count(sort: string): number {
    return this.counts.get(sort) ?? 0;
  }
  hasErrors(): boolean {
    return this.problems.some((p) => p.severity === 'error');
  }
  /** Appends "... and N more like this" lines for capped sorts. */
  finish(): ImportProblem[] {
    for (const [sort, n] of this.counts) {
      if (n > MAX_PER_SORT) {
        const first = this.firstOfSort.get(sort)!;
        this.problems.push({
          severity: first.severity,
          file: this.file,
          message: `${n - MAX_PER_SORT} more like this: ${first.message}`,
          hint: first.hint,
        });
      }
    }
    return this.problems;
  }
}

/** Rows rejected beyond this share of the file turn into an error: the mapping is probably wrong. */
export const MAX_REJECTED_SHARE = 0.05;
