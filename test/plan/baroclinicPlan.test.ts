import { describe, expect, it } from 'vitest';
import { analysePlan } from '../../lib/plan/analysePlan';
import { analyseBaroclinic } from '../../lib/plan/baroclinicPlan';
import { criticality, heldLarichevDiffusivity, heldLarichevJetSpacing } from '../../lib/plan/baroclinicScales';
import { stepSeconds } from '../../lib/plan/cost';
import { criticalShear, mostUnstable } from '../../lib/plan/linearStability';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { planReportMarkdown } from '../../lib/plan/planReport';
import { InputError } from '../../lib/inputError';
import { keptRadius, validateParams } from '../../lib/model/validateParams';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { decodeParamsFile } from '../../lib/io/paramsFile';
import { planInputFromModelParams } from '../../lib/plan/modelPlanInput';
import { scratchDir, striaHere } from '../cli/support/stria';
import { expectQuoted } from './quoted';

/**
 * A baroclinic plan of the test's own, model units: k_d = 1/L_d = 1, equal layers, β = 0.25, shear 1
 * (ξ = F₂ΔU/β = 0.5/0.25 = 2), L_j = 2πλξ = 4π, so Ly = 32π holds 8 jets; 256² gives L_d/dx ≈ 2.5.
 */
function baroclinicPlan(over: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    units: 'model',
    title: 'baroclinic test plan',
    rotation: { kind: 'beta', beta: 0.25 },
    deformation: { kind: 'radius', Ld: 1 },
    drive: { kind: 'baroclinic', shear: 1 },
    dragTime: 20,
    forcing: { wavelength: 1, halfWidth: 0.1 },
    domain: { Lx: 32 * Math.PI, Ly: 32 * Math.PI },
    grid: { kind: 'points', nx: 256, ny: 256 },
    hyperviscosity: { order: 4, gridDampingTime: 1 },
    runLength: 500,
    ...over,
  };
}

const pred = (a: NonNullable<ReturnType<typeof analyseBaroclinic>>, id: string) =>
  a.predictions.find((p) => p.id === id)!;

