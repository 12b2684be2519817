/**
 * Model parameters: one flat record in model units, with the trade's symbols as names so that run
 * files, `--set key=value`, links and NetCDF attributes all use the same keys.
 *
 * The equation (PV anomaly q, streamfunction ψ, total PV q + βy):
 *   ∂q/∂t + J(ψ, q) + β ∂ψ/∂x = F − μ ζ − ν (−∇²)^p q − μ_ls q_<,   q = ∇²ψ − k_d² ψ,  ζ = ∇²ψ,
 * with J(ψ, q) = ψ_x q_y − ψ_y q_x, u = −ψ_y, v = ψ_x. Linear drag μ acts on the relative vorticity
 * (bottom friction on the velocity); hyperviscosity acts on q; the large-scale drag μ_ls acts on the
 * modes with |k| ≤ k_ls only. F is the forcing (see `forcing.ts`).
 */
export type ForcingKind = 'stochastic' | 'steady' | 'none';
export type SchemeName = 'ifrk4';

export interface ModelParams {
  /** Domain size in x and y (model length units). */
  Lx: number;
  Ly: number;
  /** Grid points in x and y (powers of two, 32..1024). */
  nx: number;
  ny: number;
  /** Planetary vorticity gradient β (1/(length·time)). */
  beta: number;
  /** Deformation wavenumber k_d = 1/L_d (1/length); 0 for the barotropic (infinite L_d) case. */
  kd: number;
  /** Linear drag rate μ on relative vorticity (1/time). */
  mu: number;
  /** Hyperviscosity coefficient ν (length^{2p}/time) and its order p (ν(−∇²)^p). */
  nu: number;
  nu_order: number;
  /** Large-scale drag rate μ_ls (1/time) on modes with |k| ≤ k_ls (1/length); 0 switches it off. */
  mu_ls: number;
  k_ls: number;
  /** Forcing: kind, annulus centre k_f and half-width δk (1/length), energy injection rate ε. */
  forcing: ForcingKind;
  kf: number;
  dkf: number;
  eps: number;
  /** When false, modes with kx = 0 (purely zonal) are left unforced. */
  force_zonal: boolean;
  /** Time step (time units): the fixed step, or the largest allowed step when cfl > 0. */
  dt: number;
  /** Target CFL number for an adaptive step; 0 keeps dt fixed. */
  cfl: number;
  /** Seed of the random streams (forcing and initial state), an integer 0..2³²−1. */
  seed: number;
  /** Energy of the initial random field on the forcing annulus (0 starts from rest). */
  init_energy: number;
  /** Time-stepping scheme. */
  scheme: SchemeName;
}

export const SIZE_MIN = 32;
export const SIZE_MAX = 1024;

/**
 * The default scenario (the app opens on it: lib/plan/demoScenarios.ts, "Jets"), a scenario of the
 * project's own in model units, from which every other parameter set departs. Predicted U = 1,
 * k_R = 4.5, k_β = 20, R_β = 4.5; four to five eastward jets form by t ≈ 40–60.
 */
export const DEFAULT_PARAMS: Readonly<ModelParams> = Object.freeze({
  Lx: 2 * Math.PI,
  Ly: 2 * Math.PI,
  nx: 128,
  ny: 128,
  beta: 40,
  kd: 0,
  mu: 0.02,
  nu: 3e-26,
  nu_order: 8,
  mu_ls: 0,
  k_ls: 0,
  forcing: 'stochastic',
  kf: 24,
  dkf: 2,
  eps: 0.02,
  force_zonal: false,
  dt: 0.02,
  cfl: 0.8,
  seed: 1,
  init_energy: 0,
  scheme: 'ifrk4',
});
