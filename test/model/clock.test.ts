import { describe, expect, it } from 'vitest';
import { CLOCK_TOLERANCE, reachedTime } from '../../lib/model/clock';

describe('model clock', () => {
  it('counts a target as reached within a thousandth of a step, not before', () => {
    let t = 0;
    for (let i = 0; i < 500; i++) t += 0.01;
    expect(t).toBeLessThan(5); // the summed clock falls short by round-off [IEEE 754 addition]
    expect(reachedTime(t, 5, 0.01)).toBe(true);
    expect(reachedTime(5 - 0.5 * CLOCK_TOLERANCE * 0.01, 5, 0.01)).toBe(true);
    expect(reachedTime(5 - 2 * CLOCK_TOLERANCE * 0.01, 5, 0.01)).toBe(false);
    expect(reachedTime(4.99, 5, 0.01)).toBe(false);
  });

  it('stays within its tolerance over a million steps of 0.01', () => {
    let t = 0;
    const n = 1_000_000;
    for (let i = 0; i < n; i++) t += 0.01;
    expect(Math.abs(t - n * 0.01)).toBeLessThan(CLOCK_TOLERANCE * 0.01);
  });
});
