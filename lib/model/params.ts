/**
 * Model parameters: one flat record in model units, with the trade's symbols as names so that run
 * files, `--set key=value`, links and NetCDF attributes all use the same keys.
 *
 * One layer (layers = 1, the default). The equation (PV anomaly q, streamfunction ψ, total PV q + βy):
 *   ∂q/∂t + J(ψ, q) + β ∂ψ/∂x = F − μ ζ − ν (−∇²)^p q − μ_ls q_<,   q = ∇²ψ − k_d² ψ,  ζ = ∇²ψ,
 * with J(ψ, q) = ψ_x q_y − ψ_y q_x, u = −ψ_y, v = ψ_x. Linear drag μ acts on the relative vorticity
 * (bottom friction on the velocity); hyperviscosity acts on q; the large-scale drag μ_ls acts on the
 * modes with |k| ≤ k_ls only. F is the forcing (see `forcing.ts`).
 *
 * Two layers (layers = 2; the Phillips model, docs/two-layer.md): upper layer 1 over lower layer 2,
 * depth ratio δ = H₁/H₂, imposed uniform zonal flows U₁ − U₂ = shear with zero depth-weighted mean
 * (H₁U₁ + H₂U₂ = 0), for i = 1, 2:
 *   ∂q_i/∂t + U_i ∂q_i/∂x + Q_i ∂ψ_i/∂x + J(ψ_i, q_i) = F − δ_i2 μ ζ₂ − ν (−∇²)^p q_i − μ_ls q_i<,
 *   q₁ = ∇²ψ₁ + F₁(ψ₂ − ψ₁), q₂ = ∇²ψ₂ + F₂(ψ₁ − ψ₂), F₁ = k_d²/(1 + δ), F₂ = δ k_d²/(1 + δ),
 *   Q₁ = β + F₁ (U₁ − U₂), Q₂ = β − F₂ (U₁ − U₂).
 * μ is the drag on the lower layer only; the forcing F acts on both layers alike (barotropic).
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
  /**
   * Deformation wavenumber k_d = 1/L_d (1/length); 0 for the barotropic (infinite L_d) case. Two
   * layers: the interface's, k_d² = F₁ + F₂, and it must be > 0.
   */
  kd: number;
  /** Linear drag rate μ on relative vorticity (1/time); with two layers, on the lower layer's only. */
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
  /** Number of layers: 1 (the equation above) or 2 (the Phillips model). */
  layers: 1 | 2;
  /** Vertical shear U₁ − U₂ of the imposed zonal flow (length/time); two layers only, else 0. */
  shear: number;
  /** Depth ratio δ = H₁/H₂ of the upper to the lower layer; two layers only, else 1. */
  depth_ratio: number;
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
  layers: 1,
  shear: 0,
  depth_ratio: 1,
});

/** The keys of the two-layer model, and the values that make a run one-layer. */
export const ONE_LAYER_VALUES: Readonly<Pick<ModelParams, 'layers' | 'shear' | 'depth_ratio'>> = Object.freeze({
  layers: 1,
  shear: 0,
  depth_ratio: 1,
});

/**
 * The parameters as files store them and run ids digest them: a one-layer run without the two-layer
 * keys (validation keeps them at ONE_LAYER_VALUES there), so its run files and run ids are those it had
 * before the two-layer model existed, and older readers still take them; a two-layer run with all.
 */
export function storedParams(p: ModelParams): Partial<ModelParams> {
  if (p.layers !== 1) return { ...p };
  const out: Partial<ModelParams> = { ...p };
  delete out.layers;
  delete out.shear;
  delete out.depth_ratio;
  return out;
}

/**
 * The coefficients of the two-layer model (model units), for the model, the planner and the tests:
 * fractional depths h₁ = H₁/H = δ/(1 + δ), h₂ = H₂/H = 1/(1 + δ); coupling F₁ = k_d² h₂, F₂ = k_d² h₁
 * (so F₁ + F₂ = k_d², F₁/F₂ = H₂/H₁, F₁h₁ = F₂h₂); imposed flows U₁ = h₂·shear, U₂ = −h₁·shear
 * (U₁ − U₂ = shear, h₁U₁ + h₂U₂ = 0: no depth-mean imposed flow); mean PV gradients
 * Q₁ = β + F₁·shear, Q₂ = β − F₂·shear.
 */
export interface TwoLayerCoefficients {
  h1: number;
  h2: number;
  F1: number;
  F2: number;
  U1: number;
  U2: number;
  Q1: number;
  Q2: number;
}

export function twoLayerCoefficients(
  p: Pick<ModelParams, 'kd' | 'beta' | 'shear' | 'depth_ratio'>,
): TwoLayerCoefficients {
  const h1 = p.depth_ratio / (1 + p.depth_ratio);
  const h2 = 1 / (1 + p.depth_ratio);
  const kd2 = p.kd * p.kd;
  const F1 = kd2 * h2;
  const F2 = kd2 * h1;
  return {
    h1,
    h2,
    F1,
    F2,
    U1: h2 * p.shear,
    U2: -h1 * p.shear,
    Q1: p.beta + F1 * p.shear,
    Q2: p.beta - F2 * p.shear,
  };
}
