import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { SUMMARY_KEYS } from '../../lib/analysis/summary';
import { serializePlanFile } from '../../lib/plan/planFile';
import type { PlanInput } from '../../lib/plan/planInput';
import { scratchDir, stria } from './support/stria';

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
    expect(m.measured.time).toBeGreaterThanOrEqual(m.run_length);
    expect(m.predicted.k_beta).toBeCloseTo(m.measured.k_beta, 6); // white forcing injects ε exactly
    const text = stria(['plan', file, '--matched']);
    expect(text.stdout).toMatch(/quantity +predicted +measured\n +regime/);
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
