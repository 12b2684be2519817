import { describe, expect, it } from 'vitest';
import { checkPlan, type CheckId, type PlanCheck } from '../../lib/plan/checks';
import { predictPlan } from '../../lib/plan/predictions';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { THRESHOLDS } from '../../lib/plan/thresholds';
import { goodModelPlan } from './quoted';

const checksOf = (over: Record<string, unknown>) => checkPlan(resolvePlan(goodModelPlan(over)));
const find = (cs: PlanCheck[], id: CheckId) => cs.find((c) => c.id === id) as PlanCheck;
const check = (over: Record<string, unknown>, id: CheckId) => find(checksOf(over), id);
/** The number after `label` in a fix text (as the fix prints it). */
const numberAfter = (text: string | null, label: string): number => {
  const i = (text ?? '').indexOf(label);
  if (i < 0) throw new Error(`"${label}" not in "${text}"`);
  return Number(/^\s*([-+0-9.e]+)/.exec((text as string).slice(i + label.length))?.[1]);
};
const grid = (text: string | null) => {
  const m = /raise nx × ny to (\d+) × (\d+)/.exec(text ?? '');
  if (!m) throw new Error(`no grid in "${text}"`);
  return { kind: 'points', nx: Number(m[1]), ny: Number(m[2]) };
};
const ALL: CheckId[] = [
  'scaleSeparation',
  'jetCount',
  'forcingNearGrid',
  'frictionDominated',
  'runLength',
  'arrestInDomain',
  'forcingAnnulus',
  'deformation',
];

