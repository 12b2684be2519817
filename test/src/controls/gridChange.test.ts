import { describe, expect, it } from 'vitest';
import { keptRadius, validateParams } from '../../../lib/model/validateParams';
import { withGridHyperviscosity } from '../../../src/controls/gridChange';

const p = validateParams({ nx: 128, ny: 128 });

describe('the hyperviscosity follows a change of grid in the app', () => {
  it('rescales ν so the damping rate ν k_max^{2p} stays what it was, unless ν was set by hand', () => {
    const r = withGridHyperviscosity(p, { nx: 256, ny: 256 }, false);
    const nu = r.changes.nu!;
    // Damping rate at the kept radius [derived: ν k_max^{2p}, docs of gridHyperviscosity.ts]; ν is
    // rounded to 4 significant figures, so the rate agrees to 5e-4.
    const rate = (q: typeof p) => q.nu * Math.pow(keptRadius(q), 2 * q.nu_order);
    const next = { ...p, nx: 256, ny: 256, nu };
    expect(Math.abs(rate(next) / rate(p) - 1)).toBeLessThan(5e-4);
    expect(nu).toBeLessThan(p.nu);
    expect(r.note).toMatch(/ν follows the grid/);
    const byHand = withGridHyperviscosity(p, { ny: 256 }, true);
    expect(byHand.changes).toEqual({ ny: 256 });
    expect(byHand.note).toMatch(/as you set it by hand/);
  });

  it('leaves other changes, a grid change that keeps k_max, and one that brings its own ν alone', () => {
    // k_max = min over the two axes (2/3 rule): nx alone on a square domain leaves it.
    expect(withGridHyperviscosity(p, { nx: 256 }, false)).toEqual({ changes: { nx: 256 }, note: null });
    expect(withGridHyperviscosity(p, { beta: 3 }, false)).toEqual({ changes: { beta: 3 }, note: null });
    expect(withGridHyperviscosity(p, { nx: 256, nu: 1e-30 }, false).changes.nu).toBe(1e-30);
  });
});
