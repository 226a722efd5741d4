/** The Review keys: single keys act, player keys and modified keys never do. */
import { describe, expect, it } from 'vitest';
import { REVIEW_KEYS, reviewActionFor } from '../../../renderer/src/review/review-keys.ts';

const press = (key: string, o: { shift?: boolean; ctrl?: boolean; alt?: boolean; code?: string } = {}, focused = false) =>
  reviewActionFor({ key, code: o.code ?? '', shiftKey: !!o.shift, ctrlKey: !!o.ctrl, altKey: !!o.alt, metaKey: false }, focused);

describe('review keys', () => {
  it('maps the single keys', () => {
    expect(press('a')).toBe('accept');
    expect(press('A', { shift: true })).toBe('acceptAbove');
    expect(press('r')).toBe('reject');
    expect(press('[', { code: 'BracketLeft' })).toBe('minus1');
    expect(press('{', { shift: true, code: 'BracketLeft' })).toBe('minus5');
    expect(press(']', { code: 'BracketRight' })).toBe('plus1');
    expect(press('}', { shift: true, code: 'BracketRight' })).toBe('plus5');
    expect(press('f')).toBe('flip');
    expect(press('o')).toBe('reopen');
    expect(press('n')).toBe('nextOpen');
    expect(press('?', { shift: true })).toBe('help');
  });

  it('leaves the player keys, screen keys and undo alone; arrows only with the queue focused', () => {
    for (const k of [' ', 'ArrowLeft', 'ArrowRight', 'j', 'k', 'l', 'g', 'J', 'K', 'L', 'G']) expect(press(k)).toBeUndefined();
    expect(press('ArrowLeft', { shift: true })).toBeUndefined();
    expect(press('3', { alt: true })).toBeUndefined();
    expect(press('z', { ctrl: true })).toBeUndefined();
    expect(press('a', { ctrl: true })).toBeUndefined();
    expect(press('ArrowDown')).toBeUndefined();
    expect(press('ArrowDown', {}, true)).toBe('next');
    expect(press('ArrowUp', {}, true)).toBe('prev');
  });

  it('lists every action once in the help', () => {
    const actions = REVIEW_KEYS.map((k) => k.action);
    expect(new Set(actions).size).toBe(actions.length);
  });
});
