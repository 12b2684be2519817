import { describe, expect, it } from 'vitest';
import { Grid } from '../../lib/model/grid';

// Exact small cases of the layout stated in lib/model/grid.ts (common practice: 2/3 rule of Orszag).
describe('Grid', () => {
  const g = new Grid({ nx: 32, ny: 64, Lx: 2 * Math.PI, Ly: 4 * Math.PI });

  it('has the stated sizes and wavenumbers', () => {
    expect(g.nkx).toBe(17);
    expect(g.spectralSize).toBe(64 * 17);
    expect(g.kx[3]).toBeCloseTo(3, 14);
    expect(g.ky[5]).toBeCloseTo(2.5, 14);
    expect(g.ky[63]).toBeCloseTo(-0.5, 14);
    expect(g.ky[32]).toBeCloseTo(16, 14); // the Nyquist row counts as positive
    expect(g.k2[5 * 17 + 3]).toBeCloseTo(9 + 6.25, 12);
  });

  it('keeps |ix| ≤ ⌊nx/3⌋ and |m| ≤ ⌊ny/3⌋ but not the mean', () => {
    expect(g.Kx).toBe(10);
    expect(g.Ky).toBe(21);
    expect(g.kept(0, 0)).toBe(false);
    expect(g.kept(10, 21)).toBe(true);
    expect(g.kept(11, 0)).toBe(false);
    expect(g.kept(0, 64 - 21)).toBe(true);
    expect(g.kept(0, 64 - 22)).toBe(false);
    let n = 0;
    for (let jy = 0; jy < g.ny; jy++) for (let ix = 0; ix < g.nkx; ix++) if (g.kept(ix, jy)) n++;
    expect(n).toBe(11 * 43 - 1);
    expect(Array.from(g.keptRows).length).toBe(43);
    // 3·Kx < nx: products of kept modes alias only onto discarded ones.
    expect(3 * g.Kx).toBeLessThan(g.nx);
    expect(g.kMaxKept).toBeCloseTo(Math.min(10, 10.5), 12);
  });

  it('weighs the stored half plane for full-plane sums', () => {
    expect(g.weight(0)).toBe(1);
    expect(g.weight(16)).toBe(1);
    expect(g.weight(5)).toBe(2);
  });
});
