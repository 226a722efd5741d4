/**
 * Ctrl+Z / Ctrl+Shift+Z (or Ctrl+Y) undo and redo the project's latest change from any
 * screen; text fields keep their own undo. Reports what happened for the status line.
 */
import { useEffect } from 'react';
import type { WhistlemarkDb } from '../db/database.ts';
import { redo, undo } from '../history/history.ts';
import { isTypingTarget } from './keys.ts';

export function useUndoKeys(db: WhistlemarkDb, projectId: number | undefined, user: string, report: (message: string) => void) {
  useEffect(() => {
    if (projectId === undefined) return;
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.altKey || isTypingTarget(e.target)) return;
      const key = e.key.toLowerCase();
      const wantsRedo = (key === 'z' && e.shiftKey) || (key === 'y' && !e.shiftKey);
      const wantsUndo = key === 'z' && !e.shiftKey;
      if (!wantsRedo && !wantsUndo) return;
      e.preventDefault();
      (wantsUndo ? undo : redo)(db, projectId, user)
        .then((step) => report(step ? `${wantsUndo ? 'Undone' : 'Redone'}: ${step.what}` : wantsUndo ? 'Nothing to undo' : 'Nothing to redo'))
        .catch((err: Error) => report(err.message));
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [db, projectId, user, report]);
}
