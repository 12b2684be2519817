import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { SUMMARY_KEYS } from '../../lib/analysis/summary';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { serializePlanFile } from '../../lib/plan/planFile';
import type { PlanInput } from '../../lib/plan/planInput';
import { scratchDir, stria, striaHere } from './support/stria';

const dir = scratchDir('plan');

/** A model-unit plan small enough that its matched run is itself: 32², one drag time. */
const SMALL: PlanInput = {
  units: 'model',
  title: 'small model-unit plan',
  rotation: { kind: 'beta', beta: 10 },
  deformation: { kind: 'none' },
  drive: { kind: 'injection', eps: 0.05 },
  dragTime: 20,
  forcing: { wavelength: 0.785, halfWidth: 0.2 },
  domain: { Lx: 2 * Math.PI, Ly: 2 * Math.PI },
  grid: { kind: 'points', nx: 32, ny: 32 },
  hyperviscosity: { order: 4, gridDampingTime: 2 },
  runLength: 20,
};

describe('stria plan', () => {
  it('prints the predictions and checks of a preset as JSON with the headline keys', () => {
    const r = stria(['plan', '--preset', 'jupiter', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const p = JSON.parse(r.stdout);
    for (const k of ['regime', 'jet_count', 'u_rms', 'k_rhines', 'k_beta', 'zonostrophy_index', 'jet_spacing'])
      expect(p).toHaveProperty(k);
    expect(p.u_rms).toBe(40); // the preset's target U
    expect(p.zonostrophy_index).toBeCloseTo(p.k_beta / p.k_rhines, 12);
    expect(p.jet_count).toBeCloseTo(1e8 / p.jet_spacing, 9); // Ly / L_jet
    expect(p.checks.length).toBeGreaterThan(0);
    expect(p.matched.measured).toBeNull();
  });

  it('runs the matched run from a plan file and shows its measurement beside its prediction', () => {
    const file = join(dir, 'small.json');
    writeFileSync(file, serializePlanFile(SMALL));
    const r = stria(['plan', file, '--matched', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const m = JSON.parse(r.stdout).matched;
    expect(m.params).toMatchObject({ nx: 32, ny: 32 });
    for (const k of SUMMARY_KEYS) expect(m.measured).toHaveProperty(k);
    expect(m.measured.time).toBeGreaterThanOrEqual(m.run_length - 1e-3 * m.params.dt); // the clock's tolerance
    expect(m.predicted.k_beta).toBeCloseTo(m.measured.k_beta, 6); // white forcing injects ε exactly
    // Every row has a verdict (lib/plan/verdict.ts), and the text says the rule.
    expect(m.verdicts.map((v: { key: string }) => v.key)).toEqual([
      'u_rms',
      'k_rhines',
      'k_beta',
      'zonostrophy_index',
      'jet_spacing',
      'jet_count',
      'regime',
    ]);
    for (const v of m.verdicts) expect(['agrees', 'does not agree', 'cannot tell']).toContain(v.verdict);
    expect(m.verdicts.find((v: { key: string }) => v.key === 'k_beta').verdict).toBe(
      m.measured.steady ? 'agrees' : 'cannot tell',
    );
    const text = stria(['plan', file, '--matched']);
    expect(text.stdout).toMatch(/quantity +predicted +measured ± std\. error +verdict +why\n +u_rms/);
    expect(text.stdout).toContain('A row agrees when |ln(measured/predicted)| ≤ 2·((σ/measured)² + r²)^½');
  });

  it('takes the model-unit keys of stria run, the rest from the defaults, and says which', async () => {
    const r = await striaHere(['plan', '--set', 'beta=3', '--set', 'eps=2e-4', '--set', 'mu=5e-3', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const p = JSON.parse(r.stdout);
    expect(p.units).toBe('model');
    // U = (ε/μ)^½ = 0.2 and k_β = (β³/ε)^{1/5} [published: Vallis & Maltrud 1993], from the keys given.
    expect(p.u_rms).toBeCloseTo(0.2, 12);
    expect(p.k_beta).toBeCloseTo(Math.pow(27 / 2e-4, 0.2), 9);
    expect(r.stderr).toMatch(/from the model defaults: kd = 0, nu = 3e-26, nu_order = 8, kf = 24, dkf = 2/);
    expect(r.stderr).toMatch(/run length 1000 \(5\/μ/);
    // The model's own parameters of the plan are the ones given, and the defaults' (same k_max, same ν).
    expect(p.matched.params).toBeDefined();
    const grid = await striaHere(['plan', '--set', 'beta=3', '--set', 'nx=256', '--set', 'ny=256', '--json']);
    const nu256 = JSON.parse(grid.stdout).predictions.kNu.value;
    const nu128 = JSON.parse((await striaHere(['plan', '--set', 'beta=3', '--json'])).stdout).predictions.kNu.value;
    expect(nu256).toBeGreaterThan(nu128); // ν rescaled with the grid: k_ν moves out with k_max
    const run = await striaHere(['plan', '--set', 'dt=0.01']);
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/dt is a run parameter the planner does not use/);
    expect((await striaHere(['plan', '--preset', 'jupiter', '--set', 'beta=3'])).stderr).toMatch(
      /model-unit keys make a plan of their own/,
    );
  });

  it('writes physical quantities as people read them and takes them as they type them', async () => {
    const text = (await striaHere(['plan', '--preset', 'jupiter'])).stdout;
    // Jupiter preset: spin-up 1/(2μ) = 1e7 s = 115.7 days, k_R = 2.308e-7 rad/m, 2π/k_R = 27230 km [derived].
    expect(text).toMatch(/spin-up time \(energy e-folding\) \(t_spin\) +115\.7 days/);
    expect(text).toMatch(/Rhines wavenumber \(k_R\) +2\.308e-7 rad\/m \(wavelength 27230 km\)/);
    expect(text).not.toMatch(/\b(kR|sqrtUbeta|piOverKR|twoPiSqrtUbeta|kmaxOverKf)\b/);
    const typed = await striaHere([
      'plan',
      '--preset',
      'earth-ocean',
      '--set',
      'dragTime=30 d',
      '--set',
      'forcing.wavelength=80km',
      '--set',
      'rotation.latitudeDeg=30°S',
      '--json',
    ]);
    expect(typed.status, typed.stderr).toBe(0);
    const p = JSON.parse(typed.stdout);
    expect(p.spin_up_time).toBe((30 * 86400) / 2); // 1/(2μ), 1/μ = 30 days
    expect(p.predictions.eta.value).toBeCloseTo((Math.pow((2 * Math.PI) / 8e4, 2) * (0.1 * 0.1)) / (30 * 86400), 20);
    const bad = await striaHere(['plan', '--preset', 'jupiter', '--set', 'runLength=3 fortnights']);
    expect(bad.stderr).toMatch(/runLength: "3 fortnights": unknown unit "fortnights"; .*\(s, min, h, d\)/);
    const model = await striaHere(['plan', '--set', 'beta=3', '--set', 'runLength=30d']);
    expect(model.stderr).toMatch(/a unit needs a physical plan/);
  });

  it("writes the matched run of a physical plan with its units, so stria run's NetCDF is in SI", async () => {
    const params = join(dir, 'matched-params.json');
    const r = await striaHere([
      'plan',
      '--preset',
      'earth-atmosphere',
      '--target-seconds',
      '20',
      '--matched-params',
      params,
    ]);
    expect(r.status, r.stderr).toBe(0);
    const file = JSON.parse(readFileSync(params, 'utf8'));
    // ℓ = Lx/2π = 4e7 m/2π and t = ℓ/U with U = 6 m/s (docs/plan.md, the plan's scaling) [derived].
    expect(file.physical_units.metres_per_length).toBeCloseTo(4e7 / (2 * Math.PI), 6);
    expect(file.physical_units.seconds_per_time).toBeCloseTo(4e7 / (2 * Math.PI) / 6, 6);
    const tiny = ['--set', 'nx=32', '--set', 'ny=32', '--set', 'kf=8', '--set', 'dkf=1', '--steps', '4'];
    const phys = join(dir, 'phys.nc');
    const model = join(dir, 'model.nc');
    const sampling = ['--sample-interval', String(file.params.dt), '--average', String(2 * file.params.dt)];
    expect((await striaHere(['run', params, ...tiny, ...sampling, '--zonal', phys])).status).toBe(0);
    const bare = join(dir, 'matched-bare.json');
    writeFileSync(bare, JSON.stringify(file.params));
    expect((await striaHere(['run', bare, ...tiny, ...sampling, '--zonal', model])).status).toBe(0);
    const p = readNetcdf(readFileSync(phys));
    const m = readNetcdf(readFileSync(model));
    expect(p.attributes.stria_units).toBe('physical');
    expect(p.variable('ubar').attributes.units).toBe('m s-1');
    expect(p.variable('ubar').attributes.stria_model_units).toBe('L T-1');
    expect(p.variable('time').attributes.units).toBe('s');
    // The same run, its values converted: u in m/s is u in model units times ℓ/t.
    const [l, t] = [file.physical_units.metres_per_length, file.physical_units.seconds_per_time];
    const up = p.readRecord('ubar', 0) as Float64Array;
    const um = m.readRecord('ubar', 0) as Float64Array;
    for (let j = 0; j < um.length; j++) expect(up[j]).toBeCloseTo((um[j] * l) / t, 9);
    expect(m.variable('ubar').attributes.units).toBe('1');
  });

  it('names what an incomplete plan lacks in one line, not every variant of every field', async () => {
    const r = await striaHere([
      'plan',
      '--set',
      'units=model',
      '--set',
      'drive.kind=injection',
      '--set',
      'drive.eps=1',
    ]);
    expect(r.status).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(
      /the plan is incomplete: it needs rotation, deformation, dragTime, forcing, domain, grid, hyperviscosity, runLength\./,
    );
    expect(lines[0]).not.toMatch(/Invalid key|received undefined/);
  });

  it('names plan presets as the run presets are named, and still reads the earlier ids', async () => {
    const ids = ['earth-atmosphere', 'earth-ocean', 'jupiter'];
    for (const id of ids) expect((await striaHere(['plan', '--preset', id, '--json'])).status, id).toBe(0);
    const old = await striaHere(['plan', '--preset', 'earthOcean', '--json']);
    const now = await striaHere(['plan', '--preset', 'earth-ocean', '--json']);
    expect(old.stdout).toBe(now.stdout);
    expect((await striaHere(['plan', '--help'])).stdout).toMatch(/earth-atmosphere, earth-ocean, jupiter/);
  });

  it('with --matched prints the plan at once, then progress lines on standard error, then the comparison', async () => {
    const file = join(dir, 'small-progress.json');
    writeFileSync(file, serializePlanFile(SMALL));
    const { main } = await import('../../cli/main');
    const events: ['out' | 'err', string][] = [];
    const sink = (to: 'out' | 'err') => new Writable({ write: (c, _e, cb) => (events.push([to, String(c)]), cb()) });
    const args = ['plan', file, '--matched', '--progress-seconds', '0'];
    const status = await main(args, { out: sink('out'), err: sink('err'), argv: args, interrupted: () => false });
    expect(status).toBe(0);
    const first = (test: (e: ['out' | 'err', string]) => boolean) => events.findIndex(test);
    const plan = first(([to, t]) => to === 'out' && /Predictions:[\s\S]*Checks:/.test(t));
    const progress = first(([to, t]) => to === 'err' && /^stria plan: matched run: \d+% t = /.test(t));
    const comparison = first(([to, t]) => to === 'out' && /quantity +predicted +measured ± std\. error/.test(t));
    expect(plan).toBeGreaterThanOrEqual(0);
    expect(progress).toBeGreaterThan(plan);
    expect(comparison).toBeGreaterThan(progress);
    // Whole lines, no carriage returns or escape codes, when standard error is not a terminal.
    const err = events.filter(([to]) => to === 'err').map(([, t]) => t);
    // eslint-disable-next-line no-control-regex -- ESC is the byte a terminal escape starts with
    for (const t of err) expect(t.endsWith('\n') && !/[\r\x1b]/.test(t), JSON.stringify(t)).toBe(true);
  });

  it('writes the printable report as Markdown or HTML', () => {
    const md = join(dir, 'plan.md');
    const html = join(dir, 'plan.html');
    expect(stria(['plan', '--preset', 'earthOcean', '--report', md]).status).toBe(0);
    expect(readFileSync(md, 'utf8')).toMatch(/^# Stria plan: /);
    expect(stria(['plan', '--preset', 'earthOcean', '--report', html]).status).toBe(0);
    expect(readFileSync(html, 'utf8')).toMatch(/<svg/);
  });

  it('builds a plan from --set paths and names a refused field', () => {
    const sets = (o: Record<string, string | number>) => Object.entries(o).flatMap(([k, v]) => ['--set', `${k}=${v}`]);
    const all = {
      units: 'model',
      'rotation.kind': 'beta',
      'rotation.beta': 10,
      'deformation.kind': 'none',
      'drive.kind': 'injection',
      'drive.eps': 0.05,
      dragTime: 20,
      'forcing.wavelength': 0.785,
      'forcing.halfWidth': 0.2,
      'domain.Lx': '2pi',
      'domain.Ly': '2pi',
      'grid.kind': 'points',
      'grid.nx': 32,
      'grid.ny': 32,
      'hyperviscosity.order': 4,
      'hyperviscosity.gridDampingTime': 2,
      runLength: 20,
    };
    const ok = stria(['plan', ...sets(all), '--json']);
    expect(ok.status, ok.stderr).toBe(0);
    expect(JSON.parse(ok.stdout).k_beta).toBeCloseTo(Math.pow(1000 / 0.05, 0.2), 12);
    const bad = stria(['plan', ...sets({ ...all, 'grid.nx': 33 })]);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/grid\.nx: must be a power of two .*\(from --set grid\.nx\)/);
    // Switching the drive's kind clears its old fields.
    const velocity = stria([
      'plan',
      '--preset',
      'jupiter',
      '--set',
      'drive.kind=velocity',
      '--set',
      'drive.U=20',
      '--json',
    ]);
    expect(JSON.parse(velocity.stdout).u_rms).toBe(20);
    expect(stria(['plan', '--preset', 'jupiter', '--report', join(dir, 'x.pdf')]).stderr).toMatch(
      /--report .*\.md or \.html/,
    );
  });
});

describe('stria plan outputs', () => {
  it('refuses to replace a report that exists unless --overwrite, and writes nothing', () => {
    const out = join(dir, 'exists.md');
    writeFileSync(out, 'mine');
    const r = stria(['plan', '--preset', 'jupiter', '--report', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--report .*exists\.md already exists: give --overwrite to replace it/);
    expect(readFileSync(out, 'utf8')).toBe('mine');
    expect(stria(['plan', '--preset', 'jupiter', '--report', out, '--overwrite']).status).toBe(0);
    expect(readFileSync(out, 'utf8')).toMatch(/^#/);
  });
});
