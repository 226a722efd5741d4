/**
 * The project bar's "Project" menu: exports of the corrected data and the sync report,
 * save and open of whole match projects (.wmatch), and the audit trail. Keys: Ctrl+S saves
 * the project, Ctrl+O opens one, Ctrl+Shift+H shows the audit trail; in the menu, arrows
 * move and Enter chooses.
 */
import { useEffect, useRef, useState } from 'react';
import './export.css';
import type { OpenedFile } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { Modal } from '../app/Dialogs.tsx';
import { isTypingTarget } from '../app/keys.ts';
import { FileChooser } from '../files/FileChooser.tsx';
import { fetchFile } from '../host/index.ts';
import { AuditPanel } from '../audit/AuditPanel.tsx';
import { buildExport, EXPORTS, type ExportKind } from './export-data.ts';
import { buildProjectFile, checkFootage, openProjectBytes, relinkFootage, type FootageCheck } from './project-io.ts';

type Job = { kind: ExportKind | 'project' };

export function ProjectMenu({ projectId, onOpened }: { projectId: number | undefined; onOpened: (id: number) => void }) {
  const { info } = useServices();
  const [open, setOpen] = useState(false);
  const [job, setJob] = useState<Job | null>(null);
  const [opening, setOpening] = useState(false);
  const [audit, setAudit] = useState(false);
  const menuRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.altKey || isTypingTarget(e.target) || document.querySelector('dialog[open]')) return;
      const k = e.key.toLowerCase();
      if (k === 's' && !e.shiftKey && projectId !== undefined) setJob({ kind: 'project' });
      else if (k === 'o' && !e.shiftKey) setOpening(true);
      else if (k === 'h' && e.shiftKey && projectId !== undefined) setAudit(true);
      else return;
      e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [projectId]);

  useEffect(() => {
    if (!open) return;
    menuRef.current?.querySelector<HTMLElement>('[role="menuitem"]:not([disabled])')?.focus();
    const onDown = (e: MouseEvent) => {
      if (!menuRef.current?.contains(e.target as Node) && e.target !== buttonRef.current) setOpen(false);
    };
    window.addEventListener('mousedown', onDown);
    return () => window.removeEventListener('mousedown', onDown);
  }, [open]);

  const choose = (f: () => void) => {
    setOpen(false);
    buttonRef.current?.focus();
    f();
  };
  const onMenuKey = (e: React.KeyboardEvent) => {
    const items = [...(menuRef.current?.querySelectorAll<HTMLElement>('[role="menuitem"]:not([disabled])') ?? [])];
    const i = items.indexOf(document.activeElement as HTMLElement);
    if (e.key === 'ArrowDown') items[(i + 1) % items.length]?.focus();
    else if (e.key === 'ArrowUp') items[(i - 1 + items.length) % items.length]?.focus();
    else if (e.key === 'Home') items[0]?.focus();
    else if (e.key === 'End') items[items.length - 1]?.focus();
    else if (e.key === 'Escape' || e.key === 'Tab') {
      setOpen(false);
      buttonRef.current?.focus();
    } else return;
    e.preventDefault();
  };
  const none = projectId === undefined;

  return (
    <div className="project-menu">
      <button ref={buttonRef} type="button" aria-haspopup="menu" aria-expanded={open} onClick={() => setOpen((o) => !o)} title="Save, open and export the match project">
        Project ▾
      </button>
      {open && (
        <div ref={menuRef} className="menu" role="menu" aria-label="Project" onKeyDown={onMenuKey}>
          <button role="menuitem" type="button" disabled={none} onClick={() => choose(() => setJob({ kind: 'project' }))} aria-keyshortcuts="Control+S">
            Save match project… <kbd>Ctrl+S</kbd>
          </button>
          <button role="menuitem" type="button" onClick={() => choose(() => setOpening(true))} aria-keyshortcuts="Control+O">
            Open match project… <kbd>Ctrl+O</kbd>
          </button>
          <div className="menu-sep" role="separator" />
          <div className="menu-label">Export</div>
          {EXPORTS.map((x) => (
            <button key={x.kind} role="menuitem" type="button" disabled={none} onClick={() => choose(() => setJob({ kind: x.kind }))} title={x.hint}>
              {x.label}…
            </button>
          ))}
          <div className="menu-sep" role="separator" />
          <button role="menuitem" type="button" disabled={none} onClick={() => choose(() => setAudit(true))} aria-keyshortcuts="Control+Shift+H">
            Audit trail and undo <kbd>Ctrl+Shift+H</kbd>
          </button>
        </div>
      )}
      {job && projectId !== undefined && <SaveDialog projectId={projectId} kind={job.kind} onClose={() => setJob(null)} />}
      {opening && <OpenProject onClose={() => setOpening(false)} onOpened={onOpened} />}
      {audit && projectId !== undefined && <AuditPanel projectId={projectId} onClose={() => setAudit(false)} />}
    </div>
  );
}

