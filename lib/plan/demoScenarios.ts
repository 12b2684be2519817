import type { ModelParams } from '../model/params';
import { scaledHyperviscosity } from './gridHyperviscosity';
import { TWO_LAYER_SCENARIOS } from './twoLayerScenarios';

/**
 * Demonstration scenarios of Stria's own, in model units (length L, time T; domain 2π × 2π). The
 * one-layer ones are no planet or ocean: no constant in them is a real one. The two two-layer ones
 * (twoLayerScenarios.ts) scale a few real constants, marked there as real, with the rest made up. Each sets every parameter that shapes the
 * run, so they do not shift when the model defaults do.
 *
 * How they were tuned (Node, this machine, one core): spin-up ~ 1/(2μ); U ≈ (ε/μ)^½ less what the
 * hyperviscosity takes at the forcing scale; jets about 2π/k_R apart with k_R = (β/2U)^½; visible jets
 * need R_β = √2(β²ε/μ⁵)^{1/20} well above 1.5 here (about 3.5 and up: near 2.5 the forcing-scale
 * eddies still dominate u). Hyperviscosity of order 8 with k_ν at the grid's k_max damps the grid
 * scale while the annulus k_f ± δk keeps most of its energy (ν = 3e-26 on 128²; a scenario on
 * another grid takes the ν with the same damping rate at k_max, `scaledHyperviscosity`): at order 4 with ν = 3e-12, enough at
 * k_max, 72–97% of the injection at k_f = 24–30 on 128² went to the hyperviscosity. Zonal modes are
 * left unforced (force_zonal false): the jets came out a little stronger (zonal share 0.17 against
 * 0.12 at t = 40 in a trial). "Measured" below: a run from rest with seed 1; jets = eastward maxima
 * of the zonal-mean u(y), smoothed to 16 harmonics, above a quarter of its peak; zonal share = the
 * fraction of ⟨u²⟩ in the zonal mean.
 */
export interface DemoScenario {
  id: string;
  name: string;
  /** One line: what the scenario shows. */
  description: string;
  params: Readonly<Partial<ModelParams>>;
}

/** What every scenario shares unless it says otherwise. */
const COMMON = {
  Lx: 2 * Math.PI,
  Ly: 2 * Math.PI,
  nx: 128,
  ny: 128,
  kd: 0,
  mu: 0.02,
  eps: 0.02,
  forcing: 'stochastic',
  kf: 24,
  dkf: 2,
  force_zonal: false,
  nu: 3e-26,
  nu_order: 8,
  mu_ls: 0,
  k_ls: 0,
  dt: 0.02,
  cfl: 0.8,
  seed: 1,
  init_energy: 0,
  scheme: 'ifrk4',
} as const satisfies Partial<ModelParams>;

export const DEMO_SCENARIOS: readonly DemoScenario[] = Object.freeze([
  {
    id: 'jets',
    name: 'Jets (default)',
    description:
      'Stochastic forcing at k_f = 24 on a β-plane: eddies merge into four or five eastward jets (red bands of u).',
    // Predicted U = 1, k_R = 4.5, k_β = 20, R_β = 4.5, spin-up 25 T. Measured (Node, 4 ms/step):
    // bands of u by t = 40 (3400 steps, zonal share 0.38), five jets at t = 60–80 (5500–7700
    // steps, share 0.50–0.57), four after a merger by t = 120; U_rms = 0.85, hyperviscosity takes
    // 28% of the energy. In Chromium here (the built page, 1400 × 1000, ~185 steps/s): t = 42 after
    // 20 s with bands of u already showing, t = 64 after 30 s, four to five clear jets by 60 s (t = 112).
    params: { ...COMMON, beta: 40 },
  },
  {
    id: 'few-jets',
    name: 'Few jets',
    description: 'Weaker β, the same forcing and drag: fewer, broader and more meandering jets.',
    // Predicted U = 1, k_R = 3.0, k_β = 12, R_β = 4.1, spin-up 25 T. Measured: nothing zonal
    // until t ≈ 60; four jets at t = 80 (7700 steps, zonal share 0.43), three at t = 120 (12 000
    // steps, share 0.58); U_rms = 0.84. About twice as long as the default to show jets.
    params: { ...COMMON, beta: 18 },
  },
  {
    id: 'many-jets',
    name: 'Many jets, zonostrophic',
    description: 'Strong β and a finer grid with small-scale forcing: many narrow jets, k_f ≫ k_β ≫ k_R.',
    // Predicted U = 1, k_R = 8, k_β = 32, R_β = 4.0, spin-up 8 T (k_f = 56 of k_max = 85, so the
    // forcing keeps clear of the hyperviscosity). Measured (Node, 256², ~20 ms/step): eight to ten
    // wavy eastward jets from t = 40 (8800 steps) on, zonal share 0.25–0.29, U_rms = 0.78, measured
    // R_β = 3.5; hyperviscosity takes ~40% of the energy. Several minutes in the browser.
    // ν follows the grid (scaledHyperviscosity): the default's damping rate at k_max, ν = 3.788e-31
    // on 256². The measurements above were made with a hand-tuned ν = 8.6e-31, which damped the grid
    // scale 2.3 times as fast; the forcing at k_f = 56 stays clear of the hyperviscosity with either.
    params: {
      ...COMMON,
      nx: 256,
      ny: 256,
      beta: 128,
      mu: 0.0625,
      eps: 0.0625,
      kf: 56,
      nu: scaledHyperviscosity(COMMON, { nx: 256, ny: 256 }),
      dt: 0.01,
    },
  },
  {
    id: 'deformation',
    name: 'Finite deformation radius',
    description:
      'The default jets with a deformation wavenumber k_d = 4 near k_R: the largest scales are screened and jets form more slowly.',
    // Measured: U_rms 0.79 (part of the energy is potential, ½k_d²ψ²); jets form about half as
    // fast as in the default: zonal share 0.19 at t = 80 (7000 steps), five jets and share 0.28 at
    // t = 120 (11 200 steps).
    params: { ...COMMON, beta: 40, kd: 4 },
  },
  {
    id: 'isotropic',
    name: 'No β (isotropic reference)',
    description: 'The default forcing and drag without β: the inverse cascade builds domain-size vortices and no jets.',
    // Measured: U_rms = 0.84 at t = 120 (12 400 steps), as in the default, but the energy gathers
    // in domain-size eddies whose orientation drifts (zonal share of u wanders 0.14–0.40); no jets.
    params: { ...COMMON, beta: 0 },
  },
  ...TWO_LAYER_SCENARIOS,
]);

/** The scenario the app opens on. */
export const DEFAULT_SCENARIO_ID = 'jets';

export function scenarioById(id: string): DemoScenario | undefined {
  return DEMO_SCENARIOS.find((s) => s.id === id);
}
