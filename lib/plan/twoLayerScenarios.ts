import type { ModelParams } from '../model/params';
import type { DemoScenario } from './demoScenarios';

/**
 * Two demonstration scenarios of the two-layer model (docs/two-layer.md): an ocean-like and an
 * atmosphere-like baroclinic case. Each is a real setting scaled to model units, with most of its
 * numbers made up: the marks below say which constants are real [real] and which are chosen
 * [made up]. They are for showing how baroclinic eddies build jets, not models of any ocean or sky.
 *
 * Scaling: length unit L (the domain is 2πL), time unit T = L/ΔU with ΔU the shear, so the shear is 1
 * in model units; then k_d = L/L_d, β_model = β L²/ΔU and μ_model = μ T. Numbers a person would type:
 * rounded to 4 significant figures.
 *
 * Real constants: β = 2Ω cos φ/a at φ = 45° with Ω = 7.2921e-5 s⁻¹ and a = 6.371e6 m (Earth's
 * rotation rate and mean radius [real; published: IERS Conventions 2010 for Ω, the IUGG mean radius]),
 * 1.619e-11 m⁻¹ s⁻¹. The ocean's first baroclinic deformation radius at mid-latitudes, about 30 km
 * [real; published: Chelton et al. 1998, J. Phys. Oceanogr. 28, 433, their map; memory for the value].
 *
 * Seed: with no forcing and a state at rest nothing would grow, so each starts from a tiny random
 * field (init_energy = 1e-6 on the annulus k_f ± δk, which lies inside the unstable band K < k_d):
 * the instability grows it e-fold per ~1/(2σ) and the eddies are full-grown by t ≈ 12 (measured,
 * Node, seed 1). The forcing is off (eps = 0): all the eddies' energy comes from the imposed shear.
 */
const OMEGA = 7.2921e-5;
const EARTH_RADIUS = 6.371e6;
const COS_45 = Math.SQRT1_2;
/** β at 45° latitude (m⁻¹ s⁻¹) [real, see above]. */
export const BETA_45 = (2 * OMEGA * COS_45) / EARTH_RADIUS;

const typed = (x: number) => Number(x.toPrecision(4));

/** A real setting in SI units and what the scenario takes of it in model units. */
export interface TwoLayerSetting {
  /** Length unit L (m): the domain is 2πL square. */
  lengthUnit: number;
  /** Deformation radius L_d (m). */
  deformationRadius: number;
  /** Shear U₁ − U₂ (m/s). */
  shear: number;
  /** Lower-layer drag time 1/μ (s). */
  dragTime: number;
  /** Depth ratio H₁/H₂. */
  depthRatio: number;
}

/** Model-unit parameters of a setting: shear 1, k_d = L/L_d, β L²/ΔU, μ T. */
export function scaledTwoLayer(s: TwoLayerSetting): Pick<ModelParams, 'kd' | 'beta' | 'mu' | 'shear' | 'depth_ratio'> {
  const T = s.lengthUnit / s.shear;
  return {
    kd: typed(s.lengthUnit / s.deformationRadius),
    beta: typed((BETA_45 * s.lengthUnit * s.lengthUnit) / s.shear),
    mu: typed(T / s.dragTime),
    shear: 1,
    depth_ratio: s.depthRatio,
  };
}

const DAY = 86400;

/**
 * Ocean-like: L_d = 30 km [real]; a thin upper layer, H₁/H₂ = 1/4 (1 km over 4 km) [made up, ocean-like];
 * a domain of 2π·300 km ≈ 1900 km so that k_d = 10 [made up]; shear 0.108 m/s [made up: it puts the
 * criticality ξ = ΔU/ΔU_c at 1.5, with ΔU_c = β(1 + δ)/(δ k_d²) in model units, docs/two-layer.md
 * section 4]; bottom-drag time 32 days [made up, of the order oceanographers use]. T = 32 days.
 */
export const OCEAN_SETTING: TwoLayerSetting = {
  lengthUnit: 300e3,
  deformationRadius: 30e3,
  shear: 0.108,
  dragTime: 300e3 / 0.108,
  depthRatio: 0.25,
};

/**
 * Atmosphere-like: the domain is a latitude circle at 45°, 2π a cos 45° ≈ 28 300 km [real geometry];
 * L_d = 700 km [made up, of the order of the real ~1000 km]; equal layers [made up, the usual
 * two-level choice]; shear 30 m/s between the layers [made up, of the order of the mid-latitude
 * thermal wind]; drag time 4 days [made up]. Criticality ξ ≈ 1.9. T = L/ΔU ≈ 1.74 days.
 */
export const ATMOSPHERE_SETTING: TwoLayerSetting = {
  lengthUnit: EARTH_RADIUS * COS_45,
  deformationRadius: 700e3,
  shear: 30,
  dragTime: 4 * DAY,
  depthRatio: 1,
};

/** What both share: unforced, seeded by a tiny random field in the unstable band. */
const SEEDED = {
  Lx: 2 * Math.PI,
  Ly: 2 * Math.PI,
  nx: 128,
  ny: 128,
  layers: 2,
  forcing: 'none',
  eps: 0,
  force_zonal: false,
  nu: 3e-26,
  nu_order: 8,
  mu_ls: 0,
  k_ls: 0,
  dt: 0.02,
  cfl: 0.8,
  seed: 1,
  init_energy: 1e-6,
  scheme: 'ifrk4',
} as const satisfies Partial<ModelParams>;

export const TWO_LAYER_SCENARIOS: readonly DemoScenario[] = [
  {
    id: 'ocean-two-layer',
    name: 'Two layers, ocean-like',
    description:
      'Baroclinic eddies from an imposed shear over a thin upper layer (L_d = 30 km, β at 45°): eddies, then wavy jets.',
    // Measured (Node, 128², seed 1): eddies grown by t = 12 (~950 steps); then E ≈ 2.3, G ≈ C ≈ T
    // ≈ 0.7 (generation, conversion and barotropic transfer all > 0), ū of the barotropic flow
    // ±0.8, dt ≈ 0.002 (the upper layer's speeds set it): about 2000 steps per unit of time. The jet
    // detector finds one significant jet of the barotropic flow in the mean over t = 20–30 (a window
    // of 10 T, longer than the default flow memory 1/(μh₂) = 1.25, which is too short to tell).
    params: { ...SEEDED, ...scaledTwoLayer(OCEAN_SETTING), kf: 6, dkf: 2 },
  },
  {
    id: 'atmosphere-two-layer',
    name: 'Two layers, atmosphere-like',
    description:
      'Equal layers on a 45° latitude circle with a 30 m/s shear (β at 45°): storm-like eddies and strong barotropic jets.',
    // Measured (Node, 128², seed 1): eddies grown by t = 12 (~1400 steps); then E ≈ 6, KE_bt ≈ 4,
    // G ≈ C ≈ T ≈ 1 and barotropic ū of ±3–4, several times the shear. In Chromium (the built page,
    // 1400 × 1000): t = 16 after 20–50 s, and two significant jets 3.1 ± 0.5 apart in the mean over
    // the flow memory 1/(μh₂) = 4.6 by t ≈ 17.6.
    params: { ...SEEDED, ...scaledTwoLayer(ATMOSPHERE_SETTING), kf: 4, dkf: 1.5 },
  },
];
