/** Footage needs no column mapping: the host probes container, codecs and frame times. */
import { useEffect, useRef, useState } from 'react';
import type { OpenedFile } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { importFootage } from '../import/footage.ts';
import { formatBytes } from '../summaries.ts';
import { AlreadyImported } from './AlreadyImported.tsx';

export function FootagePanel({ file, projectId, onStored, onSkip }: { file: OpenedFile; projectId: number; onStored: () => void; onSkip: () => void }) {
  const { db, host, info } = useServices();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState('');
  const button = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    button.current?.scrollIntoView({ block: 'nearest' });
    button.current?.focus({ preventScroll: true });
  }, []);
  const run = async () => {
    setBusy(true);
    setError('');
    try {
      await importFootage(db, host, projectId, file, info.userName);
      onStored();
    } catch (e) {
      setError(`Could not read the footage ${file.name}: ${(e as Error).message}. Nothing was stored.`);
      setBusy(false);
    }
  };
  return (
    <section className="panel mapping-panel" aria-label={`Footage ${file.name}`}>
      <header className="panel-head">
        <div>
          <h2>
            Footage <span className="mono">{file.name}</span>
          </h2>
          <p className="muted mono small">
            {file.path} · {formatBytes(file.size)}
          </p>
        </div>
        <button type="button" className="quiet" onClick={onSkip} disabled={busy}>
          Skip this file
        </button>
      </header>
      <AlreadyImported projectId={projectId} file={file} />
      <p>Footage needs no mapping. Importing reads its container, codecs and the time of every frame.</p>
      {error && <p className="error-text" role="alert">{error}</p>}
      <div className="actions">
        {busy && <span className="spinner" role="status" aria-label="Reading frame times" />}
        <button ref={button} type="button" className="primary" onClick={run} disabled={busy}>
          {busy ? 'Reading frame times…' : 'Import footage'}
        </button>
      </div>
    </section>
  );
}
