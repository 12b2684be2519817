import { describe, expect, it } from 'vitest';
import { logAxisFor, logTicks, placeRungs, xOf } from '../../../src/views/ladderLayout';

describe('scale ladder layout', () => {
  it('spans every wavenumber with room, on half-decade bounds', () => {
    const axis = logAxisFor([0.02, 1, 24, 42], 0, 100);
    expect(axis.kMin).toBeCloseTo(Math.pow(10, -2), 12);
    expect(axis.kMax).toBeCloseTo(Math.pow(10, 2), 12);
    expect(xOf(axis, axis.kMin)).toBeCloseTo(0, 12);
    expect(xOf(axis, axis.kMax)).toBeCloseTo(100, 12);
    expect(xOf(axis, 1)).toBeCloseTo(50, 12);
  });

  it('widens a narrow span to at least a decade', () => {
    const axis = logAxisFor([20, 24], 0, 100);
    expect(axis.kMax / axis.kMin).toBeGreaterThanOrEqual(10);
  });

  it('ticks 1, 2, 5 × 10ⁿ, majors at powers of ten', () => {
    const t = logTicks({ kMin: 0.5, kMax: 20, x0: 0, x1: 1 });
    expect(t.map((x) => x.k)).toEqual([0.5, 1, 2, 5, 10, 20]);
    expect(t.filter((x) => x.major).map((x) => x.k)).toEqual([1, 10]);
  });

  it('lifts a label clear of a close neighbour, and keeps far ones on the first level', () => {
    const axis = { kMin: 1, kMax: 1000, x0: 0, x1: 900 };
    const placed = placeRungs(axis, [
      { id: 'forcing', symbol: 'k_f', k: 24, title: '' },
      { id: 'transitional', symbol: 'k_β', k: 20, title: '' },
      { id: 'domain', symbol: 'k_L', k: 1, title: '' },
    ]);
    expect(placed.map((r) => r.id)).toEqual(['domain', 'transitional', 'forcing']);
    expect(placed.map((r) => r.level)).toEqual([0, 0, 1]);
  });
});
