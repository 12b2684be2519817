import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { scratchDir, stria, TINY_SETS } from './support/stria';

const dir = scratchDir('zonal-file');

/** Plain zonal means along x of the products of deviations, as the file's long_names define them. */
function plainMeans(u: ArrayLike<number>, v: ArrayLike<number>, q: ArrayLike<number>, nx: number, ny: number) {
  const upvp = new Float64Array(ny);
  const vpqp = new Float64Array(ny);
  const eke = new Float64Array(ny);
  for (let j = 0; j < ny; j++) {
    let su = 0;
    let sv = 0;
    let sq = 0;
    for (let i = 0; i < nx; i++) {
      su += u[j * nx + i];
      sv += v[j * nx + i];
      sq += q[j * nx + i];
    }
    const [ub, vb, qb] = [su / nx, sv / nx, sq / nx];
    for (let i = 0; i < nx; i++) {
      const up = u[j * nx + i] - ub;
      const vp = v[j * nx + i] - vb;
      upvp[j] += (up * vp) / nx;
      vpqp[j] += (vp * (q[j * nx + i] - qb)) / nx;
      eke[j] += (0.5 * (up * up + vp * vp)) / nx;
    }
  }
  return { upvp, vpqp, eke };
}

const maxAbs = (a: ArrayLike<number>) => Math.max(...Array.from(a, Math.abs));

describe('the zonal-mean file of stria run', () => {
  it("holds the plain zonal means [u'v'], [v'q'] and EKE of the snapshot fields at the same step", () => {
    const snaps = join(dir, 'snaps.nc');
    const zonal = join(dir, 'zonal.nc');
    // A snapshot every step, so that every zonal-mean sample has its snapshot.
    const r = stria([
      'run',
      ...TINY_SETS,
      '--steps',
      '200',
      '--snapshots',
      snaps,
      '--every',
      '1',
      '--zonal',
      zonal,
      '--sample-every',
      '0.5',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const s = readNetcdf(readFileSync(snaps));
    const z = readNetcdf(readFileSync(zonal));
    const zSteps = Array.from(z.readVariable('step'));
    const sSteps = Array.from(s.readVariable('step'));
    const common = sSteps.filter((n) => zSteps.includes(n) && n >= 100);
    expect(common.length).toBeGreaterThan(5);
    for (const step of common) {
      const a = sSteps.indexOf(step);
      const b = zSteps.indexOf(step);
      const plain = plainMeans(s.readRecord('u', a), s.readRecord('v', a), s.readRecord('q', a), 32, 32);
      for (const name of ['upvp', 'vpqp', 'eke'] as const) {
        const file = z.readRecord(name, b);
        const scale = maxAbs(plain[name]);
        expect(scale).toBeGreaterThan(0);
        // Round-off of a mean of 32 products [practice]: a band-limited profile differs by percents.
        const diff = maxAbs(Array.from(file, (x, j) => x - plain[name][j]));
        expect(diff, `${name} at step ${step}`).toBeLessThan(1e-12 * scale);
      }
    }
  });
});
