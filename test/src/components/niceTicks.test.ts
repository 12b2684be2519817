import { describe, expect, it } from 'vitest';
import { niceTicks, tickLabel } from '../../../src/components/niceTicks';

describe('niceTicks', () => {
  it('covers the interval with steps of 1, 2 or 5 × 10ⁿ', () => {
    expect(niceTicks(0, 2 * Math.PI, 6)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(-17.6, 17.6, 4)).toEqual([-10, 0, 10]);
    expect(niceTicks(-0.0031, 0.0031, 4)).toEqual([-0.002, 0, 0.002]);
  });

  it('gives nothing for an empty or non-finite interval', () => {
    expect(niceTicks(1, 1)).toEqual([]);
    expect(niceTicks(0, NaN)).toEqual([]);
  });

  it('labels with the digits the step needs', () => {
    expect(tickLabel(2, 1)).toBe('2');
    expect(tickLabel(0.5, 0.5)).toBe('0.5');
    expect(tickLabel(-0.002, 0.002)).toBe('-0.002');
    expect(tickLabel(0.0004, 0.0002)).toBe('4e-4');
    expect(tickLabel(0, 0.1)).toBe('0');
    expect(tickLabel(20000, 10000)).toBe('2e+4');
  });
});
