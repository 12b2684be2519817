/**
 * The length scales and regime of beta-plane turbulence, as formulas of the parameters and of the
 * measured rms velocity. Model (or any consistent) units: β in 1/(length·time), U in length/time,
 * ε in length²/time³ (energy per unit mass per time), μ in 1/time, ν in length^{2p}/time.
 * A length L sits on a wavenumber axis at k = 2π/L throughout Stria.
 */

/** Rhines wavenumber k_R = (β/2U)^½ (Rhines 1975; Sukoriansky, Dikovskaya & Galperin 2007). */
export function rhinesWavenumber(beta: number, U: number): number {
  return Math.sqrt(beta / (2 * U));
}

/** The Rhines-scale conventions in use; each is a convention, all related by exact factors. */
export type RhinesConvention = 'kR' | 'sqrtUbeta' | 'piOverKR' | 'twoPiSqrtUbeta';

export interface RhinesDefinition {
  id: RhinesConvention;
  /** How the literature writes it. */
  label: string;
  /** Its length for rms velocity U. */
  length(beta: number, U: number): number;
}

export const RHINES_DEFINITIONS: Readonly<Record<RhinesConvention, RhinesDefinition>> = Object.freeze({
  kR: {
    id: 'kR',
    label: 'k_R = (β/2U)^½, length 2π/k_R',
    length: (b: number, U: number) => (2 * Math.PI) / rhinesWavenumber(b, U),
  },
  sqrtUbeta: { id: 'sqrtUbeta', label: 'L_R = (U/β)^½', length: (b: number, U: number) => Math.sqrt(U / b) },
  piOverKR: {
    id: 'piOverKR',
    label: 'L_R = π(2U/β)^½ = π/k_R',
    length: (b: number, U: number) => Math.PI / rhinesWavenumber(b, U),
  },
  twoPiSqrtUbeta: {
    id: 'twoPiSqrtUbeta',
    label: 'L_R = 2π(U/β)^½',
    length: (b: number, U: number) => 2 * Math.PI * Math.sqrt(U / b),
  },
});

/** Rhines length in a chosen convention. */
export function rhinesLength(beta: number, U: number, convention: RhinesConvention = 'kR'): number {
  return RHINES_DEFINITIONS[convention].length(beta, U);
}

/** Transitional wavenumber k_β = (β³/ε)^{1/5} (Vallis & Maltrud 1993). */
export function transitionalWavenumber(beta: number, eps: number): number {
  return Math.pow((beta * beta * beta) / eps, 0.2);
}

/** The anisotropic arrest boundary k_β(θ) = k_β |cos θ|^{3/5}, θ the angle of k from the kx axis. */
export function anisotropicBoundary(kBeta: number, theta: number): number {
  return kBeta * Math.pow(Math.abs(Math.cos(theta)), 0.6);
}

/** Zonostrophy index R_β = k_β/k_R (Sukoriansky et al. 2007; Galperin et al. 2010). */
export function zonostrophyIndex(kBeta: number, kRhines: number): number {
  return kBeta / kRhines;
}

/**
 * R_β in the linear-drag steady state, where U = (ε/μ)^½: R_β = √2 (β²ε/μ⁵)^{1/20}, derived by
 * putting U into k_R (docs/scales.md).
 */
export function steadyZonostrophyIndex(beta: number, eps: number, mu: number): number {
  return Math.SQRT2 * Math.pow((beta * beta * eps) / Math.pow(mu, 5), 0.05);
}

/** rms velocity of the linear-drag energy balance, U = (ε/μ)^½ (E = ε/2μ = U²/2). */
export function balanceVelocity(eps: number, mu: number): number {
  return Math.sqrt(eps / mu);
}

/** Friction wavenumber k_fric = (μ³/ε)^½ (Smith et al. 2002), where drag arrests the inverse cascade. */
export function frictionWavenumber(mu: number, eps: number): number {
  return Math.sqrt((mu * mu * mu) / eps);
}

/**
 * Hyperviscous dissipation wavenumber of the enstrophy cascade: where the damping rate ν k^{2p}
 * equals the cascade's strain rate η^{1/3}, k_ν = (η^{1/3}/ν)^{1/(2p)}; for p = 1 this is
 * Kraichnan's (η^{1/3}/ν)^{1/2} (common practice).
 */
export function dissipationWavenumber(eta: number, nu: number, order: number): number {
  return Math.pow(Math.cbrt(eta) / nu, 1 / (2 * order));
}

export type Regime = 'friction-dominated' | 'transitional' | 'zonostrophic';

/**
 * Regime implied by R_β: below 1.5 friction-dominated, 1.5 to 2.5 zonostrophic (transitional), above
 * 2.5 fully developed zonostrophic (Sukoriansky et al. 2007; Galperin et al. 2010 [memory for the
 * thresholds]).
 */
export function regimeOf(R: number): Regime {
  if (!(R >= 1.5)) return 'friction-dominated';
  return R < 2.5 ? 'transitional' : 'zonostrophic';
}

export const REGIME_LABELS: Readonly<Record<Regime, string>> = Object.freeze({
  'friction-dominated': 'friction-dominated (R_β < 1.5): weak or no jets',
  transitional: 'zonostrophic, transitional (1.5 ≤ R_β < 2.5): jets with strong eddies',
  zonostrophic: 'fully developed zonostrophic (R_β ≥ 2.5): persistent jets; the PV staircase sharpens as R_β grows',
});

/**
 * The ideal PV staircase of step width L (Dritschel & McIntyre 2008): u_rms² = β²L⁴/720, so
 * L = 720^{1/4} (U_rms/β)^½ ≈ 5.1800 (U_rms/β)^½, peak u_max = βL²/12, peak-to-trough Δu = βL²/8.
 */
export function staircaseSpacing(beta: number, U: number): number {
  return Math.pow(720, 0.25) * Math.sqrt(U / beta);
}
