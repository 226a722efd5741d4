/**
 * Mapping memory: a mapping the analyst confirmed is offered again for the next file whose
 * header has the same signature (same column names in the same order, whatever the case
 * or surrounding spaces).
 */
import type { SourceMapping } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';

/** FNV-1a, 32 bit: short, stable, good enough to key a table of a few dozen headers. */
function fnv1a(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

/** e.g. headerSignature('events', ['Period', ' Time ']) -> 'events:2:1c3f…' */
export function headerSignature(kind: string, header: readonly string[]): string {
  const normal = header.map((h) => h.trim().toLowerCase()).join('\u001f');
  return `${kind}:${header.length}:${fnv1a(normal)}`;
}

export async function recallMapping(db: WhistlemarkDb, signature: string): Promise<SourceMapping | undefined> {
  const row = await db.mappings.get(signature);
  return row?.mapping;
}

export async function rememberMapping(db: WhistlemarkDb, signature: string, mapping: SourceMapping, fileName: string): Promise<void> {
  await db.transaction('rw', db.mappings, async () => {
    await db.mappings.put({ signature, kind: mapping.kind, mapping, fileName, savedAt: Date.now() });
  });
}

/**
 * The mapping to show for a detected file: the remembered one when its columns still
 * exist in the header, else what detection proposed.
 */
export function chooseMapping(
  detected: SourceMapping | undefined,
  remembered: SourceMapping | undefined,
  header: readonly string[],
): { mapping: SourceMapping | undefined; fromMemory: boolean } {
  if (remembered && mappingColumns(remembered).every((c) => header.includes(c))) {
    return { mapping: remembered, fromMemory: true };
  }
  return { mapping: detected, fromMemory: false };
}

/** Every column name a mapping refers to. */
export function mappingColumns(m: SourceMapping): string[] {
  const out: string[] = [];
  const c = m.columns as Record<string, unknown>;
  for (const [key, v] of Object.entries(c)) {
    if (key === 'objects' && Array.isArray(v)) {
      for (const o of v as { x: string; y: string }[]) out.push(o.x, o.y);
    } else if (typeof v === 'string' && v) out.push(v);
  }
  return out;
}
