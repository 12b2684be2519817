import { DEFAULT_PARAMS, type ModelParams } from '../model/params';
import type { ResolvedPlan } from './resolvePlan';

/**
 * Dimensional ↔ model units. A scaling names the physical size of one model unit of length and of
 * time. Stria's choice for a physical plan (`planScaling`):
 *   length unit ℓ = Lx/2π  — the domain becomes 2π long in x (2π·Ly/Lx in y), as the model's default;
 *   time unit   t = ℓ/U    — U the plan's rms velocity, so the model's rms velocity is 1 and the
 *                            time unit is the time a typical parcel takes to cross ℓ.
 * A model-unit plan keeps its units (the identity scaling).
 * A quantity of dimension L^a T^b has model value  x_model = x_physical / (ℓ^a t^b).
 */
export interface UnitScaling {
  /** Physical length of one model length unit (m, or 1 for the identity). */
  length: number;
  /** Physical time of one model time unit (s, or 1 for the identity). */
  time: number;
}

export const IDENTITY_SCALING: Readonly<UnitScaling> = Object.freeze({ length: 1, time: 1 });

/** A dimension L^L T^T. */
export interface Dimension {
  L: number;
  T: number;
}

/** The dimensions of the planner's quantities. */
export const DIM = Object.freeze({
  length: { L: 1, T: 0 },
  time: { L: 0, T: 1 },
  wavenumber: { L: -1, T: 0 },
  rate: { L: 0, T: -1 },
  velocity: { L: 1, T: -1 },
  /** β: 1/(L·T). */
  beta: { L: -1, T: -1 },
  /** ε: energy per unit mass per time, L²/T³. */
  injection: { L: 2, T: -3 },
  /** g′: L/T². */
  acceleration: { L: 1, T: -2 },
  none: { L: 0, T: 0 },
} satisfies Record<string, Dimension>);

/** ν of hyperviscosity ν(−∇²)^p: L^{2p}/T. */
export function hyperviscosityDimension(order: number): Dimension {
  return { L: 2 * order, T: -1 };
}

/** The physical size of one model unit of dimension `dim` under `s`. */
export function unitOf(dim: Dimension, s: UnitScaling): number {
  return Math.pow(s.length, dim.L) * Math.pow(s.time, dim.T);
}

/** Physical value → model value. */
export function toModel(value: number, dim: Dimension, s: UnitScaling): number {
  return value / unitOf(dim, s);
}

/** Model value → physical value. */
export function toPhysical(value: number, dim: Dimension, s: UnitScaling): number {
  return value * unitOf(dim, s);
}

/** Stria's scaling for a plan: ℓ = Lx/2π, t = ℓ/U for a physical plan; the identity for a model-unit one. */
export function planScaling(plan: Pick<ResolvedPlan, 'units' | 'Lx' | 'U'>): UnitScaling {
  if (plan.units === 'model') return { ...IDENTITY_SCALING };
  const length = plan.Lx / (2 * Math.PI);
  return { length, time: length / plan.U };
}

/**
 * The planned run itself as a model parameter record under scaling `s` (default `planScaling`):
 * stochastic ring forcing, adaptive step at the plan's CFL number with `dtMax` (model time) as its
 * largest step, everything else from DEFAULT_PARAMS. Not validated: a planned grid larger than the
 * model's 1024 is a fine plan but not a run Stria can make; pass the result to validateParams to run it.
 */
export function planModelParams(plan: ResolvedPlan, dtMax: number, s: UnitScaling = planScaling(plan)): ModelParams {
  const m = (x: number, d: Dimension) => toModel(x, d, s);
  return {
    ...DEFAULT_PARAMS,
    Lx: m(plan.Lx, DIM.length),
    Ly: m(plan.Ly, DIM.length),
    nx: plan.nx,
    ny: plan.ny,
    beta: m(plan.beta, DIM.beta),
    kd: m(plan.kd, DIM.wavenumber),
    mu: m(plan.mu, DIM.rate),
    nu: m(plan.nu, hyperviscosityDimension(plan.order)),
    nu_order: plan.order,
    mu_ls: 0,
    k_ls: 0,
    forcing: 'stochastic',
    kf: m(plan.kf, DIM.wavenumber),
    dkf: m(plan.dkf, DIM.wavenumber),
    eps: m(plan.eps, DIM.injection),
    dt: dtMax,
    cfl: plan.cfl,
    init_energy: 0,
  };
}
