import { describe, expect, it } from 'vitest';
import { saveDue } from '../../../src/keep/saveDue';

describe('saveDue', () => {
  it('saves at once when play stops, whatever the time since the last save', () => {
    expect(saveDue(true, false, 0, 15_000)).toBe('paused');
  });

  it('saves a playing run every everyMs, and a paused one never by the clock', () => {
    expect(saveDue(true, true, 14_999, 15_000)).toBeNull();
    expect(saveDue(true, true, 15_000, 15_000)).toBe('timer');
    expect(saveDue(false, true, 15_000, 15_000)).toBe('timer');
    expect(saveDue(false, false, 1e9, 15_000)).toBeNull();
  });
});
