import type { PlanInput, UnitSystem } from '../../lib/plan/planInput';
import { PLAN_PRESETS } from '../../lib/plan/planPresets';

/**
 * What the form starts from when the unit system is switched: the first preset for physical units;
 * for model units a plan of Stria's own shaped like the default demo scenario (β = 40, ε = μ = 0.02,
 * k_f = 24 on 2π × 2π, order-8 hyperviscosity of ν ≈ 3e-26 at 128²: τ = 1/(ν k_max^16) ≈ 0.35 T).
 */
export function templatePlan(units: UnitSystem): PlanInput {
  if (units === 'physical') return structuredClone(PLAN_PRESETS[0].input);
  return {
    units: 'model',
    title: 'model-unit plan',
    rotation: { kind: 'beta', beta: 40 },
    deformation: { kind: 'none' },
    drive: { kind: 'injection', eps: 0.02 },
    dragTime: 50,
    forcing: { wavelength: (2 * Math.PI) / 24, halfWidth: 1 / 12 },
    domain: { Lx: 2 * Math.PI, Ly: 2 * Math.PI },
    grid: { kind: 'points', nx: 512, ny: 512 },
    hyperviscosity: { order: 8, gridDampingTime: 0.35 },
    runLength: 500,
  };
}
