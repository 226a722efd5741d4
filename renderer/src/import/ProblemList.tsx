/** The problems of a detection or an import: where (file, line, column, time), what, what to do. */
import { useState } from 'react';
import type { ImportProblem, RejectedRow } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { rejectedRowsCsv } from './rejected-rows.ts';

const SHOW = 200;

export function ProblemList({ problems, rejectedRows, fileName }: { problems: ImportProblem[]; rejectedRows: RejectedRow[]; fileName: string }) {
  const errors = problems.filter((p) => p.severity === 'error').length;
  const warnings = problems.length - errors;
  const sorted = [...problems].sort((a, b) => (a.severity === b.severity ? (a.line ?? 0) - (b.line ?? 0) : a.severity === 'error' ? -1 : 1));
  return (
    <section className="problems" aria-label="Problems">
      <header className="problems-head">
        <h3>Problems</h3>
        <span className="tag error">{errors} error{errors === 1 ? '' : 's'}</span>
        <span className="tag warn">{warnings} warning{warnings === 1 ? '' : 's'}</span>
        {rejectedRows.length > 0 && <SaveRejected rows={rejectedRows} problems={problems} fileName={fileName} />}
      </header>
      <div className="table-scroll">
        <table className="grid-table problems-table">
          <thead>
            <tr>
              <th>Severity</th>
              <th>File</th>
              <th>Line</th>
              <th>Column</th>
              <th>Time</th>
              <th>Reason</th>
              <th>What to do</th>
            </tr>
          </thead>
          <tbody>
            {sorted.slice(0, SHOW).map((p, i) => (
              <tr key={i} className={p.severity}>
                <td>
                  <span className={`tag ${p.severity === 'error' ? 'error' : 'warn'}`}>{p.severity}</span>
                </td>
                <td className="mono">{p.file}</td>
                <td className="num">{p.line ?? ''}</td>
                <td className="mono">{p.column ?? ''}</td>
                <td className="mono">{p.time ?? ''}</td>
                <td>{p.message}</td>
                <td className="muted">{p.hint ?? ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {sorted.length > SHOW && <p className="muted">…and {sorted.length - SHOW} more (all of them are in the saved rejected rows).</p>}
    </section>
  );
}

function SaveRejected({ rows, problems, fileName }: { rows: RejectedRow[]; problems: ImportProblem[]; fileName: string }) {
  const { host } = useServices();
  const [status, setStatus] = useState<{ ok: boolean; text: string; canReplace?: boolean } | null>(null);
  const name = `${fileName.replace(/\.[^.]+$/, '')}-rejected-rows.csv`;
  const save = async (overwrite: boolean) => {
    try {
      const bytes = new TextEncoder().encode(rejectedRowsCsv(rows, problems));
      const r = await host.saveFile({ suggestedName: name, bytes, ...(overwrite ? { overwrite: true } : {}) });
      setStatus({ ok: true, text: `Saved ${rows.length} rows to ${r.path}` });
    } catch (e) {
      const msg = (e as Error).message;
      setStatus({ ok: false, text: `Not saved: ${msg}`, canReplace: /exist/i.test(msg) });
    }
  };
  return (
    <span className="save-rejected">
      <button type="button" onClick={() => save(false)}>
        Save {rows.length} rejected row{rows.length === 1 ? '' : 's'}…
      </button>
      {status && <span className={status.ok ? 'ok-text' : 'error-text'} role="status">{status.text}</span>}
      {status?.canReplace && (
        <button type="button" className="quiet" onClick={() => save(true)}>
          Replace it
        </button>
      )}
    </span>
  );
}
