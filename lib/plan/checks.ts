import type { BaroclinicCheckId } from './baroclinicPlan';
import { REFERENCES } from './references';
import { fmt, withUnit } from './format';
import { gridReaching, growthText } from './gridGrowth';
import { predictPlan, type PlanPredictions, type Quantity } from './predictions';
import type { ResolvedPlan } from './resolvePlan';
import { THRESHOLDS as T } from './thresholds';

export type Severity = 'error' | 'warning' | 'ok';
export type CheckId =
  | 'scaleSeparation'
  | 'jetCount'
  | 'forcingNearGrid'
  | 'frictionDominated'
  | 'runLength'
  | 'arrestInDomain'
  | 'forcingAnnulus'
  | 'deformation'
  | BaroclinicCheckId;

/** A number behind a check, with what it measures so the app can give its unit. */
export interface CheckNumber {
  label: string;
  value: number;
  quantity: Quantity;
}

/** One check of a plan: what was tested, the verdict, the numbers, the threshold, and a fix. */
export interface PlanCheck {
  id: CheckId;
  title: string;
  severity: Severity;
  message: string;
  numbers: CheckNumber[];
  /** The threshold(s) in words. */
  threshold: string;
  /** A concrete change that would pass the check; null when it passes. */
  fix: string | null;
  reference: string;
}

const worst = (s: Severity[]): Severity => (s.includes('error') ? 'error' : s.includes('warning') ? 'warning' : 'ok');
const num = (label: string, value: number, quantity: Quantity = 'ratio'): CheckNumber => ({ label, value, quantity });

/** Every check of the plan, in a fixed order. Predictions are computed when not given. */
export function checkPlan(plan: ResolvedPlan, pred: PlanPredictions = predictPlan(plan)): PlanCheck[] {
  return [
    scaleSeparation,
    jetCount,
    forcingNearGrid,
    frictionDominated,
    runLength,
    arrestInDomain,
    forcingAnnulus,
    deformation,
  ].map((c) => c(plan, pred));
}

type Check = (plan: ResolvedPlan, p: PlanPredictions) => PlanCheck;

/** domain ≫ jet spacing ≫ forcing wavelength ≫ dissipation wavelength ≥ grid scale. */
export const scaleSeparation: Check = (plan, p) => {
  const u = plan.units;
  const Ljet = p.jetSpacingRhines.value;
  const kNu = p.kNu.value;
  const domainJet = plan.Ly / Ljet;
  const jetForcing = (Ljet * plan.kf) / (2 * Math.PI);
  const forcingDiss = kNu / plan.kf;
  const gridDiss = plan.kMax / kNu;
  const sev: Severity[] = [
    domainJet > 1 ? 'ok' : 'error',
    jetForcing >= T.minJetToForcing ? 'ok' : jetForcing > 1 ? 'warning' : 'error',
    forcingDiss >= T.minForcingToDissipation ? 'ok' : forcingDiss > 1 ? 'warning' : 'error',
    gridDiss >= 1 ? 'ok' : 'warning',
  ];
  const fixes: string[] = [];
  if (sev[0] !== 'ok')
    fixes.push(`enlarge Ly to at least ${withUnit(T.minJets * Ljet, 'length', u, 'up')} (see the jet count)`);
  if (sev[1] !== 'ok') {
    const kfNew = (2 * Math.PI * T.minJetToForcing) / Ljet;
    fixes.push(
      `shorten the forcing wavelength to at most ${withUnit(Ljet / T.minJetToForcing, 'length', u, 'down')} and ${growthText(gridReaching(plan.nx, plan.ny, plan.Lx, plan.Ly, (kfNew * plan.kMax) / plan.kf))} to keep k_max/k_f`,
    );
  }
  if (sev[2] !== 'ok') {
    const kNeed = T.minForcingToDissipation * plan.kf;
    const eta13 = Math.cbrt(p.eta.value);
    // k_ν = k_max (η^{1/3} τ)^{1/(2p)}: the τ that puts k_ν at kNeed, when the grid reaches it.
    if (kNeed <= plan.kMax)
      fixes.push(
        `lengthen the grid-scale damping time to at least ${withUnit(Math.pow(kNeed / plan.kMax, 2 * plan.order) / eta13, 'time', u, 'up')} (k_ν = ${fmt(T.minForcingToDissipation)} k_f)`,
      );
    else
      fixes.push(
        `${growthText(gridReaching(plan.nx, plan.ny, plan.Lx, plan.Ly, kNeed))} so that k_ν can lie ${fmt(T.minForcingToDissipation)} × above k_f`,
      );
  }
  if (sev[3] !== 'ok')
    fixes.push(
      `shorten the grid-scale damping time to at most η^{−1/3} = ${withUnit(1 / Math.cbrt(p.eta.value), 'time', u, 'down')} so the dissipation range is resolved`,
    );
  const severity = worst(sev);
  return {
    id: 'scaleSeparation',
    title: 'scale separation',
    severity,
    message:
      `domain/jet spacing ${fmt(domainJet)}, jet spacing/forcing wavelength ${fmt(jetForcing)}, ` +
      `forcing/dissipation wavelength ${fmt(forcingDiss)}, dissipation/grid wavelength ${fmt(gridDiss)}` +
      (severity === 'ok'
        ? ': the scales are in order and separated'
        : ': ' +
          [
            'domain ≤ jet spacing',
            'jets too close to the forcing scale',
            'forcing too close to the dissipation scale',
            'dissipation scale below the grid: enstrophy piles up at k_max',
          ]
            .filter((_, i) => sev[i] !== 'ok')
            .join('; ')),
    numbers: [
      num('Ly / L_jet', domainJet),
      num('L_jet / λ_f = k_f/k_jet', jetForcing),
      num('λ_f / λ_ν = k_ν/k_f', forcingDiss),
      num('λ_ν / Δ = k_max/k_ν', gridDiss),
    ],
    threshold: `Ly/L_jet > 1; L_jet/λ_f ≥ ${T.minJetToForcing} (error ≤ 1); k_ν/k_f ≥ ${T.minForcingToDissipation} (error ≤ 1); k_max/k_ν ≥ 1`,
    fix: fixes.length ? fixes.join('; ') : null,
    reference: REFERENCES.practice,
  };
};

