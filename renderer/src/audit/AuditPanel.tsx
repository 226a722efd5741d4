/**
 * The audit trail of a match project: every recorded change (what, before → after, when,
 * who), newest first, filtered by kind; undo and redo buttons that say what they would
 * take back or do again (the same history as Ctrl+Z / Ctrl+Shift+Z).
 */
import { useMemo, useState } from 'react';
import './audit.css';
import type { AuditSubject } from '../db/rows.ts';
import { useServices } from '../app/context.ts';
import { Modal } from '../app/Dialogs.tsx';
import { useLive } from '../app/useLive.ts';
import { nextRedo, nextUndo, redo, undo } from '../history/history.ts';
import { describeChanges } from './describe-change.ts';

const KINDS: { value: AuditSubject | 'all' | 'other'; label: string }[] = [
  { value: 'all', label: 'All kinds' },
  { value: 'correction', label: 'Corrections' },
  { value: 'event', label: 'Events' },
  { value: 'anchor', label: 'Anchors' },
  { value: 'fit', label: 'Clock fits' },
  { value: 'nonLive', label: 'Non-live intervals' },
  { value: 'registration', label: 'Pitch registrations' },
  { value: 'reel', label: 'Reels' },
  { value: 'clip', label: 'Clips' },
  { value: 'source', label: 'Sources and imports' },
  { value: 'undo', label: 'Undo and redo' },
];

const SHOW = 300;

export function AuditPanel({ projectId, onClose }: { projectId: number; onClose: () => void }) {
  const { db, info } = useServices();
  const [kind, setKind] = useState<(typeof KINDS)[number]['value']>('all');
  const [message, setMessage] = useState('');
  const entries = useLive(() => db.audit.where('projectId').equals(projectId).reverse().sortBy('id'), [db, projectId]);
  const canUndo = useLive(() => nextUndo(db, projectId), [db, projectId]);
  const canRedo = useLive(() => nextRedo(db, projectId), [db, projectId]);
  const shown = useMemo(
    () => (entries ?? []).filter((e) => kind === 'all' || (kind === 'source' ? !e.subject || e.subject === 'source' || e.subject === 'project' : e.subject === kind)),
    [entries, kind],
  );
  const act = (which: 'undo' | 'redo') =>
    (which === 'undo' ? undo : redo)(db, projectId, info.userName).then(
      (s) => setMessage(s ? `${which === 'undo' ? 'Undone' : 'Redone'}: ${s.what}` : `Nothing to ${which}`),
      (e: Error) => setMessage(e.message),
    );
  return (
    <Modal title="Audit trail" onClose={onClose} wide label="Audit trail">
      <div className="audit-bar">
        <label className="field">
          <span>Kind</span>
          <select value={kind} onChange={(e) => setKind(e.target.value as typeof kind)} aria-label="Filter by kind">
            {KINDS.map((k) => (
              <option key={k.value} value={k.value}>
                {k.label}
              </option>
            ))}
          </select>
        </label>
        <span className="grow" />
        <button type="button" disabled={!canUndo} onClick={() => act('undo')} aria-keyshortcuts="Control+Z" title="Undo (Ctrl+Z)">
          {canUndo ? `Undo “${canUndo.what}”` : 'Nothing to undo'} <kbd>Ctrl+Z</kbd>
        </button>
        <button type="button" disabled={!canRedo} onClick={() => act('redo')} aria-keyshortcuts="Control+Shift+Z" title="Redo (Ctrl+Shift+Z)">
          {canRedo ? `Redo “${canRedo.what}”` : 'Nothing to redo'} <kbd>Ctrl+Shift+Z</kbd>
        </button>
      </div>
      <p className="muted small audit-count" role="status">
        {message || `${shown.length} of ${entries?.length ?? 0} entries${shown.length > SHOW ? `, newest ${SHOW} shown` : ''}. Kept in this machine's project database; saved with the project file.`}
      </p>
      <div className="audit-scroll">
        <table className="audit-table">
          <thead>
            <tr>
              <th>When</th>
              <th>Who</th>
              <th>What</th>
              <th>Before → after</th>
            </tr>
          </thead>
          <tbody>
            {shown.slice(0, SHOW).map((e) => {
              const changes = describeChanges(e);
              return (
                <tr key={e.id} data-state={e.state ?? 'note'} data-subject={e.subject ?? 'source'}>
                  <td className="mono nowrap">{new Date(e.at).toLocaleString()}</td>
                  <td>{e.user}</td>
                  <td>
                    {e.what}
                    {e.state === 'undone' && <span className="tag audit-tag">undone</span>}
                    {e.state === 'dropped' && <span className="tag audit-tag">undone, replaced</span>}
                  </td>
                  <td>
                    {changes.slice(0, 4).map((c, i) => (
                      <div key={i} className="audit-change">
                        {c.row && <span className="muted">{c.row} </span>}
                        {c.field && <span className="mono">{c.field}: </span>}
                        <span className="before">{c.before}</span> → <span className="after">{c.after}</span>
                      </div>
                    ))}
                    {changes.length > 4 && <div className="muted small">…and {changes.length - 4} more changes</div>}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="modal-actions">
        <button type="button" onClick={onClose}>
          Close
        </button>
      </div>
    </Modal>
  );
}
