/**
 * The mapping screen for one opened file: what detection found, a preview, the editable
 * mapping, then Import with progress and Cancel. A refused import shows its problems and
 * stores nothing.
 */
import { useEffect, useRef, useState } from 'react';
import type { EventMapping, ImportProgress, SourceMapping, TrackingMapping } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { ProgressBar } from '../app/ProgressBar.tsx';
import { startImport, type RunningImport } from '../import/client.ts';
import type { PreparedFile } from '../import/prepare.ts';
import { absoluteUrl } from '../import/prepare.ts';
import { ProblemList } from '../import/ProblemList.tsx';
import type { ImportOutcome } from '../import/run-import.ts';
import { AlreadyImported } from '../sources/AlreadyImported.tsx';
import { formatBytes } from '../summaries.ts';
import { blankMapping, mappingGaps } from './edit.ts';
import { headerSignature } from './memory.ts';
import { EventMappingEditor } from './EventMappingEditor.tsx';
import { TrackingMappingEditor } from './TrackingMappingEditor.tsx';

type Textual = Exclude<PreparedFile, { kind: 'footage' }>;

export function MappingPanel(props: { prepared: Textual; projectId: number; queueLeft: number; onStored: (o: Extract<ImportOutcome, { status: 'stored' }>, fileName: string) => void; onSkip: () => void }) {
  const { prepared, projectId } = props;
  const { info } = useServices();
  const { detection, file } = prepared;
  const [kind, setKind] = useState<'tracking' | 'events' | 'unknown'>(prepared.kind);
  const [mapping, setMapping] = useState<SourceMapping | undefined>(prepared.mapping);
  const [remember, setRemember] = useState(true);
  const [progress, setProgress] = useState<ImportProgress | null>(null);
  const [running, setRunning] = useState<RunningImport | null>(null);
  const [refused, setRefused] = useState<Extract<ImportOutcome, { status: 'refused' }> | null>(null);
  const [note, setNote] = useState('');
  const importButton = useRef<HTMLButtonElement>(null);
  const heading = useRef<HTMLHeadingElement>(null);

  // Bring the panel's top into view and put focus there; Tab goes on through the mapping.
  useEffect(() => {
    heading.current?.scrollIntoView({ block: 'start' });
    heading.current?.focus({ preventScroll: true });
  }, []);

  const chooseKind = (k: 'tracking' | 'events' | 'unknown') => {
    setKind(k);
    setRefused(null);
    if (k === 'unknown') return setMapping(undefined);
    if (prepared.mapping?.kind === k) setMapping(prepared.mapping);
    else setMapping(blankMapping(k, detection.header));
  };

  const gaps = mapping ? mappingGaps(mapping, detection.header) : ['Say what kind of file this is.'];
  // What detection itself noticed (a header-only head, an unreadable start), while the
  // analyst keeps its verdict; once they override the kind, those notes no longer apply.
  const detectionProblems = kind === prepared.kind ? detection.problems : [];

  const run = async () => {
    if (!mapping || gaps.length) return;
    setRefused(null);
    setNote('');
    setProgress({ bytesRead: 0, bytesTotal: file.size, rows: 0, phase: 'reading' });
    const job = startImport(
      {
        projectId,
        file: { fileName: file.name, path: file.path, size: file.size, mtimeMs: file.mtimeMs, url: absoluteUrl(file.url, location.href) },
        mapping,
        detected: { ...(detection.mapping ? { mapping: detection.mapping } : {}), confidence: detection.confidence, clues: detection.clues },
        // The signature is keyed by the kind the analyst settled on.
        headerSignature: headerSignature(mapping.kind, detection.header),
        rememberMapping: remember,
        user: info.userName,
      },
      setProgress,
    );
    setRunning(job);
    const outcome = await job.outcome;
    setRunning(null);
    if (outcome.status === 'stored') props.onStored(outcome, file.name);
    else if (outcome.status === 'refused') {
      setProgress(null);
      setRefused(outcome);
    } else {
      setProgress(null);
      setNote('Import cancelled. Nothing was stored.');
    }
  };

  return (
    <section className="panel mapping-panel" aria-label={`Mapping for ${file.name}`}>
      <header className="panel-head">
        <div>
          <h2 ref={heading} tabIndex={-1}>
            Map <span className="mono">{file.name}</span>
          </h2>
          <p className="muted mono small">
            {file.path} · {formatBytes(file.size)}
            {props.queueLeft > 0 ? ` · ${props.queueLeft} more file${props.queueLeft > 1 ? 's' : ''} waiting` : ''}
          </p>
        </div>
        <button type="button" className="quiet" onClick={props.onSkip} disabled={!!running}>
          Skip this file
        </button>
      </header>

      <AlreadyImported projectId={projectId} file={file} />
      <div className="detect-row">
        <div className="detect-summary">
          <h3>Detected</h3>
          <p>
            <strong className="kind-label" data-kind={prepared.kind}>
              {prepared.kind === 'unknown' ? 'not recognised' : prepared.kind === 'events' ? 'event log' : 'tracking'}
            </strong>{' '}
            <ConfidenceMeter value={detection.confidence} />
            {prepared.fromMemory && <span className="tag ok">mapping remembered from an earlier file</span>}
          </p>
          <ul className="clues">
            {detection.clues.map((c, i) => (
              <li key={i}>{c}</li>
            ))}
          </ul>
        </div>
        <fieldset className="kind-choice">
          <legend>This file is</legend>
          {(['tracking', 'events', 'unknown'] as const).map((k) => (
            <label key={k}>
              <input type="radio" name={`kind-${file.fileId}`} checked={kind === k} onChange={() => chooseKind(k)} disabled={!!running} />{' '}
              {k === 'tracking' ? 'tracking' : k === 'events' ? 'an event log' : 'neither (do not import)'}
            </label>
          ))}
        </fieldset>
      </div>

      <Preview header={detection.header} rows={detection.preview} />

      {detectionProblems.length > 0 && !refused && <ProblemList problems={detectionProblems} rejectedRows={[]} fileName={file.name} />}

      {mapping?.kind === 'tracking' && (
        <TrackingMappingEditor value={mapping as TrackingMapping} header={detection.header} onChange={(m) => setMapping(m)} />
      )}
      {mapping?.kind === 'events' && (
        <EventMappingEditor value={mapping as EventMapping} header={detection.header} preview={detection.preview} onChange={(m) => setMapping(m)} />
      )}

      {refused && <ProblemList problems={refused.problems} rejectedRows={refused.rejectedRows} fileName={file.name} />}
      {refused && (
        <p className="error-text" role="alert">
          Import refused: {refused.problems.filter((p) => p.severity === 'error').length} error(s) in {file.name}. Nothing was stored.
        </p>
      )}

      <footer className="panel-foot">
        {mapping && gaps.length > 0 && (
          <ul className="gaps">
            {gaps.map((g) => (
              <li key={g}>{g}</li>
            ))}
          </ul>
        )}
        {mapping ? (
          <label className="check">
            <input type="checkbox" checked={remember} onChange={(e) => setRemember(e.target.checked)} disabled={!!running} /> Remember this mapping for files with the same columns
          </label>
        ) : (
          <p className="muted">Nothing to import. If this is tracking or an event log after all, say so above and map its columns by hand.</p>
        )}
        {progress && <ProgressBar progress={progress} label={`Import of ${file.name}`} />}
        {note && <p className="muted" role="status">{note}</p>}
        <div className="actions">
          {running ? (
            <button type="button" onClick={() => running.cancel()}>
              Cancel import
            </button>
          ) : (
            <button ref={importButton} type="button" className="primary" disabled={!mapping || gaps.length > 0} onClick={run}>
              {mapping?.kind === 'events' ? 'Import event log' : mapping?.kind === 'tracking' ? 'Import tracking' : 'Import'}
            </button>
          )}
        </div>
      </footer>
    </section>
  );
}

function ConfidenceMeter({ value }: { value: number }) {
  const pct = Math.round(value * 100);
  return (
    <span className="confidence" title="How sure detection is">
      <meter min={0} max={1} value={value} aria-label="Detection confidence" /> {pct}% sure
    </span>
  );
}

function Preview({ header, rows }: { header: string[]; rows: string[][] }) {
  if (!header.length) return <p className="muted">No readable columns at the start of the file.</p>;
  return (
    <div className="table-scroll preview" tabIndex={0} aria-label="Preview of the first rows">
      <table className="grid-table">
        <thead>
          <tr>
            {header.map((h, i) => (
              <th key={i} className="mono">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.slice(0, 8).map((r, i) => (
            <tr key={i}>
              {header.map((_, j) => (
                <td key={j} className="mono">
                  {r[j] ?? ''}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