/** At least THRESHOLDS.minJets jets in Ly by either spacing estimate. */
export const jetCount: Check = (plan, p) => {
  const n = Math.min(p.jetsRhines.value, p.jetsStaircase.value);
  const Lmax = Math.max(p.jetSpacingRhines.value, p.jetSpacingStaircase.value);
  const severity: Severity = n >= T.minJets ? 'ok' : n >= 1 ? 'warning' : 'error';
  const LyNew = T.minJets * Lmax;
  const nyNew = growthOfLength(plan.ny, plan.Ly, LyNew);
  return {
    id: 'jetCount',
    title: 'jets to measure a spacing',
    severity,
    message:
      severity === 'ok'
        ? `${fmt(n)} jets or more fit in Ly`
        : `only ${fmt(n)} jets fit in Ly by the wider spacing estimate: a spacing cannot be measured from fewer than ${T.minJets}`,
    numbers: [
      num('jets (Rhines spacing)', p.jetsRhines.value, 'count'),
      num('jets (staircase spacing)', p.jetsStaircase.value, 'count'),
    ],
    threshold: `at least ${T.minJets} jets (error below 1)`,
    fix:
      severity === 'ok'
        ? null
        : `enlarge Ly to at least ${withUnit(LyNew, 'length', plan.units, 'up')} with ny = ${nyNew} to keep dy (or lower U: the spacing scales as (U/β)^½)`,
    reference: REFERENCES.practice,
  };
};

/** Hyperviscous damping of the forced modes against their turnover: ν k_f^{2p} τ_f. */
export const forcingNearGrid: Check = (plan, p) => {
  const tauF = p.turnoverForcing.value;
  const frac = plan.nu * Math.pow(plan.kf, 2 * plan.order) * tauF;
  const severity: Severity =
    frac <= T.maxForcingDamping ? 'ok' : frac <= T.maxForcingDampingError ? 'warning' : 'error';
  // ν k_f^{2p} τ_f = (k_f/k_max)^{2p} τ_f/τ: the k_max or τ that bring it to the threshold.
  const kNeed = plan.kf * Math.pow(tauF / (plan.gridDampingTime * T.maxForcingDamping), 1 / (2 * plan.order));
  const tauNeed = (tauF / T.maxForcingDamping) * Math.pow(plan.kf / plan.kMax, 2 * plan.order);
  return {
    id: 'forcingNearGrid',
    title: 'forcing clear of the hyperviscous range',
    severity,
    message:
      `hyperviscosity (order ${plan.order}) damps the forced modes at ${fmt(frac)} of their turnover rate` +
      (severity === 'ok' ? '' : ': part of the injected energy is dissipated where it is injected'),
    numbers: [num('ν k_f^{2p} τ_f', frac), num('k_max / k_f', plan.kMax / plan.kf), num('τ_f', tauF, 'time')],
    threshold: `ν k_f^{2p} τ_f ≤ ${T.maxForcingDamping} (error above ${T.maxForcingDampingError})`,
    fix:
      severity === 'ok'
        ? null
        : `${growthText(gridReaching(plan.nx, plan.ny, plan.Lx, plan.Ly, kNeed))}, or lengthen the grid-scale damping time to at least ${withUnit(tauNeed, 'time', plan.units, 'up')}`,
    reference: REFERENCES.practice,
  };
};