function SaveDialog({ projectId, kind, onClose }: { projectId: number; kind: ExportKind | 'project'; onClose: () => void }) {
  const { db, host, info } = useServices();
  const label = kind === 'project' ? 'Match project file (.wmatch)' : EXPORTS.find((e) => e.kind === kind)!.label;
  const [built, setBuilt] = useState<{ name: string; bytes: Uint8Array; note: string } | null>(null);
  const [name, setName] = useState('');
  const [folder, setFolder] = useState(() => localStorage.getItem('wm.exportFolder') ?? '');
  const [state, setState] = useState<{ busy?: boolean; error?: string; exists?: boolean; saved?: string }>({ busy: true });

  useEffect(() => {
    let live = true;
    (kind === 'project'
      ? buildProjectFile(db, host, projectId, info.appVersion).then((r) => ({
          name: r.name,
          bytes: r.bytes,
          note: r.missingFootage.length ? `Footage not found now, saved by path only: ${r.missingFootage.join(', ')}` : '',
        }))
      : buildExport(db, projectId, kind, { user: info.userName, appVersion: info.appVersion }).then((r) => ({ name: r.name, bytes: r.bytes, note: r.summary }))
    ).then(
      (r) => {
        if (!live) return;
        setBuilt(r);
        setName((n) => n || r.name);
        setState({});
      },
      (e: Error) => live && setState({ error: e.message }),
    );
    return () => {
      live = false;
    };
  }, [db, host, info, kind, projectId]);

  const save = async (overwrite: boolean) => {
    if (!built) return;
    setState({ busy: true });
    try {
      if (folder) localStorage.setItem('wm.exportFolder', folder);
      const r = await host.saveFile({ suggestedName: name.trim() || built.name, bytes: built.bytes, ...(folder.trim() ? { directory: folder.trim() } : {}), ...(overwrite ? { overwrite: true } : {}) });
      setState({ saved: `Saved ${r.bytesWritten.toLocaleString()} bytes to ${r.path}` });
    } catch (e) {
      const msg = (e as Error).message;
      setState({ error: msg, exists: /already exists/.test(msg) });
    }
  };
  return (
    <Modal title={`Save: ${label}`} onClose={onClose}>
      <form
        className="save-form"
        onSubmit={(e) => {
          e.preventDefault();
          void save(false);
        }}
      >
        <label className="field">
          <span>File name</span>
          <input value={name} onChange={(e) => setName(e.target.value)} spellCheck={false} autoFocus aria-label="File name" />
        </label>
        {!info.nativeDialogs && (
          <label className="field">
            <span>Folder</span>
            <input value={folder} onChange={(e) => setFolder(e.target.value)} placeholder="(the last folder used, or your home folder)" spellCheck={false} aria-label="Folder" />
          </label>
        )}
        {built?.note && <p className="muted small">{built.note}</p>}
        {kind !== 'project' && <p className="muted small">Holds personal data of players: keep it on club machines and share it only as your data-protection policy allows.</p>}
        {state.busy && <p className="muted" role="status">{built ? 'Saving…' : 'Preparing…'}</p>}
        {state.error && (
          <p className="error-text" role="alert">
            Not saved: {state.error}
          </p>
        )}
        {state.saved && (
          <p className="ok-text" role="status">
            {state.saved}
          </p>
        )}
        <div className="modal-actions">
          <button type="button" onClick={onClose}>
            {state.saved ? 'Close' : 'Cancel'}
          </button>
          {state.exists && (
            <button type="button" className="danger" onClick={() => save(true)}>
              Replace it
            </button>
          )}
          {!state.saved && (
            <button type="submit" className="primary" disabled={!built || state.busy}>
              Save
            </button>
          )}
        </div>
      </form>
    </Modal>
  );
}

