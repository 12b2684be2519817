import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { scaledHyperviscosity } from '../../lib/plan/gridHyperviscosity';
import { planInputFromModelParams, PLAN_MODEL_KEYS } from '../../lib/plan/modelPlanInput';
import { missingFields, validatePlanInput } from '../../lib/plan/planInput';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { IDENTITY_SCALING, planModelParams } from '../../lib/plan/units';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('a model-unit plan from model parameters', () => {
  it('gives back the parameters it was made of, the rest the defaults', () => {
    const given = { beta: 3, eps: 2e-4, mu: 5e-3 };
    const { input, defaulted } = planInputFromModelParams(given);
    expect(defaulted).toEqual(PLAN_MODEL_KEYS.filter((k) => !(k in given)));
    const plan = resolvePlan(input);
    const back = planModelParams(plan, 0.01, IDENTITY_SCALING);
    for (const k of ['beta', 'eps', 'mu'] as const) expect(rel(back[k], given[k]), k).toBeLessThan(1e-15);
    for (const k of ['kf', 'dkf', 'nu', 'Lx', 'Ly'] as const)
      expect(rel(back[k], DEFAULT_PARAMS[k]), k).toBeLessThan(1e-12);
    expect([back.nx, back.ny, back.nu_order, back.kd]).toEqual([128, 128, 8, 0]);
    // Two times to steady state: 2 · 5/(2μ) = 1000 for μ = 5e-3 [derived].
    expect(input.runLength).toBeCloseTo(1000, 9);
  });

  it('rescales ν with a new grid unless ν is given, as stria run does', () => {
    const moved = planModelParams(
      resolvePlan(planInputFromModelParams({ nx: 256, ny: 256 }).input),
      0.01,
      IDENTITY_SCALING,
    );
    expect(rel(moved.nu, scaledHyperviscosity(DEFAULT_PARAMS, { nx: 256, ny: 256 }))).toBeLessThan(1e-12);
    const kept = planModelParams(
      resolvePlan(planInputFromModelParams({ nx: 256, ny: 256, nu: 1e-30 }).input),
      0.01,
      IDENTITY_SCALING,
    );
    expect(rel(kept.nu, 1e-30)).toBeLessThan(1e-12);
    expect(planInputFromModelParams({ kd: 4 }).input.deformation).toEqual({ kind: 'radius', Ld: 0.25 });
  });
});

describe('an incomplete plan', () => {
  it('is refused with each missing field named as missing, nothing else', () => {
    try {
      validatePlanInput({ units: 'model', drive: { kind: 'injection', eps: 1 } });
      expect.unreachable();
    } catch (e) {
      const issues = (e as { issues: { field: string; message: string }[] }).issues;
      expect(missingFields(issues)).toEqual([
        'rotation',
        'deformation',
        'dragTime',
        'forcing',
        'domain',
        'grid',
        'hyperviscosity',
        'runLength',
      ]);
    }
  });
});
