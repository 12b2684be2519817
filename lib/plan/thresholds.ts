import { DEFAULT_PARAMS } from '../model/params';

/**
 * The numbers the planner's checks and assumptions rest on, each with the reason for its value.
 * They are judgements of practice unless marked otherwise; docs/plan.md repeats them in prose.
 */
export const THRESHOLDS = Object.freeze({
  /**
   * Jets needed to measure a spacing: with fewer than three, the mean distance between neighbours is
   * one or two numbers and has no spread to judge it by [practice].
   */
  minJets: 3,
  /**
   * Jet spacing over forcing wavelength (= k_f/k_jet): two octaves of inverse cascade between the
   * forcing and the arrest, so the jets are made by the cascade and not imprinted by the forcing [practice].
   */
  minJetToForcing: 4,
  /**
   * Forcing wavelength over dissipation wavelength (= k_ν/k_f): an octave of enstrophy cascade, so the
   * forced modes are not themselves the dissipation range [practice].
   */
  minForcingToDissipation: 2,
  /**
   * Hyperviscous damping rate of the forced modes, ν k_f^{2p}, as a fraction of their turnover rate
   * 1/τ_f: above a tenth, a visible part of the injected energy is dissipated where it is injected
   * instead of cascading [practice]. Above 1, most of it is.
   */
  maxForcingDamping: 0.1,
  maxForcingDampingError: 1,
  /** R_β below which the flow is friction-dominated (Sukoriansky et al. 2007; Galperin et al. 2010 [memory for the thresholds]). */
  frictionDominated: 1.5,
  /** R_β of fully developed zonostrophic flow, the target of the drag fix (same sources). */
  zonostrophic: 2.5,
  /**
   * Spin-up times 1/(2μ) to statistical steady state: from rest E(t) = E_s(1 − e^{−2μt}) [derived], so
   * after 5 the energy is within e^{−5} ≈ 0.7 % of E_s; jets may take longer to settle [practice].
   */
  steadyMultiple: 5,
  /**
   * Peak speed over rms speed for the CFL estimate. A Gaussian velocity component of variance U²/2
   * reaches about 4 standard deviations somewhere on a large grid, ≈ 2.8 U; the ideal staircase jet
   * peaks at √5 U [derived from the staircase profile]. 3 covers both [practice].
   */
  peakToRms: 3,
  /** CFL number when the plan gives none: the model's own default (DEFAULT_PARAMS.cfl). */
  defaultCfl: DEFAULT_PARAMS.cfl,
});

export type Thresholds = typeof THRESHOLDS;
