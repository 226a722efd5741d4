/**
 * The player's keys. Editing programs commonly use J/K/L for shuttle (common practice);
 * the rest follow the arrow-key habits of media players. Alt+1..5 and Ctrl+Z/Y belong to
 * the app, so no player key uses Ctrl, Alt or Meta.
 *
 *   playerActionOf({ key: 'ArrowRight', shiftKey: true }) -> { kind: 'jump', seconds: 5 }
 */
export type PlayerAction =
  | { kind: 'toggle' }
  | { kind: 'step'; frames: number }
  | { kind: 'jump'; seconds: number }
  | { kind: 'shuttle'; direction: 1 | -1 }
  | { kind: 'stop' }
  | { kind: 'first' }
  | { kind: 'last' }
  | { kind: 'goto' }
  | { kind: 'mute' };

export interface KeyLike {
  key: string;
  shiftKey?: boolean;
  ctrlKey?: boolean;
  altKey?: boolean;
  metaKey?: boolean;
}

/** Shown in button titles and aria-keyshortcuts. */
export const PLAYER_KEYS = {
  toggle: 'Space',
  stepBack: 'ArrowLeft',
  stepForward: 'ArrowRight',
  jumpBack: 'Shift+ArrowLeft',
  jumpForward: 'Shift+ArrowRight',
  secondBack: 'ArrowDown',
  secondForward: 'ArrowUp',
  longBack: 'PageDown',
  longForward: 'PageUp',
  shuttleBack: 'J',
  stop: 'K',
  shuttleForward: 'L',
  first: 'Home',
  last: 'End',
  goto: 'G',
  mute: 'M',
} as const;

/** Seconds moved by Shift+arrows, the up/down arrows and PageUp/PageDown. */
export const JUMPS = { shift: 5, arrow: 1, page: 30 } as const;

export function playerActionOf(e: KeyLike): PlayerAction | undefined {
  if (e.ctrlKey || e.altKey || e.metaKey) return undefined;
  const shift = Boolean(e.shiftKey);
  switch (e.key) {
    case ' ':
      return shift ? undefined : { kind: 'toggle' };
    case 'ArrowRight':
      return shift ? { kind: 'jump', seconds: JUMPS.shift } : { kind: 'step', frames: 1 };
    case 'ArrowLeft':
      return shift ? { kind: 'jump', seconds: -JUMPS.shift } : { kind: 'step', frames: -1 };
    case '.':
      return { kind: 'step', frames: 1 };
    case ',':
      return { kind: 'step', frames: -1 };
    case 'ArrowUp':
      return { kind: 'jump', seconds: JUMPS.arrow };
    case 'ArrowDown':
      return { kind: 'jump', seconds: -JUMPS.arrow };
    case 'PageUp':
      return { kind: 'jump', seconds: JUMPS.page };
    case 'PageDown':
      return { kind: 'jump', seconds: -JUMPS.page };
    case 'Home':
      return { kind: 'first' };
    case 'End':
      return { kind: 'last' };
  }
  if (shift) return undefined;
  switch (e.key.toLowerCase()) {
    case 'j':
      return { kind: 'shuttle', direction: -1 };
    case 'k':
      return { kind: 'stop' };
    case 'l':
      return { kind: 'shuttle', direction: 1 };
    case 'g':
      return { kind: 'goto' };
    case 'm':
      return { kind: 'mute' };
  }
  return undefined;
}
