/** Top bar: the match project switcher, creator and delete (with confirmation). */
import { useEffect, useState } from 'react';
import type { WhistlemarkDb } from '../db/database.ts';
import type { ProjectRow } from '../db/rows.ts';
import { createProject, deleteProject } from '../db/store.ts';
import { useServices } from './context.ts';
import { ConfirmDialog, PromptDialog } from './Dialogs.tsx';
import { ProjectMenu } from '../export/ExportMenu.tsx';

export async function selectProject(db: WhistlemarkDb, id: number | undefined) {
  await db.settings.put({ key: 'currentProject', value: id });
}

export function ProjectBar({ projects, currentId }: { projects: ProjectRow[]; currentId: number | undefined }) {
  const { db, info } = useServices();
  const [creating, setCreating] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const current = projects.find((p) => p.id === currentId);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      // Alt+N, like Alt+1…5 for the screens: a plain N is "next proposal" on Sync and Review.
      if (e.code !== 'KeyN' || !e.altKey || e.ctrlKey || e.metaKey || e.shiftKey || document.querySelector('dialog[open]')) return;
      e.preventDefault();
      setCreating(true);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
  return (
    <header className="topbar">
      <div className="brand" aria-label="Whistlemark">
        <svg width="22" height="22" viewBox="0 0 22 22" aria-hidden="true">
          <circle cx="11" cy="11" r="9" fill="none" stroke="currentColor" strokeWidth="2" />
          <path d="M11 4v7l5 3" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        </svg>
        <span>Whistlemark</span>
      </div>
      <label className="project-picker">
        <span className="sr-only">Match project</span>
        <select
          value={currentId ?? ''}
          onChange={(e) => selectProject(db, e.target.value ? Number(e.target.value) : undefined)}
          aria-label="Match project"
        >
          {projects.length === 0 && <option value="">No match project yet</option>}
          {projects.map((p) => (
            <option key={p.id} value={p.id}>
              {p.title}
              {p.demo && !/demo/i.test(p.title) ? ' (demo)' : ''}
            </option>
          ))}
        </select>
      </label>
      <button type="button" onClick={() => setCreating(true)} title="New match project (Alt+N)">
        New match project <kbd>Alt+N</kbd>
      </button>
      <button type="button" className="quiet danger-text" disabled={!current} onClick={() => setDeleting(true)}>
        Delete project…
      </button>
      <ProjectMenu projectId={current?.id} onOpened={(id) => void selectProject(db, id)} />
      <span className="topbar-spacer" />
      <span className="host-badge" title="Where the app runs; everything stays on this machine">
        {info.mode === 'electron' ? 'desktop' : 'browser mode'} · local only · {info.userName}
      </span>
      {creating && (
        <PromptDialog
          title="New match project"
          label="Title"
          submitLabel="Create"
          onCancel={() => setCreating(false)}
          onSubmit={async (title) => {
            const id = await createProject(db, title, info.userName);
            await selectProject(db, id);
            setCreating(false);
          }}
        />
      )}
      {deleting && current && (
        <ConfirmDialog
          title="Delete match project?"
          message={
            <p>
              “{current.title}” and all its imported sources, anchors, corrections and reels will be removed from this machine's project
              database. The original files on disk are not touched.
            </p>
          }
          confirmLabel="Delete project"
          onCancel={() => setDeleting(false)}
          onConfirm={async () => {
            await deleteProject(db, current.id!);
            const next = projects.find((p) => p.id !== current.id);
            await selectProject(db, next?.id);
            setDeleting(false);
          }}
        />
      )}
    </header>
  );
}
