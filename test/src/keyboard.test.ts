import { describe, expect, it } from 'vitest';
import { shortcutFor, type KeyPress } from '../../src/keyboard';

const press = (key: string, tagName = 'BODY', extra: Partial<KeyPress> = {}): KeyPress => ({
  key,
  ctrlKey: false,
  metaKey: false,
  altKey: false,
  target: { tagName, isContentEditable: false },
  ...extra,
});

describe('keyboard shortcuts', () => {
  it('space plays or pauses and → steps, on the page', () => {
    expect(shortcutFor(press(' '))).toBe('togglePlay');
    expect(shortcutFor(press('ArrowRight'))).toBe('stepOnce');
    expect(shortcutFor(press('ArrowLeft'))).toBeNull();
    expect(shortcutFor(press('a'))).toBeNull();
  });

  it('leave keys to fields and to editable text', () => {
    for (const tag of ['INPUT', 'TEXTAREA', 'SELECT', 'input']) {
      expect(shortcutFor(press(' ', tag))).toBeNull();
      expect(shortcutFor(press('ArrowRight', tag))).toBeNull();
    }
    expect(shortcutFor(press(' ', 'DIV', { target: { tagName: 'DIV', isContentEditable: true } }))).toBeNull();
  });

  it('leave space to buttons (it presses them), but → still steps from a button', () => {
    expect(shortcutFor(press(' ', 'BUTTON'))).toBeNull();
    expect(shortcutFor(press(' ', 'A'))).toBeNull();
    expect(shortcutFor(press('ArrowRight', 'BUTTON'))).toBe('stepOnce');
  });

  it('leave keys with modifiers to the browser', () => {
    expect(shortcutFor(press(' ', 'BODY', { ctrlKey: true }))).toBeNull();
    expect(shortcutFor(press('ArrowRight', 'BODY', { altKey: true }))).toBeNull();
    expect(shortcutFor(press('ArrowRight', 'BODY', { metaKey: true }))).toBeNull();
  });

  it('work with no focused element', () => {
    expect(shortcutFor(press(' ', 'BODY', { target: null }))).toBe('togglePlay');
  });
});
