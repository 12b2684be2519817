/** What a key press asks of the run. */
export type Shortcut = 'togglePlay' | 'stepOnce';

/** The parts of a KeyboardEvent the shortcuts look at (a plain object in tests). */
export interface KeyPress {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  altKey: boolean;
  /** The focused element: its tag name and whether it is editable text. */
  target: { tagName?: string; isContentEditable?: boolean } | null;
}

/** Fields that take typing and arrow keys themselves (text, numbers, radios, lists). */
const FIELDS = new Set(['INPUT', 'TEXTAREA', 'SELECT']);
/** Controls that space presses. */
const PRESSABLE = new Set(['BUTTON', 'A', 'SUMMARY']);

/**
 * Space plays or pauses, → takes one step; neither while the focus is in a field (typing, choosing),
 * space not on a control it would press, and nothing with a modifier (browser shortcuts keep working).
 */
export function shortcutFor(e: KeyPress): Shortcut | null {
  if (e.ctrlKey || e.metaKey || e.altKey) return null;
  const tag = (e.target?.tagName ?? '').toUpperCase();
  if (e.target?.isContentEditable || FIELDS.has(tag)) return null;
  if (e.key === ' ' || e.key === 'Spacebar') return PRESSABLE.has(tag) ? null : 'togglePlay';
  if (e.key === 'ArrowRight') return 'stepOnce';
  return null;
}