/** R_β below the friction-dominated threshold. */
export const frictionDominated: Check = (plan, p) => {
  const R = p.R_beta.value;
  const severity: Severity = R >= T.frictionDominated ? 'ok' : 'warning';
  const target = T.zonostrophic;
  const u = plan.units;
  let fix: string | null = null;
  if (severity !== 'ok') {
    if (plan.input.drive.kind === 'velocity') {
      // ε = μU² at fixed U: R_β = √2 (β²U²/μ⁴)^{1/20}.
      const muNew = Math.sqrt(plan.beta * plan.U) * Math.pow(Math.SQRT2 / target, 5);
      const Unew = (Math.pow(target / Math.SQRT2, 10) * plan.mu * plan.mu) / plan.beta;
      fix = `lengthen the drag time 1/μ to ${withUnit(1 / muNew, 'time', u, 'up')} (lower μ to ${withUnit(muNew, 'rate', u, 'down')}; R_β = ${target}), or raise the target U to ${withUnit(Unew, 'velocity', u, 'up')}`;
    } else {
      // R_β = √2 (β²ε/μ⁵)^{1/20} at fixed ε, or at fixed μ.
      const muNew = Math.pow((plan.beta * plan.beta * plan.eps) / Math.pow(target / Math.SQRT2, 20), 0.2);
      const epsNew = (Math.pow(target / Math.SQRT2, 20) * Math.pow(plan.mu, 5)) / (plan.beta * plan.beta);
      fix = `lengthen the drag time 1/μ to ${withUnit(1 / muNew, 'time', u, 'up')} (lower μ to ${withUnit(muNew, 'rate', u, 'down')}; R_β = ${target}), or raise ε to ${fmt(epsNew, 4, 'up')}`;
    }
  }
  return {
    id: 'frictionDominated',
    title: 'zonostrophic regime',
    severity,
    message:
      severity === 'ok'
        ? `R_β = ${fmt(R)}: ${p.regime.text}`
        : `R_β = ${fmt(R)} < ${T.frictionDominated}: friction-dominated, expect weak or no jets`,
    numbers: [num('R_β', R), num('k_β', p.kBeta.value, 'wavenumber'), num('k_R', p.kR.value, 'wavenumber')],
    threshold: `R_β ≥ ${T.frictionDominated}; the fix aims at R_β = ${target} (fully developed)`,
    fix,
    reference: REFERENCES.regime,
  };
};

/** The run reaches statistical steady state. */
export const runLength: Check = (plan, p) => {
  const tss = p.steadyTime.value;
  const severity: Severity = plan.runLength >= tss ? 'ok' : 'warning';
  return {
    id: 'runLength',
    title: 'run long enough for steady state',
    severity,
    message:
      `the run lasts ${fmt(plan.runLength / p.spinUpTime.value)} spin-up times 1/(2μ)` +
      (severity === 'ok' ? '' : `, short of the ${T.steadyMultiple} needed for statistical steady state`),
    numbers: [
      num('run length', plan.runLength, 'time'),
      num('t_ss', tss, 'time'),
      num('spin-up time 1/(2μ)', p.spinUpTime.value, 'time'),
    ],
    threshold: `run length ≥ ${T.steadyMultiple}/(2μ)`,
    fix:
      severity === 'ok'
        ? null
        : `run for at least ${withUnit(tss, 'time', plan.units, 'up')} (${p.stepsToSteady.value} steps), plus the averaging window, or shorten the drag time`,
    reference: REFERENCES.spinUp,
  };
};

