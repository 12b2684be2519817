import { describe, expect, it } from 'vitest';
import { Grid } from '../../lib/model/grid';
import { Model } from '../../lib/model/model';
import { regridSpectrum } from '../../lib/model/regrid';
import { maxAbsDiff } from '../support/random';
import { randomKeptState } from '../support/modelFixtures';

// Spectral padding and truncation (common practice): padding is exact interpolation, so a padded
// field equals the original at the coarse points, and truncating the padded spectrum gives it back.
describe('regridSpectrum', () => {
  it('pads exactly and truncates back', () => {
    const coarse = new Model({ nx: 32, ny: 64, Ly: 4 * Math.PI, forcing: 'none' });
    coarse.setState(randomKeptState(coarse, 3));
    const fine = new Grid({ nx: 128, ny: 128, Lx: coarse.grid.Lx, Ly: coarse.grid.Ly });
    const padded = regridSpectrum(coarse.qHat, coarse.grid, fine);
    const back = regridSpectrum(padded, fine, coarse.grid);
    expect(maxAbsDiff(back, coarse.qHat)).toBe(0);
    const fineModel = coarse.reconfigure({ nx: 128, ny: 128 });
    expect(fineModel).not.toBe(coarse);
    const a = coarse.field('q');
    const b = fineModel.field('q');
    let worst = 0;
    for (let j = 0; j < 64; j++)
      for (let i = 0; i < 32; i++) worst = Math.max(worst, Math.abs(a[j * 32 + i] - b[2 * j * 128 + 4 * i]));
    expect(worst).toBeLessThan(1e-12);
  });

  it('refuses a change of domain', () => {
    const a = new Grid({ nx: 32, ny: 32, Lx: 1, Ly: 1 });
    const b = new Grid({ nx: 64, ny: 64, Lx: 2, Ly: 1 });
    expect(() => regridSpectrum(new Float64Array(2 * a.spectralSize), a, b)).toThrow(/domain/);
  });

  it('changes physical parameters in place, keeping the state and the clock', () => {
    const m = new Model({ nx: 32, ny: 32, kf: 6, dkf: 1, dt: 0.01 });
    m.step(10);
    const q = m.qHat.slice();
    const t = m.time;
    const same = m.reconfigure({ mu: 0.3, beta: 2 });
    expect(same).toBe(m);
    expect(m.params.mu).toBe(0.3);
    expect(maxAbsDiff(m.qHat, q)).toBe(0);
    expect(m.time).toBe(t);
    m.step(1);
    expect(m.steps).toBe(11);
  });
});
