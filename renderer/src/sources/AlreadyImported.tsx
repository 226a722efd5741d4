/** A note when the opened file is already a source of this project, so nothing is doubled by mistake. */
import type { OpenedFile } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { useLive } from '../app/useLive.ts';

export function AlreadyImported({ projectId, file }: { projectId: number; file: OpenedFile }) {
  const { db } = useServices();
  const same = useLive(() => db.sources.where('projectId').equals(projectId).filter((s) => s.path === file.path).toArray(), [projectId, file.path]);
  if (!same?.length) return null;
  const last = same[same.length - 1];
  const unchanged = last.size === file.size && last.mtimeMs === file.mtimeMs;
  return (
    <p className="note-warn" role="note">
      This file is already in this match project (imported {new Date(last.importedAt).toLocaleString('en-GB')}
      {unchanged ? ', unchanged since' : ', and it has changed since'}). Importing again adds a second source; remove the old one if this replaces it.
    </p>
  );
}
