import { describe, expect, it } from 'vitest';
import { parseShard, selectShard } from '../../lib/sweep/shard';

describe('shards', () => {
  it('split a sweep into disjoint shares that cover it, within one run of each other', () => {
    const jobs = Array.from({ length: 11 }, (_, index) => ({ index }));
    for (const n of [1, 2, 3, 4, 11, 13]) {
      const shares = Array.from({ length: n }, (_, i) => selectShard(jobs, { index: i, count: n }).map((j) => j.index));
      expect(shares.flat().sort((a, b) => a - b)).toEqual(jobs.map((j) => j.index));
      const sizes = shares.map((s) => s.length);
      expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
    }
  });

  it('read i/n and refuse anything else with the reason', () => {
    expect(parseShard('2/4')).toEqual({ index: 2, count: 4 });
    expect(() => parseShard('4/4')).toThrow(/below 4/);
    expect(() => parseShard('1/0')).toThrow(/at least 1/);
    expect(() => parseShard('1-4')).toThrow(/i\/n/);
  });
});
