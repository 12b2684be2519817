import { describe, expect, it } from 'vitest';
import { BlockMean, RecentMean } from '../../workers/recentMean';

describe('RecentMean', () => {
  it('averages the last `capacity` arrays exactly, dropping the oldest', () => {
    const m = new RecentMean(2, 3);
    expect(Array.from(m.mean())).toEqual([0, 0]);
    m.add(1, [1, 10]);
    m.add(2, [2, 20]);
    expect(Array.from(m.mean())).toEqual([1.5, 15]);
    m.add(3, [3, 30]);
    m.add(4, [7, 70]);
    // Holds 2, 3, 7 now.
    expect(Array.from(m.mean())).toEqual([4, 40]);
    expect(m.count).toBe(3);
    expect(m.span).toEqual({ tStart: 2, tEnd: 4 });
  });

  it('refuses arrays of another length', () => {
    expect(() => new RecentMean(3, 2).add(0, [1, 2])).toThrow(/expected 3/);
  });
});

describe('BlockMean', () => {
  it('gives the filling block until one is complete, then the last complete block', () => {
    const b = new BlockMean(1, 2);
    b.add([4]);
    expect(b.mean()[0]).toBe(4);
    expect(b.blockCount).toBe(1);
    b.add([6]);
    expect(b.mean()[0]).toBe(5);
    b.add([100]);
    // The block being filled does not show while a complete one exists.
    expect(b.mean()[0]).toBe(5);
    expect(b.blockCount).toBe(2);
  });
});
