/** One imported source on the Sources screen: what it holds, its periods and warnings. */
import { useState } from 'react';
import { ConfirmDialog } from '../app/Dialogs.tsx';
import { useServices } from '../app/context.ts';
import type { SourceRow } from '../db/rows.ts';
import { deleteSource } from '../db/store.ts';
import { formatBytes, formatDuration } from '../summaries.ts';

const KIND_LABEL = { tracking: 'Tracking', events: 'Event log', footage: 'Footage' } as const;

export function SourceCard({ source }: { source: SourceRow }) {
  const { db, info } = useServices();
  const [confirm, setConfirm] = useState(false);
  const s = source.summary;
  const stats: [string, string][] = [[source.kind === 'events' ? 'Span of events' : 'Duration', formatDuration(s.duration)]];
  if (source.kind === 'tracking') {
    stats.push(['Rate', `${s.rate} Hz`], ['Frames', (s.frames ?? 0).toLocaleString('en')], ['Objects', String(s.objects ?? 0)]);
    if (s.players) stats.push(['Players', `${s.players.home} home · ${s.players.away} away${s.players.unknown ? ` · ${s.players.unknown} unassigned` : ''}`]);
    stats.push(['Ball', s.hasBall ? 'tracked' : 'not in file']);
  } else if (source.kind === 'events') {
    stats.push(['Events', (s.eventCount ?? 0).toLocaleString('en')]);
    if (s.teams) stats.push(['Teams', [s.teams.home && `${s.teams.home} (home)`, s.teams.away && `${s.teams.away} (away)`].filter(Boolean).join(' · ') || '–']);
  } else if (s.footage) {
    const f = s.footage;
    stats.push(
      ['Container', f.container],
      ['Video', `${f.videoCodec} ${f.width}×${f.height}`],
      ['Audio', f.audioCodec ?? 'none'],
      ['Frame rate', `${f.nominalFps.toFixed(3).replace(/\.?0+$/, '')} fps nominal · ${f.measuredFps.toFixed(3)} measured`],
      ['Timing', f.variableRate ? 'variable frame rate' : 'constant frame rate'],
      ['Frames', f.frameCount.toLocaleString('en')],
      ['Start time', `${f.startTime.toFixed(3)} s`],
    );
  }
  if (s.rows !== undefined) stats.push(['Rows read', s.rows.toLocaleString('en')]);
  if (s.rejectedRows) stats.push(['Rows rejected', s.rejectedRows.toLocaleString('en')]);

  return (
    <article className={`source-card kind-${source.kind}`} aria-label={`${KIND_LABEL[source.kind]} ${source.fileName}`}>
      <header className="source-head">
        <span className="kind-chip">{KIND_LABEL[source.kind]}</span>
        <h3 className="mono">{source.fileName}</h3>
        <span className="muted small">
          {formatBytes(source.size)} · imported {new Date(source.importedAt).toLocaleString('en-GB')}
        </span>
        <span className="grow" />
        <button type="button" className="quiet danger-text" onClick={() => setConfirm(true)} aria-label={`Remove ${source.fileName}`}>
          Remove…
        </button>
      </header>
      <p className="muted mono small path">{source.path}</p>
      <dl className="stats">
        {stats.map(([k, v]) => (
          <div key={k}>
            <dt>{k}</dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
      {s.periods.length > 0 && (
        <table className="grid-table periods">
          <thead>
            <tr>
              <th>Period</th>
              <th className="num">From</th>
              <th className="num">To</th>
              <th className="num">Length</th>
              {source.kind === 'tracking' && <th className="num">Frames</th>}
              {source.kind === 'tracking' && <th className="num">Missing frames</th>}
              {source.kind === 'tracking' && <th>Home attacks</th>}
              {source.kind === 'events' && <th className="num">Events</th>}
            </tr>
          </thead>
          <tbody>
            {s.periods.map((p) => (
              <tr key={p.period}>
                <td>{p.period}</td>
                <td className="num">{formatDuration(p.start)}</td>
                <td className="num">{formatDuration(p.end)}</td>
                <td className="num">{formatDuration(p.end - p.start)}</td>
                {source.kind === 'tracking' && <td className="num">{(p.frames ?? 0).toLocaleString('en')}</td>}
                {source.kind === 'tracking' && <td className="num">{(p.missingFrames ?? 0).toLocaleString('en')}</td>}
                {source.kind === 'tracking' && <td>{p.homeAttacks === undefined ? '–' : p.homeAttacks === 'positive_x' ? 'towards +x' : 'towards −x'}</td>}
                {source.kind === 'events' && <td className="num">{p.events ?? 0}</td>}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {s.eventsByKind && (
        <ul className="kind-counts" aria-label="Events by kind">
          {Object.entries(s.eventsByKind)
            .sort((a, b) => (b[1] ?? 0) - (a[1] ?? 0))
            .map(([k, n]) => (
              <li key={k}>
                <span>{k.replace(/_/g, ' ')}</span> <strong>{n}</strong>
              </li>
            ))}
        </ul>
      )}
      {source.warnings.length > 0 ? (
        <details className="warnings">
          <summary>
            <span className="tag warn">{source.warnings.length} warning{source.warnings.length > 1 ? 's' : ''}</span>
          </summary>
          <ul>
            {source.warnings.slice(0, 100).map((w, i) => (
              <li key={i}>
                {w.line !== undefined && <span className="mono">line {w.line}{w.column ? `, ${w.column}` : ''}: </span>}
                {w.time && <span className="mono">{w.time}: </span>}
                {w.message}
                {w.hint && <span className="muted"> — {w.hint}</span>}
              </li>
            ))}
          </ul>
        </details>
      ) : (
        <p className="muted small">No warnings.</p>
      )}
      {confirm && (
        <ConfirmDialog
          title="Remove this source?"
          message={<p>“{source.fileName}” and everything derived from it will be removed from the project. The file on disk stays.</p>}
          confirmLabel="Remove source"
          onCancel={() => setConfirm(false)}
          onConfirm={async () => {
            await deleteSource(db, source.id!, info.userName);
            setConfirm(false);
          }}
        />
      )}
    </article>
  );
}
