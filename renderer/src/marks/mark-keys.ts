/**
 * The in/out mark keys, the same on Watch and Sync. Taken there already: the player's
 * (Space, arrows, , . J K L G M Home End PageUp/Down), Watch's layers (D B T Q O E I H X V,
 * with Shift) and P R S Esc, Sync's 1–7 W A N X C [ ] F Delete, the app's N, Alt+1…5 and
 * Ctrl+Z/Y/S/O/Shift+H. I and O are layers, so the pair is Y and U (side by side, in then out).
 *
 *   markActionOf({ key: 'y' })                 -> 'in'
 *   markActionOf({ key: 'U', shiftKey: true }) -> 'clear'
 */
import type { KeyLike } from '../player/player-keys.ts';

export type MarkAction = 'in' | 'out' | 'clear';

/** As shown in the key help and aria-keyshortcuts. */
export const MARK_KEYS: Record<MarkAction, string> = { in: 'Y', out: 'U', clear: 'Shift+U' };

export function markActionOf(e: KeyLike): MarkAction | undefined {
  if (e.ctrlKey || e.altKey || e.metaKey) return undefined;
  const k = e.key.toLowerCase();
  if (k === 'y') return e.shiftKey ? undefined : 'in';
  if (k === 'u') return e.shiftKey ? 'clear' : 'out';
  return undefined;
}
