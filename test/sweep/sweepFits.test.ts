import { describe, expect, it } from 'vitest';
import { runSweepJob } from '../../lib/sweep/runSweepJob';
import { sweepFits } from '../../lib/sweep/sweepFits';
import { expandSweep } from '../../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../../lib/sweep/sweepSpec';
import { tableColumns, tableRows, type TableRow } from '../../lib/sweep/sweepTable';

const clock = { seconds: () => 0, iso: () => '2025-01-01T00:00:00Z' };

describe('two-layer sweeps and the fits against the criticality', () => {
  it('accept the two-layer keys and give the eddy diffusivity and velocity in thermal-wind units', () => {
    const spec = parseSweepSpec({
      base: {
        layers: 2,
        kd: 4,
        depth_ratio: 1,
        nx: 32,
        ny: 32,
        kf: 8,
        dkf: 1.5,
        mu: 0.5,
        eps: 0.5,
        nu: 1e-8,
        dt: 0.02,
      },
      vary: [{ param: 'shear', values: [0.5, 1] }],
      length: { steps: 40 },
      average: 0.4,
    });
    const records = expandSweep(spec).map((j) => runSweepJob(j, clock));
    const rows = tableRows(records);
    expect(tableColumns(['shear'])).toEqual(expect.arrayContaining(['diffusivity_scaled', 'velocity_scaled']));
    for (const [i, r] of rows.entries()) {
      const s = records[i].summary;
      expect(r.layers).toBe(2);
      // U = shear/2 the thermal wind, λ = 1/k_d (Held & Larichev's units) [derived: the definitions].
      const U = (r.shear as number) / 2;
      expect(r.velocity_scaled).toBeCloseTo(s.eddy_velocity! / U, 12);
      expect(r.diffusivity_scaled).toBeCloseTo(s.eddy_diffusivity! / (U * 0.25), 12);
      // ξ = δk_d²ΔU/((1 + δ)β) = 8·shear/β with the default β [derived: docs/two-layer.md].
      expect(r.supercriticality).toBeCloseTo((8 * (r.shear as number)) / records[i].params.beta, 12);
    }
    const fits = sweepFits(rows, { resamples: 10 });
    expect(fits.eddy_velocity_vs_supercriticality.error).toMatch(/2 usable points/);
  });

  it('recover an exact power law of D and V against ξ, with the prefactor at the fixed exponent', () => {
    // Rows of the test's own on exact laws D/(Uλ) = 0.3 ξ², V/U = 0.7 ξ (the forms of Held & Larichev,
    // J. Atmos. Sci. 53, 946 (1996) [published], with made-up prefactors): log-log least squares
    // returns them to round-off [derived: the fit is exact on exact data].
    const rows: TableRow[] = [1.5, 2, 3, 5, 8].map((xi) => ({
      status: 'done',
      supercriticality: xi,
      diffusivity_scaled: 0.3 * xi * xi,
      velocity_scaled: 0.7 * xi,
    }));
    const fits = sweepFits(rows, { resamples: 50, seed: 3 });
    const d = fits.eddy_diffusivity_vs_supercriticality;
    expect(d.error).toBeNull();
    expect(d.exponent).toBeCloseTo(2, 10);
    expect(d.prefactor).toBeCloseTo(0.3, 10);
    expect(d.fixed_exponent).toBe(2);
    expect(d.prefactor_at_fixed_exponent).toBeCloseTo(0.3, 10);
    expect(d.prefactor_at_exponent_1).toBeNull();
    expect(d.exponent_ci![0]).toBeLessThanOrEqual(2 + 1e-9);
    expect(d.exponent_ci![1]).toBeGreaterThanOrEqual(2 - 1e-9);
    const v = fits.eddy_velocity_vs_supercriticality;
    expect(v.exponent).toBeCloseTo(1, 10);
    expect(v.prefactor_at_exponent_1).toBeCloseTo(0.7, 10);
    // One-layer fits of these rows have nothing to fit.
    expect(fits.u_rms_vs_balance_velocity.error).not.toBeNull();
  });
});