function OpenProject({ onClose, onOpened }: { onClose: () => void; onOpened: (id: number) => void }) {
  const { db, host, info } = useServices();
  const [state, setState] = useState<{ busy?: string; error?: string }>({});
  const [footage, setFootage] = useState<FootageCheck[] | null>(null);
  const [choosing, setChoosing] = useState(!info.nativeDialogs);

  const openFile = async (file: OpenedFile) => {
    setChoosing(false);
    setState({ busy: `Reading ${file.name}…` });
    try {
      const bytes = new Uint8Array(await (await fetchFile(file)).arrayBuffer());
      const r = await openProjectBytes(db, host, bytes, file.name);
      onOpened(r.projectId);
      const problems = r.footage.filter((f) => f.state !== 'found');
      if (problems.length) {
        setFootage(r.footage);
        setState({});
      } else onClose();
    } catch (e) {
      setState({ error: (e as Error).message });
    }
  };
  useEffect(() => {
    if (!info.nativeDialogs) return;
    host.chooseFiles('project', false).then(
      (files) => (files[0] ? openFile(files[0]) : onClose()),
      (e: Error) => setState({ error: e.message }),
    );
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  if (choosing) return <FileChooser onOpened={(files) => files[0] && openFile(files[0])} onCancel={onClose} />;
  if (footage) return <RelinkDialog checks={footage} onClose={onClose} />;
  return (
    <Modal title="Open match project" onClose={onClose}>
      {state.busy && <p role="status">{state.busy}</p>}
      {state.error && (
        <>
          <p className="error-text" role="alert">
            {state.error}
          </p>
          <p className="muted small">Nothing was changed in your projects.</p>
        </>
      )}
      <div className="modal-actions">
        <button type="button" onClick={onClose}>
          Close
        </button>
        {state.error && (
          <button type="button" onClick={() => (info.nativeDialogs ? onClose() : (setState({}), setChoosing(true)))}>
            Choose another file…
          </button>
        )}
      </div>
    </Modal>
  );
}

/** Footage that moved or changed since the project was saved: point it at the recording again. */
function RelinkDialog({ checks, onClose }: { checks: FootageCheck[]; onClose: () => void }) {
  const { db, host, info } = useServices();
  const [list, setList] = useState(checks);
  const [picking, setPicking] = useState<number | null>(null);
  const [error, setError] = useState('');
  const relink = async (i: number, file: OpenedFile) => {
    setPicking(null);
    const c = list[i];
    const again = await checkFootage(host, c.ref, c.sourceId, file.path);
    if (again.state === 'different' && !confirm(`${again.detail}. Link it anyway?`)) return;
    try {
      await relinkFootage(db, c.sourceId, file, info.userName);
      setList((l) => l.map((x, j) => (j === i ? { ...again, state: 'found', detail: file.path } : x)));
    } catch (e) {
      setError((e as Error).message);
    }
  };
  const choose = async (i: number) => {
    if (!info.nativeDialogs) return setPicking(i);
    const [f] = await host.chooseFiles('footage', false);
    if (f) await relink(i, f);
  };
  if (picking !== null) return <FileChooser onOpened={(f) => f[0] && relink(picking, f[0])} onCancel={() => setPicking(null)} />;
  return (
    <Modal title="Find the footage of this project" onClose={onClose} wide>
      <p>The project is open. Its footage is not where it was when the project was saved, or is a different file:</p>
      <ul className="relink-list">
        {list.map((c, i) => (
          <li key={c.sourceId} data-state={c.state}>
            <span className="mono">{c.ref.fileName}</span>
            <span className={c.state === 'found' ? 'ok-text' : 'error-text'}>{c.state === 'found' ? `linked: ${c.detail}` : c.detail}</span>
            {c.state !== 'found' && (
              <button type="button" onClick={() => choose(i)}>
                Choose the file…
              </button>
            )}
          </li>
        ))}
      </ul>
      {error && <p className="error-text">{error}</p>}
      <p className="muted small">Until then the project opens without footage; tracking, events and corrections are all there.</p>
      <div className="modal-actions">
        <button type="button" className="primary" onClick={onClose}>
          {list.every((c) => c.state === 'found') ? 'Done' : 'Later'}
        </button>
      </div>
    </Modal>
  );
}
