/**
 * The Review screen's single keys. Player keys (Space, ←/→, Shift+←/→, J, K, L, G),
 * Alt+1…5 and Ctrl+Z/Y belong to others and are never taken here; ↑/↓ move in the queue
 * only while the queue has focus.
 */
export type ReviewAction =
  | 'accept'
  | 'reject'
  | 'reopen'
  | 'minus1'
  | 'plus1'
  | 'minus5'
  | 'plus5'
  | 'flip'
  | 'acceptAbove'
  | 'nextOpen'
  | 'prev'
  | 'next'
  | 'help'
  | 'close';

export interface KeyInfo {
  action: ReviewAction;
  /** As shown to the analyst and in aria-keyshortcuts. */
  keys: string;
  aria: string;
  does: string;
}

export const REVIEW_KEYS: KeyInfo[] = [
  { action: 'accept', keys: 'A', aria: 'A', does: 'accept the proposal (then the next open one)' },
  { action: 'reject', keys: 'R', aria: 'R', does: 'reject it: keep the logged time and place' },
  { action: 'minus1', keys: '[', aria: '[', does: 'edit: proposed moment 1 frame earlier' },
  { action: 'plus1', keys: ']', aria: ']', does: 'edit: proposed moment 1 frame later' },
  { action: 'minus5', keys: 'Shift+[', aria: 'Shift+[', does: 'edit: 5 frames earlier' },
  { action: 'plus5', keys: 'Shift+]', aria: 'Shift+]', does: 'edit: 5 frames later' },
  { action: 'flip', keys: 'F', aria: 'F', does: 'flip between the logged and the proposed moment' },
  { action: 'reopen', keys: 'O', aria: 'O', does: 'reopen: back to an open proposal' },
  { action: 'acceptAbove', keys: 'Shift+A', aria: 'Shift+A', does: 'accept every open proposal in the list at or above the confidence set' },
  { action: 'nextOpen', keys: 'N', aria: 'N', does: 'go to the next open proposal' },
  { action: 'prev', keys: '↑', aria: 'ArrowUp', does: 'previous in the queue (queue focused)' },
  { action: 'next', keys: '↓', aria: 'ArrowDown', does: 'next in the queue (queue focused)' },
  { action: 'help', keys: '?', aria: '?', does: 'show or hide these keys' },
  { action: 'close', keys: 'Esc', aria: 'Escape', does: 'close the keys help' },
];

export const keyOf = (a: ReviewAction): KeyInfo => REVIEW_KEYS.find((k) => k.action === a)!;

/** The action of a key press, or undefined (modifiers other than Shift never match). */
export function reviewActionFor(e: { key: string; code?: string; shiftKey: boolean; ctrlKey: boolean; altKey: boolean; metaKey: boolean }, queueFocused: boolean): ReviewAction | undefined {
  if (e.ctrlKey || e.altKey || e.metaKey) return undefined;
  const k = e.key;
  // Shift+[ types '{' on many layouts; the physical key says which bracket it was.
  if (e.code === 'BracketLeft' || k === '[' || k === '{') return e.shiftKey || k === '{' ? 'minus5' : 'minus1';
  if (e.code === 'BracketRight' || k === ']' || k === '}') return e.shiftKey || k === '}' ? 'plus5' : 'plus1';
  switch (k.toLowerCase()) {
    case 'a':
      return e.shiftKey ? 'acceptAbove' : 'accept';
    case 'r':
      return e.shiftKey ? undefined : 'reject';
    case 'o':
      return e.shiftKey ? undefined : 'reopen';
    case 'f':
      return e.shiftKey ? undefined : 'flip';
    case 'n':
      return e.shiftKey ? undefined : 'nextOpen';
    case '?':
      return 'help';
    case 'escape':
      return 'close';
    case 'arrowup':
      return queueFocused && !e.shiftKey ? 'prev' : undefined;
    case 'arrowdown':
      return queueFocused && !e.shiftKey ? 'next' : undefined;
  }
  return undefined;
}
