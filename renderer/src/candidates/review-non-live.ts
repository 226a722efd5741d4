/**
 * The analyst's answer to a proposed non-live stretch, as one undoable step each
 * (history commit()): confirm keeps it (status 'confirmed', used by fits and overlays),
 * reject deletes it. For the Sync screen's one-key confirm.
 *
 *   await confirmNonLive(db, projectId, rowId, user);  // Ctrl+Z takes it back
 */
import type { WhistlemarkDb } from '../db/database.ts';
import type { NonLiveRow } from '../db/rows.ts';
import { commit } from '../history/history.ts';

async function proposed(db: WhistlemarkDb, projectId: number, id: number): Promise<NonLiveRow> {
  const row = await db.nonLive.get(id);
  if (!row || row.projectId !== projectId) throw new Error(`Non-live stretch ${id} is not in this project (deleted meanwhile?). Nothing was changed.`);
  return row;
}

const span = (r: NonLiveRow) => `${r.kind.replace('_', '-')} ${r.fromT.toFixed(2)}–${r.toT.toFixed(2)} s`;

export async function confirmNonLive(db: WhistlemarkDb, projectId: number, id: number, user: string): Promise<void> {
  const row = await proposed(db, projectId, id);
  if (row.status === 'confirmed') return;
  await commit(db, { projectId, user, subject: 'nonLive', what: `confirm non-live ${span(row)}`, changes: [{ table: 'nonLive', key: id, after: { ...row, status: 'confirmed' } }] });
}

export async function rejectNonLive(db: WhistlemarkDb, projectId: number, id: number, user: string): Promise<void> {
  const row = await proposed(db, projectId, id);
  await commit(db, { projectId, user, subject: 'nonLive', what: `reject non-live ${span(row)}`, changes: [{ table: 'nonLive', key: id }] });
}
