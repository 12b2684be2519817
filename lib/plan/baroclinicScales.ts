import { twoLayerCoefficients } from '../model/params';

/**
 * The scales of baroclinic (two-layer) turbulence the planner predicts from, in any consistent units.
 *
 * Criticality ξ = F₂(U₁ − U₂)/β = δk_d²(U₁ − U₂)/((1 + δ)β): the imposed shear over the critical shear
 * β/F₂ of the Phillips model (linearStability.ts criticalShear), the same number as the run summary's
 * `supercriticality`. For equal layers it is k_d²(U₁ − U₂)/(2β) = U/(βλ²) with U = (U₁ − U₂)/2 the
 * mean thermal wind and λ = 1/k_d the deformation radius: Held & Larichev's ξ [published: Held &
 * Larichev, J. Atmos. Sci. 53, 946 (1996), memory for their notation; the layer form derived].
 *
 * Held & Larichev's scalings for ξ ≫ 1, with order-one prefactors [published, same paper]:
 * eddy velocity V ≈ ξU, jet (energy-containing) wavenumber k_j λ ≈ 1/ξ, eddy diffusivity
 * D ≈ ξ²Uλ. Their own simulations show a stronger sensitivity to ξ than these [published, same paper].
 */
export function criticality(shear: number, depthRatio: number, beta: number, Ld: number): number {
  const { F2 } = twoLayerCoefficients({ kd: 1 / Ld, beta, shear, depth_ratio: depthRatio });
  return (F2 * shear) / beta;
}

/** Held & Larichev's U: the mean thermal wind, half the shear U₁ − U₂. */
export function thermalWind(shear: number): number {
  return shear / 2;
}

/** V ≈ ξU: the eddy velocity (length/time). */
export function heldLarichevVelocity(shear: number, depthRatio: number, beta: number, Ld: number): number {
  return criticality(shear, depthRatio, beta, Ld) * thermalWind(shear);
}

/** The jet spacing 2π/k_j with k_j λ ≈ 1/ξ: 2πλξ (length). */
export function heldLarichevJetSpacing(xi: number, Ld: number): number {
  return 2 * Math.PI * Ld * xi;
}

/** D ≈ ξ²Uλ: the eddy diffusivity (length²/time). */
export function heldLarichevDiffusivity(xi: number, shear: number, Ld: number): number {
  return xi * xi * thermalWind(shear) * Ld;
}
