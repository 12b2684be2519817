import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { balanceVelocity, steadyZonostrophyIndex } from '../../lib/analysis/scales';
import { validateParams } from '../../lib/model/validateParams';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import {
  DIM,
  hyperviscosityDimension,
  IDENTITY_SCALING,
  planModelParams,
  planScaling,
  toModel,
  toPhysical,
  unitOf,
} from '../../lib/plan/units';
import { goodModelPlan } from './quoted';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const scaling = fc.record({
  length: fc.double({ min: 1e-3, max: 1e9, noNaN: true }),
  time: fc.double({ min: 1e-3, max: 1e9, noNaN: true }),
});
const dims = fc.constantFrom(
  ...Object.values(DIM),
  hyperviscosityDimension(1),
  hyperviscosityDimension(4),
  hyperviscosityDimension(8),
);

const earthPlan = () =>
  resolvePlan({
    units: 'physical',
    rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 40 },
    deformation: { kind: 'radius', Ld: 8e5 },
    drive: { kind: 'injection', eps: 3e-5 },
    dragTime: 1.5e6,
    forcing: { wavelength: 4e5, halfWidth: 0.1 },
    domain: { Lx: 2e7, Ly: 1e7 },
    grid: { kind: 'points', nx: 512, ny: 256 },
    hyperviscosity: { order: 4, gridDampingTime: 7200 },
    runLength: 5e7,
  });

describe('units', () => {
  it('round-trips any quantity through model units (seeded property)', () => {
    fc.assert(
      fc.property(scaling, dims, fc.double({ min: 1e-30, max: 1e30, noNaN: true }), (s, d, x) => {
        // Two divisions by a product of at most 17 powers: a few ulps each way.
        expect(rel(toPhysical(toModel(x, d, s), d, s), x)).toBeLessThan(64 * Number.EPSILON);
      }),
      { seed: 20261201, numRuns: 500 },
    );
  });

  it('composes dimensions: the unit of L^a T^b is ℓ^a t^b', () => {
    const s = { length: 2, time: 10 };
    expect(unitOf(DIM.beta, s)).toBe(1 / 20);
    expect(unitOf(DIM.injection, s)).toBe(4 / 1000);
    expect(unitOf(hyperviscosityDimension(4), s)).toBe(256 / 10);
    expect(toModel(7, DIM.none, s)).toBe(7);
    expect(toModel(3, DIM.length, IDENTITY_SCALING)).toBe(3);
  });

  it('scales a physical plan so the domain is 2π long and the rms velocity is 1', () => {
    const plan = earthPlan();
    const s = planScaling(plan);
    expect(s.length).toBe(2e7 / (2 * Math.PI));
    expect(rel(s.time, s.length / plan.U)).toBeLessThan(Number.EPSILON);
    const mp = planModelParams(plan, 1e-3);
    expect(rel(mp.Lx, 2 * Math.PI)).toBeLessThan(2 * Number.EPSILON);
    expect(rel(mp.Ly, Math.PI)).toBeLessThan(2 * Number.EPSILON);
    expect(rel(balanceVelocity(mp.eps, mp.mu), 1)).toBeLessThan(4 * Number.EPSILON);
  });

  it('keeps the dimensionless groups of the plan in model units', () => {
    const plan = earthPlan();
    const mp = planModelParams(plan, 1e-3);
    // R_β, k_f/k_d, k_f·Ly, and the grid-scale damping ν k_max^{2p} over μ are unit-free.
    expect(
      rel(steadyZonostrophyIndex(mp.beta, mp.eps, mp.mu), steadyZonostrophyIndex(plan.beta, plan.eps, plan.mu)),
    ).toBeLessThan(1e-14);
    expect(rel(mp.kf / mp.kd, plan.kf / plan.kd)).toBeLessThan(1e-14);
    expect(rel(mp.kf * mp.Ly, plan.kf * plan.Ly)).toBeLessThan(1e-14);
    expect(
      rel(
        (mp.nu * Math.pow((2 * Math.PI * Math.floor(256 / 3)) / mp.Ly, 8)) / mp.mu,
        (plan.nu * Math.pow(plan.kMax, 8)) / plan.mu,
      ),
    ).toBeLessThan(1e-12);
    expect(mp.nu_order).toBe(4);
    expect(mp.forcing).toBe('stochastic');
  });

  it('leaves a model-unit plan in its own units, and a small plan passes the model validation', () => {
    const plan = resolvePlan(goodModelPlan({ grid: { kind: 'points', nx: 256, ny: 256 } }));
    expect(planScaling(plan)).toEqual(IDENTITY_SCALING);
    const mp = planModelParams(plan, 2e-3);
    expect(mp.beta).toBe(50);
    expect(mp.mu).toBe(1 / 50);
    expect(() => validateParams(mp)).not.toThrow();
  });
});
