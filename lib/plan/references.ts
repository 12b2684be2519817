/**
 * The outside sources of the planner's formulas, written as the project's check list gives them,
 * each with its mark: [published] (the source states it), [derived] (follows exactly from published
 * equations; derivation in docs/), [memory] (recalled, not confirmed against the text), [practice]
 * (a fact of the trade with no single source). Predictions and checks carry these strings so the app
 * can show them beside every number.
 */
export const REFERENCES = Object.freeze({
  tangentPlane:
    'f = 2Ω sin φ, β = 2Ω cos φ/R: the beta-plane of Pedlosky, Geophysical Fluid Dynamics, 2nd ed. (1987) and Vallis, Atmospheric and Oceanic Fluid Dynamics, 2nd ed. (2017) [published]; spherical planet, planetocentric latitude [practice]',
  deformationRadius: 'L_d = √(g′H)/|f|, the reduced-gravity deformation radius [practice]',
  energyBalance:
    'dE/dt = ε − 2μE with linear drag, so E = ε/2μ and U = (ε/μ)^½ in steady state [derived] (docs/scales.md)',
  rhines:
    'Rhines, J. Fluid Mech. 69, 417 (1975); Sukoriansky, Dikovskaya & Galperin, J. Atmos. Sci. 64, 3312 (2007) [published]',
  rhinesConventions:
    'Rhines, J. Fluid Mech. 69, 417 (1975) [published]; the length conventions in use, related by exact factors [memory for who uses which]',
  transitional: 'Vallis & Maltrud, J. Phys. Oceanogr. 23, 1346 (1993) [published; memory for pages]',
  zonostrophy:
    'Sukoriansky, Dikovskaya & Galperin, J. Atmos. Sci. 64, 3312 (2007) [published]; steady closed form R_β = √2 (β²ε/μ⁵)^{1/20} [derived] (docs/scales.md)',
  regime:
    'Sukoriansky et al., J. Atmos. Sci. 64, 3312 (2007); Galperin, Sukoriansky & Dikovskaya, Ocean Dynamics 60, 427 (2010) [published; memory for the thresholds]',
  friction: 'Smith et al., J. Fluid Mech. 469, 13 (2002) [published; memory for the exact form]',
  staircase:
    'Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008) [published]; the factor 720^{1/4} [derived] (docs/scales.md)',
  ringEnstrophy:
    'η = k_f² ε for a thin forcing ring; ring normalisation as in Srinivasan & Young, J. Atmos. Sci. 69, 1633 (2012) [memory]',
  dissipation:
    'Kraichnan, Phys. Fluids 10, 1417 (1967) for p = 1 [published]; the hyperviscous form k_ν = (η^{1/3}/ν)^{1/(2p)} [practice] (docs/scales.md)',
  turnover:
    'the inverse-cascade estimate u(k) ~ (ε/k)^{1/3} of Kraichnan, Phys. Fluids 10, 1417 (1967) [published], used as a time scale [practice]',
  spinUp:
    'the e-folding time 1/(2μ) of dE/dt = ε − 2μE [derived]; the multiple for statistical steady state [practice]',
  cfl: 'CFL number dt·(max|u|/dx + max|v|/dy) as the model defines it (lib/model/stepper.ts); the peak/rms ratio [practice]',
  dealiasing: 'the 2/3 rule of Galerkin-truncated spectral models [practice]',
  practice: '[practice]',
});

export type ReferenceKey = keyof typeof REFERENCES;
