import { describe, expect, it } from 'vitest';
import { uniqueKeys } from '../../../src/components/uniqueKeys';

describe('uniqueKeys', () => {
  it('keeps every item, in order, each with a key of its own', () => {
    const notes = ['a note', 'another', 'a note', 'a note'];
    const keyed = uniqueKeys(notes, (n) => n);
    expect(keyed.map((k) => k.item)).toEqual(notes);
    expect(keyed.map((k) => k.key)).toEqual(['a note', 'another', 'a note#2', 'a note#3']);
    expect(new Set(keyed.map((k) => k.key)).size).toBe(notes.length);
  });

  it('stays unique when an item already looks like a numbered repeat', () => {
    const keys = uniqueKeys(['x#2', 'x', 'x'], (s) => s).map((k) => k.key);
    expect(keys).toEqual(['x#2', 'x', 'x#3']);
    expect(new Set(keys).size).toBe(3);
  });
});
