/**
 * Audit entries in words: which fields of which row went from what to what. Nested
 * objects are compared one level down (status, proposal.trackingTime, current.t …).
 *
 *   describeChanges(entry) → [{ row: 'corrections 7', field: 'status', before: 'proposed', after: 'accepted' }]
 */
import type { AuditRow, RowChange } from '../db/rows.ts';

export interface FieldChange {
  row: string;
  field: string;
  before: string;
  after: string;
}

const SKIP = new Set(['id', 'updatedAt', 'projectId']);

export function formatValue(v: unknown): string {
  if (v === undefined) return '—';
  if (typeof v === 'number') return Number.isInteger(v) ? String(v) : Number.isFinite(v) ? v.toFixed(3).replace(/\.?0+$/, '') : String(v);
  if (typeof v === 'string') return v.length > 60 ? `${v.slice(0, 57)}…` : v;
  if (ArrayBuffer.isView(v)) return `${v.constructor.name}(${(v as unknown as ArrayLike<number>).length})`;
  if (Array.isArray(v)) return `[${v.length} items]`;
  if (v && typeof v === 'object') {
    const s = JSON.stringify(v);
    return s.length > 60 ? `${s.slice(0, 57)}…` : s;
  }
  return String(v);
}

function same(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a === 'number' && typeof b === 'number' && Number.isNaN(a) && Number.isNaN(b)) return true;
  if (a && b && typeof a === 'object' && typeof b === 'object') return JSON.stringify(a) === JSON.stringify(b);
  return false;
}

function diffRows(label: string, before: unknown, after: unknown, out: FieldChange[]) {
  if (before === undefined || after === undefined) {
    out.push({ row: label, field: '(row)', before: before === undefined ? 'absent' : 'present', after: after === undefined ? 'deleted' : 'added' });
    return;
  }
  const b = before as Record<string, unknown>;
  const a = after as Record<string, unknown>;
  for (const k of new Set([...Object.keys(b), ...Object.keys(a)])) {
    if (SKIP.has(k) || same(b[k], a[k])) continue;
    const bv = b[k];
    const av = a[k];
    const nested = bv && av && typeof bv === 'object' && typeof av === 'object' && !Array.isArray(bv) && !ArrayBuffer.isView(bv);
    if (nested) {
      const bo = bv as Record<string, unknown>;
      const ao = av as Record<string, unknown>;
      for (const kk of new Set([...Object.keys(bo), ...Object.keys(ao)])) if (!same(bo[kk], ao[kk])) out.push({ row: label, field: `${k}.${kk}`, before: formatValue(bo[kk]), after: formatValue(ao[kk]) });
    } else out.push({ row: label, field: k, before: formatValue(bv), after: formatValue(av) });
  }
}

export function describeChanges(entry: AuditRow): FieldChange[] {
  const out: FieldChange[] = [];
  if (entry.changes) for (const c of entry.changes as RowChange[]) diffRows(rowLabel(c), c.before, c.after, out);
  else if (entry.before !== undefined || entry.after !== undefined) out.push({ row: '', field: '', before: formatValue(entry.before), after: formatValue(entry.after) });
  return out;
}

function rowLabel(c: RowChange): string {
  const row = (c.after ?? c.before) as Record<string, unknown> | undefined;
  const name = typeof row?.eventId === 'string' ? ` ${row.eventId}` : typeof row?.title === 'string' ? ` “${row.title}”` : '';
  return `${c.table} ${c.key}${name}`;
}
