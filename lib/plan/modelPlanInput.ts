import { DEFAULT_PARAMS, type ModelParams } from '../model/params';
import { keptRadius } from '../model/validateParams';
import { scaledHyperviscosity } from './gridHyperviscosity';
import type { PlanInput } from './planInput';
import { THRESHOLDS } from './thresholds';

/** The model parameters a plan is made of; the others (dt, seed, forcing kind, …) belong to a run. */
export const PLAN_MODEL_KEYS = [
  'beta',
  'kd',
  'mu',
  'nu',
  'nu_order',
  'kf',
  'dkf',
  'eps',
  'Lx',
  'Ly',
  'nx',
  'ny',
  'cfl',
  'layers',
  'shear',
  'depth_ratio',
] as const;
export type PlanModelKey = (typeof PLAN_MODEL_KEYS)[number];

/**
 * A model-unit plan from model parameters, the way `stria run` takes them: every key not given comes
 * from DEFAULT_PARAMS (the default scenario), and the result says which did. The translation:
 *   beta → rotation β;  kd → deformation radius L_d = 1/k_d (none for 0);  eps → injection rate ε;
 *   mu → drag time 1/μ;  kf, dkf → forcing wavelength 2π/k_f and half-width δk/k_f;  Lx, Ly → domain;
 *   nx, ny → grid points;  nu, nu_order → order p and grid damping time τ = 1/(ν k_max^{2p}), with ν
 *   first rescaled to the grid when the grid is given and ν is not (scaledHyperviscosity), as
 *   `stria run` does;  cfl → CFL number;  layers = 2 → the baroclinic drive with shear U₁ − U₂ and
 *   depth_ratio δ (no stirring: eps, kf and dkf then only fill the forcing fields the plan does not use).
 * The run length, which no model parameter holds, is `runLength` or two times to statistical steady
 * state, 2 · 5/(2μ) (spin-up, then as long again to average), as the matched run's.
 * Values are not checked here: validatePlanInput names any that are out of range.
 */
export function planInputFromModelParams(
  given: Partial<Pick<ModelParams, PlanModelKey>>,
  runLength?: number,
): { input: PlanInput; defaulted: PlanModelKey[] } {
  const defaulted = PLAN_MODEL_KEYS.filter((k) => given[k] === undefined);
  const p = { ...DEFAULT_PARAMS, ...given };
  const gridGiven = ['nx', 'ny', 'Lx', 'Ly'].some((k) => k in given);
  const nu =
    gridGiven && given.nu === undefined ? scaledHyperviscosity({ ...DEFAULT_PARAMS, nu_order: p.nu_order }, p) : p.nu;
  const kMax = keptRadius(p);
  return {
    input: {
      units: 'model',
      rotation: { kind: 'beta', beta: p.beta },
      deformation: p.kd > 0 ? { kind: 'radius', Ld: 1 / p.kd } : { kind: 'none' },
      drive:
        p.layers === 2
          ? { kind: 'baroclinic', shear: p.shear, depthRatio: p.depth_ratio }
          : { kind: 'injection', eps: p.eps },
      dragTime: 1 / p.mu,
      forcing: { wavelength: (2 * Math.PI) / p.kf, halfWidth: p.dkf / p.kf },
      domain: { Lx: p.Lx, Ly: p.Ly },
      grid: { kind: 'points', nx: p.nx, ny: p.ny },
      hyperviscosity: { order: p.nu_order, gridDampingTime: 1 / (nu * Math.pow(kMax, 2 * p.nu_order)) },
      runLength: runLength ?? (2 * THRESHOLDS.steadyMultiple) / (2 * p.mu),
      // A fixed-step run (cfl 0) is planned at the default CFL number: the planner sizes steps by it.
      cfl: p.cfl > 0 ? p.cfl : DEFAULT_PARAMS.cfl,
    },
    defaulted,
  };
}
