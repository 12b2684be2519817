import { availableParallelism } from 'node:os';
import { describe, expect, it } from 'vitest';
import { threadsFor } from '../../cli/threadsOption';
import { DEFAULT_THREADS_MIN_POINTS, MAX_THREADS } from '../../lib/model/stepTeam';

describe('threads of a single run', () => {
  const every = Math.min(MAX_THREADS, Math.max(1, availableParallelism()));

  it('takes one thread below the default threshold and every core from it up, unless asked', () => {
    const side = Math.sqrt(DEFAULT_THREADS_MIN_POINTS);
    expect(threadsFor({}, { nx: side / 2, ny: side })).toBe(1);
    expect(threadsFor({}, { nx: side, ny: side })).toBe(every);
    expect(threadsFor({ threads: 3 }, { nx: 64, ny: 64 })).toBe(3);
  });

  it('refuses more threads than a step can take', () => {
    expect(() => threadsFor({ threads: MAX_THREADS + 1 }, { nx: 64, ny: 64 })).toThrow(/at most/);
  });
});
