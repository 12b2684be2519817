import { describe, expect, it } from 'vitest';
import { RHINES_DEFINITIONS, rhinesLength, type RhinesConvention } from '../../lib/analysis/scales';
import { cflStep, predictPlan, regimeLabel } from '../../lib/plan/predictions';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { THRESHOLDS } from '../../lib/plan/thresholds';
import { expectQuoted, goodModelPlan } from './quoted';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('predictions', () => {
  // Worked example [derived] (docs/scales.md): β = 10, ε = μ = 1e-3 → U = 1, k_β = 15.8489,
  // k_R = 2.23607, R_β = 7.08786. k_R [published] Rhines, J. Fluid Mech. 69, 417 (1975); k_β
  // [published] Vallis & Maltrud, J. Phys. Oceanogr. 23, 1346 (1993); R_β [published] Sukoriansky,
  // Dikovskaya & Galperin, J. Atmos. Sci. 64, 3312 (2007); regime thresholds [memory] Galperin et al. 2010.
  it('reproduces the worked example of the zonostrophy index', () => {
    const p = predictPlan(
      resolvePlan(
        goodModelPlan({ rotation: { kind: 'beta', beta: 10 }, drive: { kind: 'injection', eps: 1e-3 }, dragTime: 1e3 }),
      ),
    );
    expect(p.U.value).toBe(1);
    expectQuoted(p.kBeta.value, '15.8489');
    expectQuoted(p.kR.value, '2.23607');
    expectQuoted(p.R_beta.value, '7.08786');
    expect(p.regime.text).toBe('zonostrophic');
    expect(regimeLabel(p)).toMatch(/fully developed zonostrophic/);
  });

  // Staircase: L = 720^{1/4} (U/β)^½ ≈ 5.1800 (U/β)^½ [published] Dritschel & McIntyre, J. Atmos. Sci.
  // 65, 855 (2008); the factor [derived].
  it('gives the staircase spacing and the jet counts', () => {
    const plan = resolvePlan(goodModelPlan());
    const p = predictPlan(plan);
    expectQuoted(p.jetSpacingStaircase.value / Math.sqrt(1 / 50), '5.1800');
    expect(p.jetsStaircase.value).toBe(plan.Ly / p.jetSpacingStaircase.value);
    expect(p.jetsRhines.value).toBe(plan.Ly / p.jetSpacingRhines.value);
    // Default convention k_R: spacing 2π/k_R, here 2π/5, so 5 jets in 2π.
    expect(rel(p.jetsRhines.value, 5)).toBeLessThan(4 * Number.EPSILON);
  });

  // The Rhines conventions differ by exact factors [memory for who uses which] (CHECKS).
  it('lists the Rhines length in every convention and uses the chosen one for the jets', () => {
    for (const c of Object.keys(RHINES_DEFINITIONS) as RhinesConvention[]) {
      const p = predictPlan(resolvePlan(goodModelPlan({ rhines: c })));
      expect(p[`rhines_${c}`].value).toBe(rhinesLength(50, 1, c));
      expect(p[`rhines_${c}`].formula).toBe(RHINES_DEFINITIONS[c].label);
      expect(p.jetSpacingRhines.value).toBe(rhinesLength(50, 1, c));
    }
    const p = predictPlan(resolvePlan(goodModelPlan()));
    expect(rel(p.rhines_twoPiSqrtUbeta.value / p.rhines_sqrtUbeta.value, 2 * Math.PI)).toBeLessThan(4 * Number.EPSILON);
    expect(rel(p.rhines_kR.value / p.rhines_piOverKR.value, 2)).toBeLessThan(4 * Number.EPSILON);
  });

  // A target U: ε = μU², and the steady closed form of R_β equals k_β/k_R at that U [derived].
  it('agrees between the closed form of R_β and k_β/k_R under a target velocity', () => {
    const p = predictPlan(resolvePlan(goodModelPlan({ drive: { kind: 'velocity', U: 0.7 } })));
    expect(p.U.value).toBe(0.7);
    expect(rel(p.R_beta.value, p.kBeta.value / p.kR.value)).toBeLessThan(1e-14);
    expect(p.U.formula).toMatch(/target/);
  });

  // Spin-up: from dE/dt = ε − 2μE the energy e-folds in 1/(2μ) [derived]; the steady multiple [practice].
  it('gives the spin-up time, steady-state time and forcing-scale turnover', () => {
    const plan = resolvePlan(goodModelPlan());
    const p = predictPlan(plan);
    expect(p.spinUpTime.value).toBe(25);
    expect(p.steadyTime.value).toBe(THRESHOLDS.steadyMultiple * 25);
    expect(rel(p.turnoverForcing.value, Math.pow(0.02 * 1600, -1 / 3))).toBeLessThan(4 * Number.EPSILON);
    expect(p.eta.value).toBe(40 * 40 * 0.02);
  });

  // k_ν = (η^{1/3}/ν)^{1/(2p)} [practice] with ν = 1/(τ k_max^{2p}) gives k_ν = k_max (η^{1/3} τ)^{1/(2p)}.
  it('places the dissipation wavenumber by the hyperviscous balance', () => {
    const plan = resolvePlan(goodModelPlan());
    const p = predictPlan(plan);
    expect(rel(p.kNu.value, plan.kMax * Math.pow(Math.cbrt(p.eta.value) * plan.gridDampingTime, 1 / 8))).toBeLessThan(
      1e-13,
    );
  });

  // CFL number as the model defines it, dt·(max|u|/dx + max|v|/dy) (lib/model/stepper.ts) [practice].
  it('sets the time step from the CFL number and the assumed peak speed', () => {
    const plan = resolvePlan(goodModelPlan({ cfl: 0.4 }));
    const p = predictPlan(plan);
    expect(p.peakSpeed.value).toBe(THRESHOLDS.peakToRms * 1);
    expect(p.dtCFL.value).toBe(cflStep(0.4, 3, plan.dx, plan.dy));
    expect(rel(p.dtCFL.value * (3 / plan.dx + 3 / plan.dy), 0.4)).toBeLessThan(4 * Number.EPSILON);
    expect(p.stepsToSteady.value).toBe(Math.ceil(p.steadyTime.value / p.dtCFL.value));
    expect(p.stepsPlanned.value).toBe(Math.ceil(500 / p.dtCFL.value));
  });

  it('carries a formula and a marked source on every prediction', () => {
    const p = predictPlan(resolvePlan(goodModelPlan()));
    for (const q of Object.values(p)) {
      expect(q.formula.length, q.id).toBeGreaterThan(3);
      expect(q.reference, q.id).toMatch(/\[(published|derived|memory|practice)/);
      expect(Number.isFinite(q.value), q.id).toBe(true);
    }
  });
});