describe('the baroclinic drive of the planner', () => {
  it("is Held & Larichev's ξ = U/(βλ²) for equal layers, and 1 at the critical shear", () => {
    // ξ = U/(βλ²), U = ΔU/2 the thermal wind, λ the deformation radius [published: Held & Larichev,
    // J. Atmos. Sci. 53, 946 (1996), memory for the notation]; with F₂ = k_d²/2 = 1/(2λ²) the layer
    // form F₂ΔU/β is the same number [derived].
    for (const [dU, beta, Ld] of [
      [1, 0.25, 1],
      [3.7, 1.3, 0.4],
    ])
      expect(criticality(dU, 1, beta, Ld) / (dU / 2 / (beta * Ld * Ld)) - 1).toBeCloseTo(0, 14);
    // The critical shear makes ξ = 1 at any depth ratio [derived: Q₂ = β − F₂ΔU changes sign].
    for (const d of [0.25, 1, 4]) expect(criticality(criticalShear(2, d, 0.3), d, 0.3, 0.5)).toBeCloseTo(1, 14);
  });

  it('predicts the most unstable mode of the linear problem and the Held & Larichev scalings', () => {
    // Without drag: k_d = 1, δ = 1, β = 0.25, ΔU = 1 → σ_max = 0.167704 at k = 0.7337 (l = 0)
    // [derived: CHECKS.md, eigenvalues of the Phillips problem].
    const a = analyseBaroclinic(resolvePlan(baroclinicPlan({ dragTime: 1e15, runLength: 1e16 })))!;
    expectQuoted(pred(a, 'growthRate').value, '0.167704');
    expectQuoted((2 * Math.PI) / pred(a, 'unstableWavelength').value, '0.7337');
    expect(pred(a, 'xi').value).toBeCloseTo(2, 14);
    expect(pred(a, 'baroclinicRegime').text).toBe('supercritical');
    expect(pred(a, 'criticalShear').value).toBeCloseTo(0.5, 14); // 2β/k_d² [published: Phillips 1954]
    // V ≈ ξU, k_jλ ≈ 1/ξ, D ≈ ξ²Uλ with U = ΔU/2 [published: Held & Larichev 1996, memory].
    expect(pred(a, 'eddyVelocity').value).toBeCloseTo(2 * 0.5, 14);
    expect(pred(a, 'jetSpacing').value).toBeCloseTo(heldLarichevJetSpacing(2, 1), 14);
    expect((2 * Math.PI) / pred(a, 'jetSpacing').value).toBeCloseTo(1 / 2, 14);
    expect(pred(a, 'eddyDiffusivity').value).toBeCloseTo(heldLarichevDiffusivity(2, 1, 1), 14);
    expect(pred(a, 'eddyDiffusivity').value).toBeCloseTo(4 * 0.5, 14);
    expect(pred(a, 'jets').value).toBeCloseTo(8, 12);
    expect(a.predictions.every((p) => p.reference.length > 0)).toBe(true);
    // With the drag on the lower layer the growth is the linear problem's with μ.
    const dragged = analyseBaroclinic(resolvePlan(baroclinicPlan()))!;
    expect(pred(dragged, 'growthRate').value).toBe(
      mostUnstable({ kd: 1, depthRatio: 1, beta: 0.25, shear: 1, mu: 1 / 20 }).growth,
    );
  });

  it('checks instability, the resolution of L_d, the jets in the domain and the run length, with fixes', () => {
    const ok = analysePlan(baroclinicPlan());
    expect(ok.checks.map((c) => [c.id, c.severity])).toEqual([
      ['supercritical', 'ok'],
      ['resolvesDeformation', 'ok'],
      ['baroclinicJets', 'ok'],
      ['baroclinicRunLength', 'ok'],
    ]);
    const sev = (over: Record<string, unknown>, id: string) =>
      analysePlan(baroclinicPlan(over)).checks.find((c) => c.id === id)!;
    const sub = sev({ drive: { kind: 'baroclinic', shear: 0.4 } }, 'supercritical');
    expect(sub.severity).toBe('error');
    expect(sub.fix).toMatch(/above the critical shear/);
    expect(sev({ grid: { kind: 'points', nx: 128, ny: 128 } }, 'resolvesDeformation').severity).toBe('warning');
    expect(sev({ grid: { kind: 'points', nx: 64, ny: 64 } }, 'resolvesDeformation').severity).toBe('error');
    expect(sev({ domain: { Lx: 8 * Math.PI, Ly: 8 * Math.PI } }, 'baroclinicJets').severity).toBe('warning');
    const short = sev({ runLength: 10 }, 'baroclinicRunLength');
    expect(short.severity).toBe('error');
    expect(short.fix).toMatch(/run at least/);
  });

  it('costs the two-layer step and refuses a baroclinic drive without a deformation radius', () => {
    const a = analysePlan(baroclinicPlan());
    expect(a.cost.layers).toBe(2);
    expect(a.cost.secondsPerStep).toBe(stepSeconds(256, 256, 1, undefined, 2));
    expect(a.matched).toBeNull();
    expect(a.baroclinic).not.toBeNull();
    expect(() => resolvePlan(baroclinicPlan({ deformation: { kind: 'none' } }))).toThrow(InputError);
    expect(() => resolvePlan(baroclinicPlan({ deformation: { kind: 'none' } }))).toThrow(/deformation/);
    expect(planReportMarkdown(a)).toMatch(/Baroclinic drive \(two layers, imposed shear\)/);
  });

  it('matches a cheap two-layer run keeping ξ, L_d/grid, the drag and the depth ratio; the jets give', () => {
    const a = analysePlan(baroclinicPlan({ drive: { kind: 'baroclinic', shear: 1, depthRatio: 0.5 } }), {
      targetWallSeconds: 1,
    });
    const m = a.baroclinic!.matched!;
    expect(validateParams(m.params)).toEqual(m.params);
    expect(m.params).toMatchObject({ layers: 2, forcing: 'none', depth_ratio: 0.5, shear: 2 });
    const p = m.params;
    const planned = a.baroclinic!.predictions.find((q) => q.id === 'xi')!.value;
    // ξ of the matched parameters, as the run summary works it out [derived: δk_d²ΔU/((1 + δ)β)].
    expect((0.5 * p.kd * p.kd * p.shear) / (1.5 * p.beta) / planned - 1).toBeCloseTo(0, 12);
    expect(1 / p.kd / (p.Ly / p.ny) / (1 / ((32 * Math.PI) / 256)) - 1).toBeCloseTo(0, 12);
    // The drag in eddy units μλ/U: planned (1/20)·1/(1/2), matched μ/k_d with U = 1.
    expect(p.mu / p.kd / ((1 / 20) * 2) - 1).toBeCloseTo(0, 12);
    // Its small random start lies on an annulus around the fastest-growing mode, inside the grid.
    expect(p.kf + p.dkf).toBeLessThan(keptRadius(p));
    expect(m.predicted.supercriticality / planned - 1).toBeCloseTo(0, 12);
    expect(m.predicted.heat_flux).toBeCloseTo(m.predicted.eddy_diffusivity * p.shear, 12);
    const byLabel = Object.fromEntries(m.kept.map((k) => [k.label, k.kept]));
    expect(byLabel['criticality ξ']).toBe(true);
    expect(byLabel['jets per domain Ly/L_j']).toBe(false);
    // δ = 0.5: ξ = (1/3)·1/0.25 = 4/3, L_j = 2π·4/3, 12 jets on 256²; with L_d/dy kept 64² holds 3,
    // the floor, and 32² would hold 1.5: 64² is the smallest, and over a 1 s target it is taken.
    expect(p.ny).toBe(64);
    expect(m.notes.join(' ')).toMatch(/no grid fits the target/);
  });

  it('is accepted by stria plan, as text and JSON', async () => {
    const args = ['plan', '--preset', 'earth-ocean', '--set', 'drive.kind=baroclinic', '--set', 'drive.shear=0.1'];
    const text = await striaHere(args);
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toMatch(/Baroclinic drive \(two layers\)/);
    expect(text.stdout).toMatch(/Matched two-layer run: \d+ × \d+/);
    const json = await striaHere([...args, '--json']);
    expect(json.status, json.stderr).toBe(0);
    const out = JSON.parse(json.stdout);
    expect(out.baroclinic.predictions.xi.value).toBeGreaterThan(1);
    expect(out.baroclinic.matched.params.layers).toBe(2);
  });

  it('is what the model keys layers = 2, shear and kd plan, and stria plan writes its matched parameters', async () => {
    const { input } = planInputFromModelParams({ layers: 2, shear: 3, kd: 8, depth_ratio: 0.5 });
    expect(input.drive).toEqual({ kind: 'baroclinic', shear: 3, depthRatio: 0.5 });
    expect(planInputFromModelParams({ kd: 8 }).input.drive.kind).toBe('injection');
    const dir = scratchDir('baroclinic-plan');
    const file = join(dir, 'matched.json');
    const r = await striaHere([
      'plan',
      ...['--set', 'layers=2', '--set', 'shear=3', '--set', 'kd=8', '--set', 'nx=64', '--set', 'ny=64'],
      '--matched-params',
      file,
    ]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/matched two-layer run's parameters written/);
    const written = decodeParamsFile(JSON.parse(readFileSync(file, 'utf8')));
    expect(written.params).toMatchObject({ layers: 2, forcing: 'none', shear: 2 });
    // ξ = δk_d²ΔU/((1 + δ)β) = 0.5·64·3/40 = 2.4 with the default β = 40 [derived], kept by the matched run.
    const p = written.params as { kd: number; shear: number; beta: number };
    expect((0.5 * p.kd * p.kd * p.shear) / p.beta).toBeCloseTo(2.4, 12);
  });

  it('runs the matched two-layer run with --matched: eddies grow and carry heat down the imposed gradient', async () => {
    const r = await striaHere([
      'plan',
      ...['--set', 'layers=2', '--set', 'shear=3', '--set', 'kd=8', '--set', 'nx=32', '--set', 'ny=32'],
      ...['--set', 'mu=0.5', '--matched', '--json'],
    ]);
    expect(r.status, r.stderr).toBe(0);
    const m = JSON.parse(r.stdout).baroclinic.matched;
    expect(m.measured.supercriticality).toBeCloseTo(m.predicted.supercriticality, 12);
    // Growth from the shear needs a positive generation F₁h₁ΔU⟨v₁′τ′⟩, so a positive heat flux
    // [derived: the energy cycle of docs/two-layer.md].
    expect(m.measured.heat_flux).toBeGreaterThan(0);
    expect(m.measured.energy_generation).toBeGreaterThan(0);
  });
});
