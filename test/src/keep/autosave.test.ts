import { describe, expect, it } from 'vitest';
import { asSavedRun, tabId } from '../../../src/keep/autosave';

/** A Storage over a Map: what sessionStorage offers, in Node. */
function memoryStorage(): Storage {
  const m = new Map<string, string>();
  return {
    get length() {
      return m.size;
    },
    clear: () => m.clear(),
    getItem: (k) => m.get(k) ?? null,
    key: (i) => [...m.keys()][i] ?? null,
    removeItem: (k) => void m.delete(k),
    setItem: (k, v) => void m.set(k, String(v)),
  };
}

describe('tabId', () => {
  it('is made once per tab and then read back; another tab gets another', () => {
    const a = memoryStorage();
    const id = tabId(a);
    expect(id).toMatch(/^[0-9a-f]{24}$/);
    expect(tabId(a)).toBe(id);
    expect(tabId(memoryStorage())).not.toBe(id);
  });
});

describe('asSavedRun', () => {
  const good = { tab: 'abc', savedAt: 1.7e12, time: 12.5, steps: 625, playing: true, text: '{}' };

  it('reads back a record of the shape written', () => {
    expect(asSavedRun(good)).toEqual(good);
    expect(asSavedRun({ ...good, extra: 1 })).toEqual(good);
  });

  it('reads anything else as nothing kept', () => {
    for (const bad of [
      null,
      undefined,
      'x',
      3,
      {},
      { ...good, tab: 1 },
      { ...good, text: null },
      { ...good, playing: 'yes' },
      { ...good, time: Number.NaN },
      { ...good, steps: '625' },
      { ...good, savedAt: Infinity },
    ]) {
      expect(asSavedRun(bad)).toBeNull();
    }
  });
});
