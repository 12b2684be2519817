import { describe, expect, it } from 'vitest';
import { predictPlan } from '../../lib/plan/predictions';
import { planRatios } from '../../lib/plan/ratios';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { goodModelPlan } from './quoted';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('plan ratios', () => {
  it('are the ratios of the plan, by their definitions', () => {
    const plan = resolvePlan(goodModelPlan({ deformation: { kind: 'radius', Ld: 0.5 } }));
    const r = planRatios(plan, predictPlan(plan));
    expect(rel(r.jetsPerDomain, 5)).toBeLessThan(4 * Number.EPSILON);
    expect(rel(r.kfOverKR, 8)).toBeLessThan(4 * Number.EPSILON);
    expect(r.kmaxOverKf).toBe(170 / 40);
    expect(rel(r.kdOverKR, 2 / 5)).toBeLessThan(4 * Number.EPSILON);
    expect(r.runDragTimes).toBe(500 / 50);
    expect(r.aspect).toBe(1);
    expect(rel(r.annulusHalfWidth, 0.05)).toBeLessThan(2 * Number.EPSILON);
  });

  it('do not depend on the units: a plan scaled by any length and time has the same ratios', () => {
    const base = resolvePlan(goodModelPlan());
    const [ell, tau] = [37.5, 0.013];
    const scaled = resolvePlan(
      goodModelPlan({
        rotation: { kind: 'beta', beta: 50 / (ell * tau) },
        drive: { kind: 'injection', eps: (0.02 * ell * ell) / tau ** 3 },
        dragTime: 50 * tau,
        forcing: { wavelength: ((2 * Math.PI) / 40) * ell, halfWidth: 0.05 },
        domain: { Lx: 2 * Math.PI * ell, Ly: 2 * Math.PI * ell },
        hyperviscosity: { order: 4, gridDampingTime: 0.1 * tau },
        runLength: 500 * tau,
      }),
    );
    const a = planRatios(base, predictPlan(base));
    const b = planRatios(scaled, predictPlan(scaled));
    expect(a.kdOverKR).toBe(0);
    expect(b.kdOverKR).toBe(0);
    for (const k of Object.keys(a) as Array<keyof typeof a>)
      if (k !== 'kdOverKR') expect(rel(b[k], a[k]), k).toBeLessThan(1e-13);
  });
});
