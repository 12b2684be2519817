import { describe, expect, it } from 'vitest';
import { Watchdog } from '../../../src/keep/watchdog';

const LIMITS = { quietMs: 6000, busyQuietMs: 60_000, minTicks: 3 };

describe('Watchdog', () => {
  it('condemns a worker silent for longer than quietMs over at least minTicks ticks', () => {
    const w = new Watchdog(0, LIMITS);
    const verdicts = [1000, 2000, 3000, 4000, 5000, 6000, 7000].map((t) => w.tick(t, false));
    expect(verdicts).toEqual([false, false, false, false, false, false, true]);
  });

  it('forgives any silence an answer ends', () => {
    const w = new Watchdog(0, LIMITS);
    for (let t = 1000; t <= 5000; t += 1000) expect(w.tick(t, false)).toBe(false);
    w.heard(5500);
    for (let t = 6000; t <= 11_000; t += 1000) expect(w.tick(t, false)).toBe(false);
    expect(w.tick(12_000, false)).toBe(true);
  });

  it('waits for busyQuietMs while a long call is in flight', () => {
    const w = new Watchdog(0, LIMITS);
    for (let t = 1000; t <= 60_000; t += 1000) expect(w.tick(t, true)).toBe(false);
    expect(w.tick(61_000, true)).toBe(true);
  });

  it('does not condemn on the one late tick of a frozen page: the answers queued meanwhile come first', () => {
    const w = new Watchdog(0, LIMITS);
    w.tick(1000, false);
    w.heard(1001);
    // The page froze for 20 s: one late tick, then the waiting answer is read.
    expect(w.tick(21_000, false)).toBe(false);
    w.heard(21_001);
    expect(w.tick(22_000, false)).toBe(false);
  });

  it('never moves its last answer back in time', () => {
    const w = new Watchdog(0, LIMITS);
    w.heard(10_000);
    w.heard(2000);
    for (let t = 11_000; t <= 16_000; t += 1000) expect(w.tick(t, false)).toBe(false);
    expect(w.tick(17_000, false)).toBe(true);
  });
});
