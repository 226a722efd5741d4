/**
 * In-app file chooser (browser mode, where there is no system dialog): a path field, the
 * directory's entries, keyboard control (arrows move, Enter opens a folder or toggles a
 * file, Space toggles, Backspace goes up), several files at once.
 */
import { useCallback, useEffect, useRef, useState, type KeyboardEvent } from 'react';
import type { DirectoryListing, OpenedFile } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { Modal } from '../app/Dialogs.tsx';
import { formatBytes } from '../summaries.ts';

export function FileChooser({ startPath, onOpened, onCancel }: { startPath?: string; onOpened: (files: OpenedFile[]) => void; onCancel: () => void }) {
  const { host } = useServices();
  const [listing, setListing] = useState<DirectoryListing | null>(null);
  const [pathField, setPathField] = useState(startPath ?? '');
  const [cursor, setCursor] = useState(0);
  const [picked, setPicked] = useState<string[]>([]);
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);
  const listRef = useRef<HTMLUListElement>(null);

  const go = useCallback(
    async (path?: string) => {
      setError('');
      try {
        const l = await host.listDirectory(path || undefined);
        setListing(l);
        setPathField(l.path);
        setCursor(0);
      } catch (e) {
        setError(`Cannot list “${path}”: ${(e as Error).message}`);
      }
    },
    [host],
  );
  useEffect(() => {
    void go(startPath);
  }, [go, startPath]);

  const entries = listing?.entries ?? [];
  const toggle = (path: string) => setPicked((p) => (p.includes(path) ? p.filter((x) => x !== path) : [...p, path]));

  const open = async () => {
    if (!picked.length) return setError('Pick at least one file (Space or Enter on a file).');
    setBusy(true);
    try {
      onOpened(await host.openPaths(picked));
    } catch (e) {
      setError(`Cannot open: ${(e as Error).message}`);
    } finally {
      setBusy(false);
    }
  };

  const onListKey = (e: KeyboardEvent) => {
    const entry = entries[cursor];
    if (e.key === 'ArrowDown') setCursor((c) => Math.min(entries.length - 1, c + 1));
    else if (e.key === 'ArrowUp') setCursor((c) => Math.max(0, c - 1));
    else if (e.key === 'Home') setCursor(0);
    else if (e.key === 'End') setCursor(entries.length - 1);
    else if (e.key === 'Backspace' && listing?.parent) void go(listing.parent);
    else if ((e.key === 'Enter' || e.key === ' ') && entry) {
      if (entry.kind === 'directory') void go(entry.path);
      else toggle(entry.path);
    } else return;
    e.preventDefault();
  };
  useEffect(() => {
    listRef.current?.querySelector<HTMLElement>(`[data-index="${cursor}"]`)?.scrollIntoView({ block: 'nearest' });
  }, [cursor]);

  return (
    <Modal title="Open files" onClose={onCancel} wide>
      <form
        className="chooser-path"
        onSubmit={(e) => {
          e.preventDefault();
          void go(pathField);
        }}
      >
        <label className="field grow">
          <span>Folder</span>
          <input value={pathField} onChange={(e) => setPathField(e.target.value)} aria-label="Folder path" spellCheck={false} />
        </label>
        <button type="submit">Go</button>
        <button type="button" disabled={!listing?.parent} onClick={() => listing?.parent && go(listing.parent)} title="Parent folder (Backspace)">
          Up
        </button>
      </form>
      {error && <p className="field-error" role="alert">{error}</p>}
      <ul
        ref={listRef}
        className="chooser-list"
        role="listbox"
        aria-label="Folder contents"
        aria-multiselectable="true"
        tabIndex={0}
        aria-activedescendant={entries[cursor] ? `fc-${cursor}` : undefined}
        onKeyDown={onListKey}
      >
        {entries.length === 0 && <li className="chooser-empty">This folder is empty.</li>}
        {entries.map((en, i) => (
          <li
            key={en.path}
            id={`fc-${i}`}
            data-index={i}
            role="option"
            aria-selected={picked.includes(en.path)}
            className={`chooser-entry ${i === cursor ? 'is-cursor' : ''} ${picked.includes(en.path) ? 'is-picked' : ''}`}
            onClick={() => {
              setCursor(i);
              if (en.kind === 'directory') void go(en.path);
              else toggle(en.path);
            }}
          >
            <span className="chooser-icon" aria-hidden="true">{en.kind === 'directory' ? '▸' : picked.includes(en.path) ? '✓' : '·'}</span>
            <span className="chooser-name">{en.name}{en.kind === 'directory' ? '/' : ''}</span>
            <span className="chooser-size">{en.size !== undefined && en.kind === 'file' ? formatBytes(en.size) : ''}</span>
          </li>
        ))}
      </ul>
      <p className="hint">↑ ↓ move · Enter opens a folder or picks a file · Space picks · Backspace goes up</p>
      <div className="modal-actions">
        <span className="grow muted">{picked.length ? `${picked.length} file${picked.length > 1 ? 's' : ''} picked` : 'No file picked'}</span>
        <button type="button" onClick={onCancel}>
          Cancel
        </button>
        <button type="button" className="primary" disabled={busy || !picked.length} onClick={open}>
          Open {picked.length || ''}
        </button>
      </div>
    </Modal>
  );
}
