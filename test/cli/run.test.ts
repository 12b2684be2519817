import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { SUMMARY_KEYS } from '../../lib/analysis/summary';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { hasNcdump, mustHaveNcdump, NCDUMP_MISSING } from '../io/ncdumpTool';
import { scratchDir, stria, striaAsync, striaHere, TINY, TINY_SETS } from './support/stria';

const dir = scratchDir('run');

describe('stria run', () => {
  it('prints the summary as JSON with the stable keys, and nothing else on stdout', () => {
    const r = stria(['run', ...TINY_SETS, '--until', '5', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const summary = JSON.parse(r.stdout);
    for (const k of SUMMARY_KEYS) expect(summary).toHaveProperty(k);
    // T counts as reached within a thousandth of a step (lib/model/clock.ts): the summed clock may lie just below it.
    expect(summary.time).toBeGreaterThanOrEqual(5 - 1e-3 * TINY.dt);
    expect(summary.injection).toBeCloseTo(TINY.eps, 9); // white forcing injects ε exactly on average
    // eslint-disable-next-line no-control-regex -- ESC is the byte a terminal escape starts with
    expect(r.stderr).not.toMatch(/\r|\x1b/); // no progress bar when stderr is not a terminal
  });

  it('layers the parameters: defaults, preset, file, then --set', async () => {
    const file = join(dir, 'params.json');
    writeFileSync(file, JSON.stringify({ ...TINY, beta: 3, seed: 9 }));
    const r = await striaHere([
      'run',
      file,
      '--set',
      'beta=7',
      '--steps',
      '4',
      '--json',
      '--save',
      join(dir, 'layered.json'),
    ]);
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout).steps).toBe(4);
    const saved = JSON.parse(readFileSync(join(dir, 'layered.json'), 'utf8')).params;
    expect(saved).toMatchObject({ ...TINY, beta: 7, seed: 9 });
    const preset = await striaHere([
      'run',
      '--preset',
      'few-jets',
      '--set',
      'nx=32',
      '--set',
      'ny=32',
      '--set',
      'kf=8',
      '--steps',
      '2',
      '--save',
      join(dir, 'preset.json'),
    ]);
    expect(preset.status, preset.stderr).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, 'preset.json'), 'utf8')).params).toMatchObject({
      beta: 18,
      nu_order: 8,
      nx: 32,
      kf: 8,
    });
  });

  it('writes snapshots and zonal means that read back, and ncdump lists their variables', () => {
    const snaps = join(dir, 'snaps.nc');
    const zonal = join(dir, 'zonal.nc');
    const r = stria([
      'run',
      ...TINY_SETS,
      '--steps',
      '100',
      '--snapshots',
      snaps,
      '--every',
      '20',
      '--zonal',
      zonal,
      '--sample-every',
      '0.5',
    ]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/5 snapshot records/);
    const s = readNetcdf(readFileSync(snaps));
    expect(s.numRecords).toBe(5);
    expect(Array.from(s.readVariable('step'))).toEqual([20, 40, 60, 80, 100]);
    expect(JSON.parse(s.attributes.stria_params as string)).toMatchObject(TINY);
    const q = s.readRecord('q', 4);
    expect(q.length).toBe(32 * 32);
    expect(Array.from(q).every(Number.isFinite)).toBe(true);
    expect(Math.max(...Array.from(q, Math.abs))).toBeGreaterThan(0);
    const z = readNetcdf(readFileSync(zonal));
    const times = Array.from(z.readVariable('time'));
    expect(z.numRecords).toBe(times.length);
    expect(times.length).toBeGreaterThanOrEqual(9);
    times.slice(1).forEach((t, k) => expect(t - times[k]).toBeGreaterThan(0.45));
    if (!hasNcdump) {
      if (mustHaveNcdump) throw new Error(NCDUMP_MISSING);
      return;
    }
    const header = spawnSync('ncdump', ['-h', snaps], { encoding: 'utf8' });
    expect(header.status, header.stderr).toBe(0);
    for (const v of ['x', 'y', 'time', 'step', 'q', 'zeta', 'psi', 'u', 'v'])
      expect(header.stdout).toMatch(new RegExp(`\\b(double|int) ${v}\\(`));
    expect(header.stdout).toMatch(/time = UNLIMITED ; \/\/ \(5 currently\)/);
    const zh = spawnSync('ncdump', ['-h', zonal], { encoding: 'utf8' });
    for (const v of ['ubar', 'qbar', 'upvp', 'vpqp', 'eke'])
      expect(zh.stdout).toMatch(new RegExp(`double ${v}\\(time, y\\)`));
  });

  it('resumes a saved run bit for bit', () => {
    const whole = join(dir, 'whole.json');
    const half = join(dir, 'half.json');
    const resumed = join(dir, 'resumed.json');
    expect(stria(['run', ...TINY_SETS, '--steps', '60', '--save', whole]).status).toBe(0);
    expect(stria(['run', ...TINY_SETS, '--steps', '30', '--save', half]).status).toBe(0);
    const r = stria(['run', half, '--steps', '30', '--save', resumed, '--json']);
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout).steps).toBe(60);
    expect(JSON.parse(readFileSync(resumed, 'utf8')).state).toEqual(JSON.parse(readFileSync(whole, 'utf8')).state);
  });

  // A two-layer run from the command line: the parameters come from the model's schema, today's summary
  // describes the barotropic flow, the saved file holds both layers and resumes bit for bit.
  it('runs two layers with --set layers=2, and resumes them bit for bit', async () => {
    const TWO = [...TINY_SETS, '--set', 'layers=2', '--set', 'shear=0.3', '--set', 'kd=3', '--set', 'depth_ratio=0.5'];
    const whole = join(dir, 'two-whole.json');
    const half = join(dir, 'two-half.json');
    const resumed = join(dir, 'two-resumed.json');
    const zonal = join(dir, 'two-zonal.nc');
    const r = await striaHere(['run', ...TWO, '--steps', '40', '--json', '--save', whole, '--zonal', zonal]);
    expect(r.status, r.stderr).toBe(0);
    const summary = JSON.parse(r.stdout);
    for (const k of SUMMARY_KEYS) expect(summary).toHaveProperty(k);
    expect(summary.steps).toBe(40);
    // The two-layer keys: ξ = δk_d²(U₁ − U₂)/((1 + δ)β) = 0.5·9·0.3/(1.5·10) [derived: docs/two-layer.md,
    // Q₂ = β − F₂(U₁ − U₂) changes sign at ξ = 1], and the measured fluxes as numbers.
    expect(summary.layers).toBe(2);
    expect(summary.supercriticality).toBeCloseTo(0.09, 12);
    for (const k of ['heat_flux', 'eddy_diffusivity', 'eddy_velocity', 'energy_generation'])
      expect(Number.isFinite(summary[k]), k).toBe(true);
    // The zonal-mean file has the layer dimension and the heat flux.
    const z = readNetcdf(readFileSync(zonal));
    expect(z.variables.find((v) => v.name === 'ubar')?.dimensions).toEqual(['time', 'layer', 'y']);
    expect(z.variables.find((v) => v.name === 'heat_flux')?.dimensions).toEqual(['time', 'y']);
    const text = await striaHere(['run', ...TWO, '--steps', '4']);
    expect(text.stdout).toMatch(/^supercriticality +0\.09$/m);
    expect(text.stdout).toMatch(/^heat_flux +\S+$/m);
    const file = JSON.parse(readFileSync(whole, 'utf8'));
    expect(file.params).toMatchObject({ layers: 2, shear: 0.3, kd: 3, depth_ratio: 0.5 });
    expect(file.state.qHat.length).toBe(4 * 32 * 17);
    expect((await striaHere(['run', ...TWO, '--steps', '20', '--save', half])).status).toBe(0);
    const back = await striaHere(['run', half, '--steps', '20', '--save', resumed, '--json']);
    expect(back.status, back.stderr).toBe(0);
    expect(JSON.parse(readFileSync(resumed, 'utf8')).state).toEqual(file.state);
    const refused = await striaHere(['run', ...TINY_SETS, '--set', 'layers=2', '--steps', '5']);
    expect(refused.status).toBe(2);
    expect(refused.stderr).toMatch(/parameter kd = 0: two layers need a deformation wavenumber k_d > 0/);
  });

  it('stops at the steady state under strong drag and says so', () => {
    const r = stria([
      'run',
      ...TINY_SETS,
      '--set',
      'mu=0.5',
      '--set',
      'eps=0.5',
      '--until-steady',
      '--steady-tol',
      '0.1',
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/steady at t = /);
    expect(JSON.parse(r.stdout).time).toBeLessThan(20); // the cap is 20 windows of 1/(2μ) = 1
  });

  it('stops cleanly on Ctrl-C: summary of what ran, state saved, exit code 130', async () => {
    const saved = join(dir, 'interrupted.json');
    const { child, done } = striaAsync(['run', ...TINY_SETS, '--until', '100000', '--save', saved, '--json']);
    await new Promise((resolve) => setTimeout(resolve, 2500));
    child.kill('SIGINT');
    const r = await done;
    expect(r.status, r.stderr).toBe(130);
    expect(r.stderr).toMatch(/interrupted at t = /);
    const summary = JSON.parse(r.stdout);
    expect(summary.steps).toBeGreaterThan(0);
    expect(JSON.parse(readFileSync(saved, 'utf8')).state.steps).toBe(summary.steps);
  });

  it('rescales the default hyperviscosity to a new grid and says so, but keeps a ν set by hand', async () => {
    const saved = (tag: string) => join(dir, `nu-${tag}.json`);
    const params = (tag: string) => JSON.parse(readFileSync(saved(tag), 'utf8')).params;
    const grid = ['--set', 'nx=64', '--set', 'ny=64', '--set', 'kf=16', '--steps', '1'];
    const rescaled = await striaHere(['run', ...grid, '--save', saved('rescaled')]);
    expect(rescaled.status, rescaled.stderr).toBe(0);
    // k_max = ⌊64/3⌋ = 21 against 42 at 128² [derived]: ν × 2^16 keeps ν k_max^16.
    expect(params('rescaled').nu).toBe(Number((3e-26 * 2 ** 16).toPrecision(4)));
    expect(rescaled.stderr).toMatch(/nu rescaled from 3e-26 to 1\.966e-21 for the 64 × 64 grid/);
    const byHand = await striaHere(['run', ...grid, '--set', 'nu=1e-20', '--save', saved('hand')]);
    expect(params('hand').nu).toBe(1e-20);
    expect(byHand.stderr).not.toMatch(/rescaled/);
    // A preset is tuned for its own grid: at that grid nothing moves.
    const preset = await striaHere(['run', '--preset', 'many-jets', '--steps', '1', '--save', saved('preset')]);
    expect(preset.stderr).not.toMatch(/rescaled/);
    // A saved run moved to another grid takes the rescaled ν too.
    const moved = await striaHere([
      'run',
      saved('rescaled'),
      '--set',
      'nx=128',
      '--set',
      'ny=128',
      '--steps',
      '1',
      '--save',
      saved('moved'),
    ]);
    expect(params('moved').nu).toBe(3e-26);
    expect(moved.stderr).toMatch(/rescaled/);
  });

  it('refuses bad options, naming them, with exit code 2', async () => {
    const cases: [string[], RegExp][] = [
      [['run', '--stpes', '10'], /unknown option --stpes/],
      [['run', '--steps', 'ten'], /--steps needs a positive whole number, got "ten"/],
      [['run', '--steps', '5', '--set', 'betta=1'], /"betta" is not a parameter/],
      [['run', '--steps', '5', '--set', 'beta=fast'], /--set beta=fast: beta needs a number/],
      [['run', '--steps', '5', ...TINY_SETS, '--set', 'kf=40'], /parameter kf = 40: .*\(from --set kf\)/],
      [['run', ...TINY_SETS], /--steps, --until or --until-steady/],
      [['run', ...TINY_SETS, '--steps', '5', '--until', '3'], /one run length, not --steps and --until/],
      [
        ['run', ...TINY_SETS, '--steps', '5', '--snapshots', join(dir, 'x.nc')],
        /--snapshots needs --snapshot-every-steps/,
      ],
      [['run', ...TINY_SETS, '--steps', '5', '--steady-tol', '0.1'], /--steady-tol applies only with --until-steady/],
      [['run', '--preset', 'nope', '--steps', '5'], /--preset nope: no such preset/],
      [['run', join(dir, 'missing.json'), '--steps', '5'], /cannot read .*missing\.json/],
      [['frobnicate'], /unknown command "frobnicate"/],
    ];
    // And once through the launcher, as a shell sees it.
    const spawned = stria(['run', '--stpes', '10']);
    expect(spawned.status).toBe(2);
    expect(spawned.stderr).toBe('stria run: error: unknown option --stpes (see stria run --help)\n');
    for (const [args, message] of cases) {
      const r = await striaHere(args);
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stderr, args.join(' ')).toMatch(message);
    }
  });

  it('has help with a worked example for every command', async () => {
    for (const c of ['run', 'sweep', 'merge', 'plan']) {
      const r = await striaHere([c, '--help']);
      expect(r.status).toBe(0);
      expect(r.stdout).toMatch(new RegExp(`^stria ${c} — `));
      expect(r.stdout).toMatch(/\nExample:\n {2}\S/);
    }
    const top = stria(['--help']);
    expect(top.status).toBe(0);
    for (const c of ['run', 'sweep', 'merge', 'plan']) expect(top.stdout).toMatch(new RegExp(`\\n {2}${c} `));
  });
});
