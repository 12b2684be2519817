/**
 * Energy and enstrophy budgets of one step, model units. One layer: energy E = ½⟨|∇ψ|² + k_d²ψ²⟩ = ½Σ|q̂|²/K²,
 * kinetic energy KE = ½⟨|∇ψ|²⟩, potential enstrophy Z = ½⟨q²⟩ (domain means; sums over the full
 * plane). Rates are instantaneous, at the state the step starts from:
 *   dE/dt = injection − drag − hyper − largeScale + transfer,
 * with transfer = the net nonlinear term Σ Re(q̂* (−Ĵ))/K², which the dealiased Jacobian makes zero
 * to round-off. So `transfer` is the budget's residual: it closes to round-off at every step.
 * Injection is the ensemble-mean rate for white-noise forcing (ε, exact for additive noise), the
 * instantaneous rate ⟨−ψ F⟩ for steady forcing. `realized*` are what the step actually did.
 *
 * Two layers (docs/two-layer.md), h_i = H_i/H: E = ½Σ_i h_i⟨|∇ψ_i|²⟩ + ½F₁h₁⟨(ψ₁ − ψ₂)²⟩ (kinetic energy
 * of each layer and the available potential energy of the interface), Z = ½Σ_i h_i⟨q_i²⟩; the drag
 * acts on the lower layer (energy loss 2μ·KE₂), the imposed shear adds `generation`, and `layers`
 * carries the split of the energy and the heat flux.
 */
export interface QuadraticBudget {
  /** Value at the start of the step. */
  value: number;
  injection: number;
  drag: number;
  hyper: number;
  largeScale: number;
  /** Net nonlinear transfer: zero to round-off (the residual of the rate budget). */
  transfer: number;
  /** injection − drag − hyper − largeScale + transfer. */
  tendency: number;
  /** Change over the step divided by dt (includes the random kick of this step). */
  realizedTendency: number;
  /** What this step's random kick added, divided by dt (0 unless the forcing is stochastic). */
  realizedInjection: number;
  /**
   * Two layers only (absent in one): the rate at which the imposed shear feeds the eddies, through
   * the mean PV gradients. Energy: F₁(H₁/H)(U₁ − U₂)⟨v τ⟩, the eddy interface (heat) flux times the
   * shear; enstrophy: k_d² times that. Then tendency = injection + generation − drag − hyper −
   * largeScale + transfer.
   */
  generation?: number;
}

/** The two-layer parts of a step report (model units, at the start of the step). */
export interface TwoLayerTerms {
  /** Kinetic energy of the upper and of the lower layer, ½(H_i/H)⟨|∇ψ_i|²⟩; their sum is `kinetic`. */
  kineticUpper: number;
  kineticLower: number;
  /** Available potential energy of the interface, ½F₁(H₁/H)⟨(ψ₁ − ψ₂)²⟩; E = kinetic + potential. */
  potential: number;
  /** Eddy interface (heat) flux ⟨v τ⟩, τ = ψ₁ − ψ₂, v of either layer (the two give the same mean). */
  heatFlux: number;
  /**
   * The energy cycle (docs/two-layer.md, "The energy cycle"), rates at the start of the step. The
   * kinetic energy split into the barotropic mode ½⟨|∇ψ_bt|²⟩ and the baroclinic ½h₁h₂⟨|∇τ|²⟩
   * (their sum is `kinetic`); `potential` is the eddy APE. Then, exactly,
   *   dAPE/dt   = generation − conversion − hyperPotential − largeScalePotential,
   *   dKE_bc/dt = conversion − barotropicTransfer − dragBaroclinic − hyperBaroclinic − largeScaleBaroclinic + transfer,
   *   dKE_bt/dt = barotropicTransfer − dragBarotropic − hyperBarotropic − largeScaleBarotropic + injection,
   * with `generation`, `transfer` (zero to round-off) and `injection` those of the energy budget, and
   * the drag, hyper and large-scale parts summing to the energy budget's terms.
   */
  kineticBarotropic: number;
  kineticBaroclinic: number;
  /** Eddy APE → eddy kinetic energy, by the vertical motion (all terms that move τ through the inversion). */
  conversion: number;
  /** Baroclinic → barotropic kinetic energy (by the imposed shear and by the eddies). */
  barotropicTransfer: number;
  dragBarotropic: number;
  dragBaroclinic: number;
  hyperPotential: number;
  hyperBaroclinic: number;
  hyperBarotropic: number;
  largeScalePotential: number;
  largeScaleBaroclinic: number;
  largeScaleBarotropic: number;
}

/** Two-layer terms, all zero (the stepper's report holds one, overwritten every step). */
export function emptyTwoLayerTerms(): TwoLayerTerms {
  return {
    kineticUpper: 0,
    kineticLower: 0,
    potential: 0,
    heatFlux: 0,
    kineticBarotropic: 0,
    kineticBaroclinic: 0,
    conversion: 0,
    barotropicTransfer: 0,
    dragBarotropic: 0,
    dragBaroclinic: 0,
    hyperPotential: 0,
    hyperBaroclinic: 0,
    hyperBarotropic: 0,
    largeScalePotential: 0,
    largeScaleBaroclinic: 0,
    largeScaleBarotropic: 0,
  };
}

export interface StepReport {
  /** Model time and step count after the step; dt used; CFL number at the start of the step. */
  time: number;
  steps: number;
  dt: number;
  cfl: number;
  maxU: number;
  maxV: number;
  /** Kinetic energy at the start of the step. */
  kinetic: number;
  energy: QuadraticBudget;
  enstrophy: QuadraticBudget;
  /** Two layers only (absent in one). */
  layers?: TwoLayerTerms;
}

export function emptyBudget(): QuadraticBudget {
  return {
    value: 0,
    injection: 0,
    drag: 0,
    hyper: 0,
    largeScale: 0,
    transfer: 0,
    tendency: 0,
    realizedTendency: 0,
    realizedInjection: 0,
  };
}

export function emptyReport(): StepReport {
  return {
    time: 0,
    steps: 0,
    dt: 0,
    cfl: 0,
    maxU: 0,
    maxV: 0,
    kinetic: 0,
    energy: emptyBudget(),
    enstrophy: emptyBudget(),
  };
}

/** A plain copy, safe to keep or send (reports are reused and overwritten step after step). */
export function copyReport(r: StepReport): StepReport {
  const copy: StepReport = { ...r, energy: { ...r.energy }, enstrophy: { ...r.enstrophy } };
  if (r.layers) copy.layers = { ...r.layers };
  return copy;
}

/**
 * Close a step's report (both steppers): its time and step count, and the realized rates: the kick of
 * the stochastic forcing over dt, and the change of energy and enstrophy over dt with the kick added
 * (so the tendency is the deterministic step's).
 */
export function closeReport(
  r: StepReport,
  time: number,
  steps: number,
  energy: number,
  enstrophy: number,
  kick: Float64Array,
  dt: number,
): void {
  r.time = time;
  r.steps = steps;
  r.energy.realizedInjection = kick[0] / dt;
  r.enstrophy.realizedInjection = kick[1] / dt;
  r.energy.realizedTendency = (energy + kick[0] - r.energy.value) / dt;
  r.enstrophy.realizedTendency = (enstrophy + kick[1] - r.enstrophy.value) / dt;
}
