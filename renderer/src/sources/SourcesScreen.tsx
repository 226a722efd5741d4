/** The Sources screen: open files, map and import them, and see what each source holds. */
import { useCallback, useEffect, useState } from 'react';
import type { ImportProblem, OpenedFile, RejectedRow } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { isTypingTarget } from '../app/keys.ts';
import { useLive } from '../app/useLive.ts';
import { engineImporters } from '../import/engine-importers.ts';
import { prepareFile, type PreparedFile } from '../import/prepare.ts';
import { ProblemList } from '../import/ProblemList.tsx';
import { FileChooser } from '../files/FileChooser.tsx';
import { MappingPanel } from '../mapping/MappingPanel.tsx';
import { FootagePanel } from './FootagePanel.tsx';
import { SourceCard } from './SourceCard.tsx';

interface Report {
  fileName: string;
  warnings: ImportProblem[];
  rejectedRows: RejectedRow[];
}

const KIND_ORDER = { tracking: 0, events: 1, footage: 2 } as const;

export function SourcesScreen({ projectId, busyElsewhere }: { projectId: number; busyElsewhere: boolean }) {
  const { db, host, info } = useServices();
  const sources = useLive(() => db.sources.where('projectId').equals(projectId).toArray(), [projectId]);
  const [queue, setQueue] = useState<PreparedFile[]>([]);
  const [choosing, setChoosing] = useState(false);
  const [preparing, setPreparing] = useState(false);
  const [error, setError] = useState('');
  const [report, setReport] = useState<Report | null>(null);
  const lastFolder = useLive(() => db.settings.get('lastFolder').then((r) => r?.value as string | undefined), []);

  const accept = useCallback(
    async (files: OpenedFile[]) => {
      setChoosing(false);
      if (!files.length) return;
      const folder = files[0].path.replace(/[\\/][^\\/]*$/, '');
      await db.settings.put({ key: 'lastFolder', value: folder });
      setPreparing(true);
      setError('');
      try {
        const prepared: PreparedFile[] = [];
        for (const f of files) prepared.push(await prepareFile(db, engineImporters, fetch, f, location.href));
        setQueue((q) => [...q, ...prepared]);
      } catch (e) {
        setError(`Could not read the opened files: ${(e as Error).message}`);
      } finally {
        setPreparing(false);
      }
    },
    [db],
  );

  const openFiles = useCallback(async () => {
    if (info.nativeDialogs) {
      try {
        await accept(await host.chooseFiles('any', true));
      } catch (e) {
        setError(`The file dialog failed: ${(e as Error).message}`);
      }
    } else setChoosing(true);
  }, [accept, host, info.nativeDialogs]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'o' && !e.ctrlKey && !e.metaKey && !e.altKey && !isTypingTarget(e.target) && !document.querySelector('dialog[open]')) {
        e.preventDefault();
        void openFiles();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [openFiles]);

  const head = queue[0];
  const next = () => setQueue((q) => q.slice(1));
  const sorted = [...(sources ?? [])].sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || a.importedAt - b.importedAt);

  return (
    <div className="screen sources-screen">
      <div className="screen-head">
        <h1>Sources</h1>
        <span className="muted">{sources ? `${sources.length} source${sources.length === 1 ? '' : 's'}` : 'loading…'}</span>
        <span className="grow" />
        <button type="button" className="primary" onClick={openFiles} disabled={preparing || busyElsewhere} title="Open files (O)">
          Open files… <kbd>O</kbd>
        </button>
      </div>
      {error && (
        <p className="error-text" role="alert">
          {error}
        </p>
      )}
      {preparing && <p role="status">Reading the start of the opened files…</p>}
      {head && head.kind === 'footage' && (
        <FootagePanel
          key={head.file.fileId}
          file={head.file}
          projectId={projectId}
          onSkip={next}
          onStored={() => {
            setReport(null);
            next();
          }}
        />
      )}
      {head && head.kind !== 'footage' && (
        <MappingPanel
          key={head.file.fileId}
          prepared={head}
          projectId={projectId}
          queueLeft={queue.length - 1}
          onSkip={next}
          onStored={(o, fileName) => {
            setReport(o.warnings.length || o.rejectedRows.length ? { fileName, warnings: o.warnings, rejectedRows: o.rejectedRows } : null);
            next();
          }}
        />
      )}
      {report && (
        <section className="panel report" aria-label="Last import">
          <header className="panel-head">
            <h2>
              Imported <span className="mono">{report.fileName}</span> with {report.warnings.length} warning{report.warnings.length === 1 ? '' : 's'}
            </h2>
            <button type="button" className="quiet" onClick={() => setReport(null)}>
              Dismiss
            </button>
          </header>
          <ProblemList problems={report.warnings} rejectedRows={report.rejectedRows} fileName={report.fileName} />
        </section>
      )}
      {sources && sources.length === 0 && !head && !busyElsewhere && (
        <div className="empty">
          <p>No sources in this match project yet.</p>
          <p className="muted">Open the tracking file, the event log and the footage of the match. Each is checked and mapped before anything is stored.</p>
        </div>
      )}
      <div className="source-list">
        {sorted.map((s) => (
          <SourceCard key={s.id} source={s} />
        ))}
      </div>
      {choosing && <FileChooser {...(lastFolder ? { startPath: lastFolder } : {})} onOpened={accept} onCancel={() => setChoosing(false)} />}
    </div>
  );
}
