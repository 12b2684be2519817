import { describe, expect, it } from 'vitest';
import { AllocationMeter } from '../../lib/io/allocationMeter';
import { MaskedZonalMean, ProfileAccumulator } from '../../lib/userfile/maskedZonalMean';
import { ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import { seededSigned } from '../support/random';

describe('zonal means over valid points', () => {
  it('averages the valid points of a row only, and products over points where both factors are valid', () => {
    const nan = NaN;
    // Row 0: u = 1, 2, 3, NaN; v = 1, −1, 1, 1 → ū = 2 over three points, v̄ = ½ over four;
    // u′v′ over i = 0..2: ((−1)(½) + 0·(−3/2) + 1·(½))/3 = 0. Row 1: u has one valid point of four.
    const u = Float64Array.from([1, 2, 3, nan, 5, nan, nan, nan]);
    const v = Float64Array.from([1, -1, 1, 1, 0, 0, 0, 0]);
    const z = new MaskedZonalMean(4, 2, 2, new AllocationMeter()).compute(u, v, null);
    expect(z.ubar[0]).toBe(2);
    expect(z.vbar[0]).toBe(0.5);
    expect(z.upvp[0]).toBe(0);
    expect(z.eke[0]).toBeCloseTo((0.5 * (1 + 0.25 + (0 + 2.25) + (1 + 0.25))) / 3, 15);
    expect(z.ubar[1]).toBeNaN(); // 1 valid point < minCount 2
    expect(z.upvp[1]).toBeNaN();
    expect(z.qbar[0]).toBeNaN(); // no q given
    expect(z.speed2Count).toBe(4); // points with both u and v valid
    expect(z.speed2Sum).toBe(1 + 1 + 4 + 1 + 9 + 1 + 25 + 0);
  });

  it('equals ZonalMeanPlan on complete fields (no mask), to round-off', () => {
    const [nx, ny] = [16, 8];
    const next = seededSigned(5);
    const f = () => Float64Array.from({ length: nx * ny }, () => next());
    const g = { nx, ny, Lx: 2, Ly: 3, u: f(), v: f(), q: f(), zeta: f(), psi: f() };
    const ref = new ZonalMeanPlan({ nx, ny, Lx: 2, Ly: 3 }, { beta: 0 }).compute(g);
    const z = new MaskedZonalMean(nx, ny, 1, new AllocationMeter()).compute(g.u, g.v, g.q);
    for (const k of ['ubar', 'qbar', 'upvp', 'vpqp', 'eke'] as const)
      for (let j = 0; j < ny; j++) expect(Math.abs(z[k][j] - ref[k][j])).toBeLessThan(1e-15);
  });

  it('time-averages each row over the records where it was valid, and drops rows valid too rarely', () => {
    const acc = new ProfileAccumulator(3, new AllocationMeter());
    acc.add([1, NaN, 5]);
    acc.add([3, NaN, NaN]);
    acc.add([5, 7, NaN]);
    const m = acc.mean(2);
    expect(m[0]).toBe(3);
    expect(m[1]).toBeNaN(); // valid in 1 of 3 records, fewer than 2
    expect(m[2]).toBeNaN();
    expect(acc.mean(1)[2]).toBe(5);
    expect(acc.records).toBe(3);
  });
});