/** The anisotropic arrest (k_R, k_β) lies inside the domain: above k_dom = 2π/Ly. */
export const arrestInDomain: Check = (plan, p) => {
  const kDom = (2 * Math.PI) / plan.Ly;
  const kR = p.kR.value;
  const kB = p.kBeta.value;
  const severity: Severity = kR <= kDom ? 'error' : kB <= kDom ? 'warning' : 'ok';
  const LyNew = T.minJets * ((2 * Math.PI) / Math.min(kR, kB));
  return {
    id: 'arrestInDomain',
    title: 'arrest inside the domain',
    severity,
    message:
      severity === 'ok'
        ? 'k_R and k_β lie above the domain wavenumber 2π/Ly'
        : severity === 'error'
          ? 'k_R lies at or below the domain wavenumber: the cascade reaches the domain scale before β arrests it, and energy condenses there'
          : 'k_β lies at or below the domain wavenumber: β cannot make the cascade anisotropic inside the domain',
    numbers: [num('k_R / k_dom', kR / kDom), num('k_β / k_dom', kB / kDom)],
    threshold: 'k_R > 2π/Ly (error otherwise); k_β > 2π/Ly (warning otherwise)',
    fix:
      severity === 'ok'
        ? null
        : `enlarge Ly to at least ${withUnit(LyNew, 'length', plan.units, 'up')} (ny = ${growthOfLength(plan.ny, plan.Ly, LyNew)} to keep dy), or lower U`,
    reference: REFERENCES.rhines,
  };
};

/** The forcing annulus within the kept (dealiased) wavenumbers. */
export const forcingAnnulus: Check = (plan) => {
  const top = plan.kf + plan.dkf;
  const bottom = plan.kf - plan.dkf;
  const kMin = Math.min((2 * Math.PI) / plan.Lx, (2 * Math.PI) / plan.Ly);
  const above = top > plan.kMax;
  const below = bottom < kMin;
  const u = plan.units;
  const fixes: string[] = [];
  if (above)
    fixes.push(
      `${growthText(gridReaching(plan.nx, plan.ny, plan.Lx, plan.Ly, top))}, or lengthen the forcing wavelength to at least ${withUnit((2 * Math.PI * (1 + plan.input.forcing.halfWidth)) / plan.kMax, 'length', u, 'up')}`,
    );
  if (below)
    fixes.push(
      `shorten the forcing wavelength to at most ${withUnit((2 * Math.PI * (1 - plan.input.forcing.halfWidth)) / kMin, 'length', u, 'down')} or narrow the annulus`,
    );
  return {
    id: 'forcingAnnulus',
    title: 'forcing annulus within the dealiased range',
    severity: above || below ? 'error' : 'ok',
    message: above
      ? 'the annulus reaches beyond k_max, the largest kept wavenumber (2/3 rule)'
      : below
        ? 'the annulus reaches below the smallest wavenumber of the domain'
        : 'the annulus lies within the kept wavenumbers',
    numbers: [
      num('k_f − δk', bottom, 'wavenumber'),
      num('k_f + δk', top, 'wavenumber'),
      num('k_min', kMin, 'wavenumber'),
      num('k_max', plan.kMax, 'wavenumber'),
    ],
    threshold: 'k_min ≤ k_f − δk and k_f + δk ≤ k_max',
    fix: fixes.length ? fixes.join('; ') : null,
    reference: REFERENCES.dealiasing,
  };
};

/** The barotropic predictions assume k_d ≪ k_R. */
export const deformation: Check = (plan, p) => {
  const ratio = plan.kd / p.kR.value;
  const severity: Severity = ratio < 1 ? 'ok' : 'warning';
  return {
    id: 'deformation',
    title: 'deformation radius and the barotropic predictions',
    severity,
    message:
      severity === 'ok'
        ? `k_d/k_R = ${fmt(ratio)}: the deformation radius is longer than the Rhines length 1/k_R`
        : `k_d/k_R = ${fmt(ratio)}: the Rhines, staircase and drag-balance predictions assume k_d ≪ k_R and are rough here (drag acts on vorticity, so part of the energy is potential)`,
    numbers: [num('k_d / k_R', ratio), num('L_d', plan.Ld, 'length')],
    threshold: 'k_d < k_R',
    fix:
      severity === 'ok'
        ? null
        : `lengthen L_d beyond 1/k_R = ${withUnit(1 / p.kR.value, 'length', plan.units, 'up')} to use the barotropic predictions, or measure the spacing in the matched run`,
    reference: REFERENCES.practice,
  };
};

/** Points needed along a direction when the length grows from L to Lnew at the same spacing (power of two). */
function growthOfLength(n: number, L: number, Lnew: number): number {
  let m = n;
  while (m * (L / n) < Lnew * (1 - 1e-12)) m *= 2;
  return m;
}
