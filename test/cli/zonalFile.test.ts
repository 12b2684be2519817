import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memorySource } from '../../lib/io/byteSource';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { analyzeFile } from '../../lib/userfile/analyzeFile';
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

  it("gives stria analyze the run's U_rms over the run's window, from the stored ū and EKE", () => {
    const zonal = join(dir, 'window.nc');
    // A sample every step (fixed dt), so that the records of the window are the steps the summary averages.
    const r = stria([
      'run',
      ...TINY_SETS,
      '--set',
      'cfl=0',
      '--steps',
      '400',
      '--sample-every',
      '0.05',
      '--average',
      '10',
      '--zonal',
      zonal,
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const summary = JSON.parse(r.stdout);
    const bytes = readFileSync(zonal);
    const times = Array.from(readNetcdf(bytes).readVariable('time'));
    const a = times.findIndex((t) => t >= summary.window_start - 1e-9);
    const b = times.findIndex((t) => t > summary.window_end + 1e-9);
    const records = `${a}:${b === -1 ? '' : b}`;
    const result = analyzeFile(memorySource(bytes), { records });
    expect(result.analysis.window.count).toBe(summary.window_samples);
    const { uRms, profiles } = result.analysis;
    expect(uRms?.kind).toBe('zonal mean and eddy kinetic energy');
    // ⟨u² + v²⟩ = ⟨ū² + 2·EKE⟩ over y, as [v] = 0 [derived]; the summary's (2·KE)^½ from the spectrum
    // over the same steps agrees to within the sampling of the window's two ends (3e-4 measured) [practice].
    expect(Math.abs(uRms!.value / summary.u_rms - 1)).toBeLessThan(2e-3);
    expect(profiles.eke?.every((x) => x !== null && x > 0)).toBe(true);
    expect(profiles.upvp?.every((x) => x !== null)).toBe(true);
    expect(result.analysis.computed).toEqual(
      expect.arrayContaining(['eddy momentum flux u′v′', 'eddy kinetic energy']),
    );
  });

  it('records the command and its options in history, without directories', () => {
    const zonal = join(dir, 'history.nc');
    const params = join(dir, 'history-params.json');
    writeFileSync(params, JSON.stringify({ seed: 3 }));
    const r = stria(['run', params, ...TINY_SETS, '--steps', '20', '--zonal', zonal, '--sample-every=0.5']);
    expect(r.status, r.stderr).toBe(0);
    const history = readNetcdf(readFileSync(zonal)).attributes.history as string;
    expect(history).not.toContain(dir);
    expect(history).toMatch(
      /^\d{4}-\d\d-\d\dT[\d:.]+Z stria run history-params\.json --set nx=32 .* --steps 20 --zonal history\.nc --sample-every=0\.5: wrote zonal_means$/,
    );
  });
});
