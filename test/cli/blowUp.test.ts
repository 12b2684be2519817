import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { decodeCheckpointFile } from '../../lib/run/runProgress';
import { scratchDir, stria, striaHere } from './support/stria';

const dir = scratchDir('blowup');

// 32², fixed step (cfl = 0), white forcing at ε = 0.2 against weak drag: the flow spins up until
// dt = 0.05 is too long for it. Found by running it: CFL 1.526 > 1.5 at step 259 (t = 12.95), while
// with dt = 0.025 the CFL number stays below 0.9 for 3000 steps.
const SPINUP = [
  '--set',
  'nx=32',
  '--set',
  'ny=32',
  '--set',
  'nu_order=4',
  '--set',
  'force_zonal=true',
  '--set',
  'kf=8',
  '--set',
  'dkf=1.5',
  '--set',
  'beta=10',
  '--set',
  'mu=0.05',
  '--set',
  'nu=1e-8',
  '--set',
  'cfl=0',
  '--set',
  'eps=0.2',
  '--set',
  'dt=0.05',
];
// An energetic start (init_energy = 1, max|u| ≈ 3.8) with dt = 0.5: CFL 17.6 at once; three halvings
// leave 2.2, still past the limit.
const FAR_TOO_LONG = [...SPINUP, '--set', 'init_energy=1', '--set', 'dt=0.5'];

describe('stria run on a blow-up', () => {
  it('stops by default: exit 1, the report on stderr and in --json, the summary of the last good state', () => {
    const r = stria(['run', ...SPINUP, '--steps', '600', '--json']);
    expect(r.status, r.stderr).toBe(1);
    const out = JSON.parse(r.stdout);
    expect(out.blow_up).toMatchObject({ steps: 259, dt: 0.05, reason: 'CFL number above 1.5' });
    expect(out.blow_up.time).toBeCloseTo(12.95, 9);
    expect(out.blow_up.cfl).toBeGreaterThan(1.5);
    expect(out.blow_up.max_u).toBeGreaterThan(0);
    expect(out.blow_up.max_v).toBeGreaterThan(0);
    expect(out.retries).toEqual([]);
    expect(out.steps).toBe(259);
    expect(Number.isFinite(out.energy)).toBe(true);
    expect(r.stderr).toMatch(
      /error: blew up at t = 12\.95\d*, step 259: CFL number above 1\.5 \(dt = 0\.05000, CFL = 1\.5\d+, max\|u\| = [\d.]+, max\|v\| = [\d.]+\)/,
    );
  });

  it('retries from the last checkpoint with half the step, recovers, and records the retry', () => {
    const zonal = join(dir, 'retry-zonal.nc');
    const ck = join(dir, 'retry-ck.json');
    const r = stria([
      'run',
      ...SPINUP,
      '--until',
      '25',
      '--on-blowup',
      'retry',
      '--checkpoint-every',
      '100',
      '--zonal',
      zonal,
      '--sample-every',
      '0.5',
      '--checkpoint',
      ck,
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.blow_up).toBeNull();
    expect(out.retries).toHaveLength(1);
    expect(out.retries[0]).toMatchObject({
      attempt: 1,
      restarted_at: { steps: 200 },
      dt: { from: 0.05, to: 0.025 },
      blow_up: { steps: 259 },
    });
    expect(out.time).toBeGreaterThanOrEqual(25 - 1e-3 * 0.025); // reached to the clock's tolerance (lib/model/clock.ts)
    expect(r.stderr).toMatch(
      /retry 1 of 3 from the checkpoint at t = 10\.0+, step 200, with dt = 0\.02500 \(was 0\.05000\)/,
    );
    expect(r.stderr).toMatch(/recovered after 1 retry/);
    // The zonal means were rolled back with the run: one record per 0.5, times strictly increasing.
    const z = readNetcdf(readFileSync(zonal));
    const times = Array.from(z.readVariable('time'));
    expect(times).toHaveLength(50);
    times.forEach((t, k) => expect(t).toBeGreaterThanOrEqual(0.5 * (k + 1) - 1e-9));
    times.slice(1).forEach((t, k) => expect(t).toBeGreaterThan(times[k]));
    // The checkpoint knows the retry and holds the halved step.
    const saved = decodeCheckpointFile(readFileSync(ck, 'utf8'));
    expect(saved.checkpoint.params.dt).toBe(0.025);
    expect(saved.progress.params.dt).toBe(0.05);
    expect(saved.progress.retries).toHaveLength(1);
  });

  it('gives up after --max-retries halvings of a step far too long, with every retry logged', () => {
    const r = stria(['run', ...FAR_TOO_LONG, '--steps', '100', '--on-blowup', 'retry', '--json']);
    expect(r.status, r.stderr).toBe(1);
    const out = JSON.parse(r.stdout);
    expect(out.retries.map((x: { dt: { to: number } }) => x.dt.to)).toEqual([0.25, 0.125, 0.0625]);
    expect(out.blow_up).toMatchObject({ time: 0, steps: 0, dt: 0.0625, reason: 'CFL number above 1.5' });
    expect(out.blow_up.cfl).toBeCloseTo(17.65 / 8, 2);
    expect(r.stderr.match(/retry \d of 3/g)).toHaveLength(3);
    expect(r.stderr).toMatch(/no retries left \(3 made\)/);
    const one = stria([
      'run',
      ...FAR_TOO_LONG,
      '--steps',
      '100',
      '--on-blowup',
      'retry',
      '--max-retries',
      '1',
      '--json',
    ]);
    expect(one.status).toBe(1);
    expect(JSON.parse(one.stdout).retries).toHaveLength(1);
  });

  it('refuses a bad policy, naming the option', async () => {
    const bad = await striaHere(['run', ...SPINUP, '--steps', '5', '--on-blowup', 'ignore']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--on-blowup ignore: must be stop or retry/);
    const orphan = await striaHere(['run', ...SPINUP, '--steps', '5', '--max-retries', '2']);
    expect(orphan.status).toBe(2);
    expect(orphan.stderr).toMatch(/--max-retries applies only with --on-blowup retry/);
  });
});
