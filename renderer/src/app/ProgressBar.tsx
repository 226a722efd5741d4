import type { ImportProgress } from '../../../shared-types/index.ts';
import { formatBytes } from '../summaries.ts';

const PHASE: Record<ImportProgress['phase'], string> = {
  reading: 'Reading',
  normalising: 'Normalising',
  storing: 'Storing',
  done: 'Done',
};

export function percentOf(p: ImportProgress): number {
  if (p.phase === 'done') return 100;
  if (!p.bytesTotal) return 0;
  return Math.min(100, Math.floor((100 * p.bytesRead) / p.bytesTotal));
}

export function ProgressBar({ progress, label }: { progress: ImportProgress; label: string }) {
  const pct = percentOf(progress);
  return (
    <div className="progress">
      <div className="progress-track" role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
        <div className="progress-fill" style={{ width: `${pct}%` }} />
      </div>
      <div className="progress-text">
        <span>{PHASE[progress.phase]}</span>
        <span>
          {formatBytes(progress.bytesRead)} of {formatBytes(progress.bytesTotal)} · {progress.rows.toLocaleString('en')} rows · {pct}%
        </span>
      </div>
    </div>
  );
}