describe('plan checks', () => {
  it('stay quiet on a good plan, each with its numbers and thresholds', () => {
    const cs = checksOf({});
    expect(cs.map((c) => c.id)).toEqual(ALL);
    for (const c of cs) {
      expect(c.severity, `${c.id}: ${c.message}`).toBe('ok');
      expect(c.fix).toBeNull();
      expect(c.numbers.length).toBeGreaterThan(0);
      expect(c.threshold.length).toBeGreaterThan(5);
      expect(c.reference).toMatch(/\[(published|derived|memory|practice)/);
    }
  });

  it('scale separation: jets too close to the forcing (warning), out of order (error), with a working fix', () => {
    // k_f = 10, k_R = 5: L_jet/λ_f = k_f/k_R = 2, below 4.
    const warn = check({ forcing: { wavelength: (2 * Math.PI) / 10, halfWidth: 0.05 } }, 'scaleSeparation');
    expect(warn.severity).toBe('warning');
    expect(warn.message).toMatch(/jets too close to the forcing scale/);
    expect(warn.numbers[1].value).toBeCloseTo(2, 12);
    const lambda = numberAfter(warn.fix, 'shorten the forcing wavelength to at most');
    expect(
      check({ forcing: { wavelength: lambda, halfWidth: 0.05 }, grid: grid(warn.fix) }, 'scaleSeparation').severity,
    ).toBe('ok');
    expect(check({ forcing: { wavelength: (2 * Math.PI) / 4, halfWidth: 0.05 } }, 'scaleSeparation').severity).toBe(
      'error',
    );
  });

  it('scale separation: forcing too near the dissipation scale, and dissipation below the grid', () => {
    // k_f = 100 on k_max = 170: k_ν ≈ 159 < 2 k_f; the grid must grow for k_ν to reach 200.
    const near = check({ forcing: { wavelength: (2 * Math.PI) / 100, halfWidth: 0.05 } }, 'scaleSeparation');
    expect(near.severity).toBe('warning');
    expect(near.message).toMatch(/forcing too close to the dissipation scale/);
    expect(near.fix).toMatch(/raise nx × ny to 1024 × 1024/);
    // τ = 10 ≫ η^{−1/3}: k_ν lies beyond k_max.
    const piled = check({ hyperviscosity: { order: 4, gridDampingTime: 10 } }, 'scaleSeparation');
    expect(piled.severity).toBe('warning');
    expect(piled.message).toMatch(/enstrophy piles up/);
    const tau = numberAfter(piled.fix, 'η^{−1/3} =');
    expect(check({ hyperviscosity: { order: 4, gridDampingTime: tau } }, 'scaleSeparation').severity).toBe('ok');
  });

  it(`jet count: below ${THRESHOLDS.minJets} jets warns, below one errs, and the fix restores it`, () => {
    const Ly = (2 * Math.PI * 2) / 5; // two Rhines spacings 2π/k_R
    const warn = check({ domain: { Lx: 2 * Math.PI, Ly } }, 'jetCount');
    expect(warn.severity).toBe('warning');
    expect(warn.message).toMatch(/only 2 jets/);
    const LyNew = numberAfter(warn.fix, 'enlarge Ly to at least');
    const nyNew = numberAfter(warn.fix, 'with ny =');
    expect(
      check({ domain: { Lx: 2 * Math.PI, Ly: LyNew }, grid: { kind: 'points', nx: 512, ny: nyNew } }, 'jetCount')
        .severity,
    ).toBe('ok');
    expect(check({ domain: { Lx: 2 * Math.PI, Ly: 1 } }, 'jetCount').severity).toBe('error');
  });

  it('forcing near the grid: hyperviscosity eating the forced modes, fixed by the grid or τ it names', () => {
    const over = { forcing: { wavelength: (2 * Math.PI) / 150, halfWidth: 0.05 } };
    const warn = check(over, 'forcingNearGrid');
    expect(warn.severity).toBe('warning');
    expect(warn.numbers[0].value).toBeGreaterThan(THRESHOLDS.maxForcingDamping);
    expect(check({ ...over, grid: grid(warn.fix) }, 'forcingNearGrid').severity).toBe('ok');
    const tau = numberAfter(warn.fix, 'lengthen the grid-scale damping time to at least');
    expect(check({ ...over, hyperviscosity: { order: 4, gridDampingTime: tau } }, 'forcingNearGrid').severity).toBe(
      'ok',
    );
    expect(check({ ...over, hyperviscosity: { order: 4, gridDampingTime: 0.01 } }, 'forcingNearGrid').severity).toBe(
      'error',
    );
  });

  // R_β < 1.5 friction-dominated (Sukoriansky et al. 2007; Galperin et al. 2010 [memory for the thresholds]).
  it('friction-dominated: R_β below 1.5, with a drag fix that reaches R_β = 2.5 under either drive', () => {
    const byEps = { rotation: { kind: 'beta', beta: 1 }, dragTime: 1 };
    const warn = check(byEps, 'frictionDominated');
    expect(warn.severity).toBe('warning');
    expect(warn.numbers[0].value).toBeLessThan(1.5);
    const drag = numberAfter(warn.fix, 'lengthen the drag time 1/μ to');
    const after = predictPlan(resolvePlan(goodModelPlan({ ...byEps, dragTime: drag })));
    expect(after.R_beta.value).toBeGreaterThanOrEqual(THRESHOLDS.zonostrophic);
    expect(after.R_beta.value).toBeLessThan(THRESHOLDS.zonostrophic * (1 + 1e-3));
    const eps = numberAfter(warn.fix, 'or raise ε to');
    expect(
      predictPlan(resolvePlan(goodModelPlan({ ...byEps, drive: { kind: 'injection', eps } }))).R_beta.value,
    ).toBeGreaterThanOrEqual(THRESHOLDS.zonostrophic);
    const byU = { rotation: { kind: 'beta', beta: 1 }, drive: { kind: 'velocity', U: 0.1 }, dragTime: 1 };
    const warnU = check(byU, 'frictionDominated');
    expect(warnU.severity).toBe('warning');
    const dragU = numberAfter(warnU.fix, 'lengthen the drag time 1/μ to');
    expect(predictPlan(resolvePlan(goodModelPlan({ ...byU, dragTime: dragU }))).R_beta.value).toBeGreaterThanOrEqual(
      THRESHOLDS.zonostrophic,
    );
    const U = numberAfter(warnU.fix, 'raise the target U to');
    expect(
      predictPlan(resolvePlan(goodModelPlan({ ...byU, drive: { kind: 'velocity', U } }))).R_beta.value,
    ).toBeGreaterThanOrEqual(THRESHOLDS.zonostrophic);
  });

  it('run length: shorter than the steady-state time warns; the length it names passes', () => {
    const warn = check({ runLength: 100 }, 'runLength');
    expect(warn.severity).toBe('warning');
    expect(warn.message).toMatch(/4 spin-up times/);
    expect(check({ runLength: numberAfter(warn.fix, 'run for at least') }, 'runLength').severity).toBe('ok');
  });

  it('arrest inside the domain: k_R below 2π/Ly errs, k_β alone below it warns', () => {
    const err = check({ domain: { Lx: 2 * Math.PI, Ly: (2 * Math.PI) / 6 } }, 'arrestInDomain');
    expect(err.severity).toBe('error');
    expect(err.numbers[0].value).toBeCloseTo(5 / 6, 12);
    // ε = 1, β = 0.5: k_β = 0.125^{1/5} ≈ 0.66 < 1 = 2π/Ly; μ = 25: U = 0.2, k_R ≈ 1.12 > 1.
    const warn = check(
      { rotation: { kind: 'beta', beta: 0.5 }, drive: { kind: 'injection', eps: 1 }, dragTime: 1 / 25 },
      'arrestInDomain',
    );
    expect(warn.severity).toBe('warning');
    expect(warn.fix).toMatch(/enlarge Ly to at least/);
  });

  it('forcing annulus: beyond k_max or below the smallest wavenumber is an error, and the fix works', () => {
    const over = { forcing: { wavelength: (2 * Math.PI) / 168, halfWidth: 0.05 } };
    const high = check(over, 'forcingAnnulus');
    expect(high.severity).toBe('error');
    expect(check({ ...over, grid: grid(high.fix) }, 'forcingAnnulus').severity).toBe('ok');
    const lambda = numberAfter(high.fix, 'lengthen the forcing wavelength to at least');
    expect(check({ forcing: { wavelength: lambda, halfWidth: 0.05 } }, 'forcingAnnulus').severity).toBe('ok');
    const low = check({ forcing: { wavelength: 2 * Math.PI, halfWidth: 0.5 } }, 'forcingAnnulus');
    expect(low.severity).toBe('error');
    expect(low.message).toMatch(/below the smallest wavenumber/);
    const lambdaLow = numberAfter(low.fix, 'shorten the forcing wavelength to at most');
    expect(check({ forcing: { wavelength: lambdaLow, halfWidth: 0.5 } }, 'forcingAnnulus').severity).toBe('ok');
  });

  it('deformation: k_d above k_R warns that the barotropic predictions are rough', () => {
    const warn = check({ deformation: { kind: 'radius', Ld: 0.1 } }, 'deformation');
    expect(warn.severity).toBe('warning');
    expect(warn.numbers[0].value).toBeCloseTo(2, 12);
    const Ld = numberAfter(warn.fix, 'lengthen L_d beyond 1/k_R =');
    expect(check({ deformation: { kind: 'radius', Ld: Ld * 1.0001 } }, 'deformation').severity).toBe('ok');
  });
});
