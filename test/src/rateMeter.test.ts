import { describe, expect, it } from 'vitest';
import { RateMeter } from '../../src/rateMeter';

describe('RateMeter', () => {
  it('measures steps per second over its window', () => {
    const m = new RateMeter(1000);
    expect(m.sample(0, 0)).toBe(0);
    expect(m.sample(50, 250)).toBe(200);
    for (let t = 500; t <= 3000; t += 250) m.sample(t / 5, t);
    expect(m.rate(3000)).toBeCloseTo(200, 12);
  });

  it('forgets samples older than the window', () => {
    const m = new RateMeter(1000);
    m.sample(0, 0);
    m.sample(1000, 100); // a burst
    for (let t = 200; t <= 2000; t += 100) m.sample(1000 + (t - 100) / 10, t);
    expect(m.rate(2000)).toBeCloseTo(100, 12);
  });

  it('reads zero once nothing has moved for a window, and restarts on a new run', () => {
    const m = new RateMeter(1000);
    m.sample(0, 0);
    m.sample(100, 500);
    expect(m.rate(1600)).toBe(0);
    m.sample(5, 1700); // steps went back: a new run
    expect(m.rate(1700)).toBe(0);
    expect(m.sample(15, 1800)).toBeCloseTo(100, 12);
  });
});
