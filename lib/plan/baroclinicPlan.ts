import { DEFAULT_PARAMS, SIZE_MAX, SIZE_MIN, type ModelParams } from '../model/params';
import { keptRadius, validateParams } from '../model/validateParams';
import {
  criticality,
  heldLarichevDiffusivity,
  heldLarichevJetSpacing,
  heldLarichevVelocity,
  thermalWind,
} from './baroclinicScales';
import type { PlanCheck } from './checks';
import { MEASURED_STEP, runCost, type MeasuredStep, type RunCost } from './cost';
import { fmt, withUnit } from './format';
import { criticalShear, mostUnstable } from './linearStability';
import { cflStep, type Prediction } from './predictions';
import { REFERENCES } from './references';
import type { ResolvedPlan } from './resolvePlan';
import { THRESHOLDS as T } from './thresholds';

/**
 * The planner's baroclinic drive (planInput.ts drive.kind = 'baroclinic'): a two-layer run whose
 * eddies draw their energy from an imposed vertical shear U₁ − U₂ (docs/two-layer.md), with the
 * lower layer's drag μ = 1/dragTime. What it adds to a plan: the criticality and its regime, the
 * fastest-growing mode of the linear problem (linearStability.ts), Held & Larichev's scalings
 * (baroclinicScales.ts), the checks that the grid resolves L_d, that the domain holds several jets and
 * that the run is long enough, the cost of the two-layer step, and a matched cheap run.
 */
export type BaroclinicCheckId = 'supercritical' | 'resolvesDeformation' | 'baroclinicJets' | 'baroclinicRunLength';
export type BaroclinicCheck = PlanCheck & { id: BaroclinicCheckId };

export interface BaroclinicMatched {
  /** The matched run's model parameters (two layers, no stirring), accepted by validateParams. */
  params: ModelParams;
  /** Held & Larichev's predictions for it, under the run summary's keys (`matchedHeadline`). */
  predicted: BaroclinicHeadline;
  runLength: number;
  cost: RunCost;
  withinTarget: boolean;
  /** What is kept, with the planned and matched values, and what gave. */
  kept: { label: string; planned: number; matched: number; kept: boolean }[];
  notes: string[];
}

export interface BaroclinicAnalysis {
  shear: number;
  depthRatio: number;
  predictions: Prediction[];
  checks: BaroclinicCheck[];
  /** The planned run with the two-layer step. */
  cost: RunCost;
  matched: BaroclinicMatched | null;
  matchedError: string | null;
}

/** Grid points per deformation radius L_d/dx below which the eddies' scale is under-resolved [practice]. */
export const MIN_POINTS_PER_LD = 2;
/**
 * e-foldings of the fastest mode before the eddies leave the initial noise: e^10 ≈ 2·10⁴ in amplitude
 * from a small random start [practice].
 */
export const GROWTH_EFOLDINGS = 10;

const HL =
  'Held & Larichev, J. Atmos. Sci. 53, 946 (1996) [published; memory for the notation]: order-one prefactors, for ξ ≫ 1; their simulations show a stronger sensitivity to ξ than this [published, same paper]';
const XI_REF =
  'ξ = U/(βλ²) of Held & Larichev (1996) for equal layers [published]; the layer form F₂(U₁ − U₂)/β and its critical value 1 from the Phillips model, Pedlosky 1987 §7.11 [derived] (docs/two-layer.md)';
const LINEAR_REF =
  'the eigenvalues of the 2 × 2 linear problem (lib/plan/linearStability.ts; Pedlosky 1987 §7.11, Vallis 2017) [derived]';

interface Core {
  xi: number;
  Ld: number;
  kMode: number;
  growth: number;
  V: number;
  Ljet: number;
  D: number;
  peak: number;
  dt: number;
  needed: number;
}

function core(plan: ResolvedPlan, shear: number, depthRatio: number): Core {
  const Ld = plan.Ld;
  const xi = criticality(shear, depthRatio, plan.beta, Ld);
  const mode = mostUnstable({ kd: 1 / Ld, depthRatio, beta: plan.beta, shear, mu: plan.mu });
  const V = heldLarichevVelocity(shear, depthRatio, plan.beta, Ld);
  // The fastest flow on the grid: the eddies' peak on top of the faster imposed layer flow.
  const h2 = 1 / (1 + depthRatio);
  const peak = T.peakToRms * V + Math.max(h2, 1 - h2) * shear;
  const dt = cflStep(plan.cfl, peak, plan.dx, plan.dy);
  const needed = (mode.growth > 0 ? GROWTH_EFOLDINGS / mode.growth : 0) + T.steadyMultiple / (2 * plan.mu);
  return {
    xi,
    Ld,
    kMode: mode.k,
    growth: mode.growth,
    V,
    Ljet: heldLarichevJetSpacing(xi, Ld),
    D: heldLarichevDiffusivity(xi, shear, Ld),
    peak,
    dt,
    needed,
  };
}

/** The baroclinic part of a plan, or null when its drive is not baroclinic. */
export function analyseBaroclinic(
  plan: ResolvedPlan,
  opts: { targetWallSeconds?: number; speed?: number; reference?: MeasuredStep } = {},
): BaroclinicAnalysis | null {
  const drive = plan.input.drive;
  if (drive.kind !== 'baroclinic') return null;
  const shear = drive.shear;
  const depthRatio = drive.depthRatio ?? 1;
  const c = core(plan, shear, depthRatio);
  const pr = (
    id: string,
    label: string,
    symbol: string,
    value: number,
    quantity: Prediction['quantity'],
    formula: string,
    reference: string,
    text?: string,
  ): Prediction => ({ id, label, symbol, value, quantity, formula, reference, ...(text ? { text } : {}) });
  const regime = c.xi <= 1 ? 'stable' : c.xi < 2 ? 'weakly supercritical' : 'supercritical';
  const predictions = [
    pr('xi', 'criticality', 'ξ', c.xi, 'ratio', 'ξ = F₂(U₁ − U₂)/β = δk_d²(U₁ − U₂)/((1 + δ)β)', XI_REF),
    pr(
      'baroclinicRegime',
      'baroclinic regime',
      'regime',
      c.xi,
      'ratio',
      'ξ ≤ 1 stable (no eddies grow); 1 < ξ < 2 weakly supercritical (eddies near L_d, weak jets); ξ ≥ 2 supercritical',
      `${XI_REF}; the bound 2 [practice]`,
      regime,
    ),
    pr(
      'criticalShear',
      'critical shear',
      '(U₁ − U₂)_c',
      criticalShear(1 / c.Ld, depthRatio, plan.beta),
      'velocity',
      '(U₁ − U₂)_c = β/F₂ = β(1 + δ)/(δk_d²)',
      'Phillips, Tellus 6, 273 (1954); Pedlosky 1987 §7.11 [published] for equal layers; unequal layers [derived]',
    ),
    pr(
      'unstableWavelength',
      'most unstable wavelength (l = 0, with the drag)',
      'λ_bc',
      (2 * Math.PI) / c.kMode,
      'length',
      'λ_bc = 2π/k, k maximising the growth rate of the linear problem',
      LINEAR_REF,
    ),
    pr('growthRate', 'largest growth rate', 'σ_max', c.growth, 'rate', 'σ_max = max_k Re λ(k, 0)', LINEAR_REF),
    pr('eddyVelocity', 'eddy velocity (Held & Larichev)', 'V', c.V, 'velocity', 'V ≈ ξU, U = (U₁ − U₂)/2', HL),
    pr('jetSpacing', 'jet spacing (Held & Larichev)', 'L_j', c.Ljet, 'length', 'k_j λ ≈ 1/ξ, L_j = 2πλξ', HL),
    pr('jets', 'jets in the domain (Held & Larichev)', 'Ly/L_j', plan.Ly / c.Ljet, 'count', 'Ly / L_j', HL),
    pr('eddyDiffusivity', 'eddy diffusivity (Held & Larichev; length²/time)', 'D', c.D, 'ratio', 'D ≈ ξ²Uλ', HL),
    pr(
      'neededLength',
      'run length needed',
      'T_need',
      c.needed,
      'time',
      `T_need = ${GROWTH_EFOLDINGS}/σ_max + ${T.steadyMultiple}/(2μ)`,
      `${REFERENCES.spinUp}; ${GROWTH_EFOLDINGS} e-foldings of growth [practice]`,
    ),
    pr(
      'dtBaroclinic',
      `time step at CFL ${plan.cfl}`,
      'dt',
      c.dt,
      'time',
      `dt = C/(u_peak/dx + u_peak/dy), u_peak = ${T.peakToRms}V + max(|U₁|, |U₂|)`,
      REFERENCES.cfl,
    ),
  ];
  const checks = baroclinicChecks(plan, c);
  const steps = Math.ceil(plan.runLength / c.dt);
  const speed = opts.speed ?? 1;
  const ref = opts.reference ?? MEASURED_STEP;
  const cost = runCost(plan.nx, plan.ny, steps, 0, speed, ref, 2);
  let matched: BaroclinicMatched | null = null;
  let matchedError: string | null = null;
  try {
    matched = matchedBaroclinic(plan, shear, depthRatio, c, opts.targetWallSeconds ?? 600, speed, ref);
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    matchedError = e.message;
  }
  return { shear, depthRatio, predictions, checks, cost, matched, matchedError };
}

function baroclinicChecks(plan: ResolvedPlan, c: Core): BaroclinicCheck[] {
  const u = plan.units;
  const num = (label: string, value: number, quantity: Prediction['quantity'] = 'ratio') => ({
    label,
    value,
    quantity,
  });
  const perLd = c.Ld / Math.max(plan.dx, plan.dy);
  const jets = plan.Ly / c.Ljet;
  const out: BaroclinicCheck[] = [];
  out.push({
    id: 'supercritical',
    title: 'baroclinic instability',
    severity: c.xi > 1 ? 'ok' : 'error',
    message:
      c.xi > 1
        ? `ξ = ${fmt(c.xi)} > 1: the shear is supercritical, eddies grow at up to ${withUnit(c.growth, 'rate', u)}`
        : `ξ = ${fmt(c.xi)} ≤ 1: no mode grows, the run stays at rest`,
    numbers: [num('ξ', c.xi)],
    threshold: 'ξ > 1',
    fix:
      c.xi > 1
        ? null
        : `raise the shear U₁ − U₂ above the critical shear β/F₂ = ${withUnit(criticalShear(1 / c.Ld, plan.input.drive.kind === 'baroclinic' ? (plan.input.drive.depthRatio ?? 1) : 1, plan.beta), 'velocity', u, 'up')}`,
    reference: XI_REF,
  });
  out.push({
    id: 'resolvesDeformation',
    title: 'grid resolves the deformation radius',
    severity: perLd >= MIN_POINTS_PER_LD ? 'ok' : perLd >= 1 ? 'warning' : 'error',
    message: `L_d/dx = ${fmt(perLd)} grid points per deformation radius (k_max/k_d = ${fmt(plan.kMax * c.Ld)}); the most unstable wavelength spans ${fmt((2 * Math.PI) / c.kMode / Math.max(plan.dx, plan.dy))} points`,
    numbers: [num('L_d/dx', perLd), num('k_max/k_d', plan.kMax * c.Ld)],
    threshold: `L_d/dx ≥ ${MIN_POINTS_PER_LD} (warning from 1, error below)`,
    fix:
      perLd >= MIN_POINTS_PER_LD
        ? null
        : `refine the grid to at most ${withUnit(c.Ld / MIN_POINTS_PER_LD, 'length', u, 'down')} spacing`,
    reference: REFERENCES.practice,
  });
  out.push({
    id: 'baroclinicJets',
    title: 'jets in the domain',
    severity: jets >= T.minJets ? 'ok' : jets > 1 ? 'warning' : 'error',
    message: `Ly/L_j = ${fmt(jets)} jets of Held & Larichev's spacing L_j = 2πλξ = ${withUnit(c.Ljet, 'length', u)}`,
    numbers: [num('Ly/L_j', jets, 'count')],
    threshold: `at least ${T.minJets} jets to measure a spacing`,
    fix: jets >= T.minJets ? null : `enlarge Ly to at least ${withUnit(T.minJets * c.Ljet, 'length', u, 'up')}`,
    reference: HL,
  });
  out.push({
    id: 'baroclinicRunLength',
    title: 'run length',
    severity: plan.runLength >= c.needed ? 'ok' : plan.runLength >= c.needed / 2 ? 'warning' : 'error',
    message: `the run is ${fmt(plan.runLength / c.needed)} × the time needed to grow out of the noise and reach a steady state (${withUnit(c.needed, 'time', u)})`,
    numbers: [num('T / T_need', plan.runLength / c.needed)],
    threshold: `T ≥ ${GROWTH_EFOLDINGS}/σ_max + ${T.steadyMultiple}/(2μ)`,
    fix: plan.runLength >= c.needed ? null : `run at least ${withUnit(c.needed, 'time', u, 'up')}`,
    reference: `${REFERENCES.spinUp}; ${GROWTH_EFOLDINGS} e-foldings [practice]`,
  });
  return out;
}

/**
 * The matched cheap run, in model units (Lx = 2π, U = (U₁ − U₂)/2 = 1): it keeps ξ (so the regime and
 * Held & Larichev's V/U, k_jλ, D/(Uλ)), L_d/dy (the resolution of the eddies), the depth ratio, the
 * drag in eddy units μλ/U and the hyperviscous damping at the grid scale in the same units, and the
 * domain's aspect. With L_d/dy kept, the jets per domain are ny·dy/L_j ∝ ny: a smaller grid holds
 * fewer jets, so the jet count is what gives, down to the fewer of the planned count and the
 * fewest that give a spacing. The largest such grid within the wall-time target is taken. The run
 * length keeps the planned length in units of λ/U, at most the time needed (the run-length check's).
 */
function matchedBaroclinic(
  plan: ResolvedPlan,
  shear: number,
  depthRatio: number,
  c: Core,
  target: number,
  speed: number,
  ref: MeasuredStep,
): BaroclinicMatched {
  const U = thermalWind(shear);
  const eddyTime = c.Ld / U; // λ/U, the unit of time the matched run keeps ratios in
  const perLd = c.Ld / plan.dy;
  const jets = plan.Ly / c.Ljet;
  const floor = Math.min(jets, T.minJets);
  const aspect = plan.Ly / plan.Lx;
  let best: BaroclinicMatched | null = null;
  for (let ny = Math.min(plan.ny, SIZE_MAX); ny >= SIZE_MIN; ny /= 2) {
    const nx = (ny * plan.nx) / plan.ny;
    if (nx < SIZE_MIN || nx > SIZE_MAX || !Number.isInteger(nx)) continue;
    const J = (jets * ny) / plan.ny;
    if (J < floor * (1 - 1e-9)) break;
    const Lx = 2 * Math.PI;
    const Ly = Lx * aspect;
    const Ld = perLd * (Ly / ny);
    const shearM = 2; // U = 1
    const kd = 1 / Ld;
    const F2 = (depthRatio * kd * kd) / (1 + depthRatio);
    const beta = (F2 * shearM) / c.xi;
    const mu = plan.mu * eddyTime * (1 / Ld);
    const kMax = keptRadius({ nx, ny, Lx, Ly });
    const gridRate = plan.nu * Math.pow(plan.kMax, 2 * plan.order) * eddyTime; // in units of U/λ
    const nu = gridRate / Ld / Math.pow(kMax, 2 * plan.order);
    const mPlan = { ...plan, Ld, beta, mu, dx: Lx / nx, dy: Ly / ny, nx, ny, Lx, Ly, kMax, nu };
    const mc = core(mPlan, shearM, depthRatio);
    const runLength = Math.min(plan.runLength / eddyTime, c.needed / eddyTime) * Ld;
    const params = validateParams({
      ...DEFAULT_PARAMS,
      layers: 2,
      shear: shearM,
      depth_ratio: depthRatio,
      kd,
      beta,
      mu,
      nu,
      nu_order: plan.order,
      mu_ls: 0,
      k_ls: 0,
      forcing: 'none',
      // The small random start lies on the annulus k_f ± δk (model.ts): around the fastest-growing mode.
      kf: mc.kMode,
      dkf: Math.max(0.5 * mc.kMode, 1),
      Lx,
      Ly,
      nx,
      ny,
      dt: mc.dt,
      cfl: plan.cfl,
      init_energy: 1e-6,
    });
    const steps = Math.ceil(runLength / mc.dt);
    const cost = runCost(nx, ny, steps, 0, speed, ref, 2);
    const kept = [
      { label: 'criticality ξ', planned: c.xi, matched: mc.xi },
      { label: 'grid points per deformation radius L_d/dy', planned: perLd, matched: Ld / (Ly / ny) },
      { label: 'jets per domain Ly/L_j', planned: jets, matched: Ly / mc.Ljet },
      { label: 'drag in eddy units μλ/U', planned: plan.mu * eddyTime, matched: (mu * Ld) / 1 },
      { label: 'depth ratio δ', planned: depthRatio, matched: depthRatio },
    ].map((k) => ({ ...k, kept: Math.abs(k.matched / k.planned - 1) <= 1e-9 }));
    const notes: string[] = [];
    if (!kept[2].kept)
      notes.push(
        `jets per domain give: with L_d/dy kept, ${nx} × ${ny} holds ${fmt(Ly / mc.Ljet)} of the planned ${fmt(jets)}`,
      );
    if (runLength < (plan.runLength / eddyTime) * Ld)
      notes.push('run length shortened to the time needed to grow and reach a steady state');
    best = {
      params,
      predicted: matchedHeadline(params),
      runLength,
      cost,
      withinTarget: cost.wallSeconds <= target,
      kept,
      notes,
    };
    if (best.withinTarget) return best;
  }
  if (!best)
    throw new RangeError(
      `no grid from ${SIZE_MIN} up keeps L_d/dy = ${fmt(perLd)} with ${fmt(floor)} jets in the domain`,
    );
  best.notes.push(
    `no grid fits the target of ${fmt(target)} s while keeping ${fmt(floor)} jets; the smallest takes ${fmt(best.cost.wallSeconds)} s`,
  );
  return best;
}

/** Held & Larichev's predictions under the run summary's keys (summary.ts), in the run's model units. */
export interface BaroclinicHeadline {
  supercriticality: number;
  eddy_velocity: number;
  eddy_diffusivity: number;
  heat_flux: number;
  jet_spacing: number;
  jet_count: number;
}

/**
 * What Held & Larichev's scalings predict for a two-layer run's summary: ξ, V ≈ ξU, D ≈ ξ²Uλ (the
 * summary's D = ⟨v₁′τ′⟩/(U₁ − U₂), so the heat flux is D·(U₁ − U₂)), jet spacing 2πλξ and the jets in
 * Ly, with U = (U₁ − U₂)/2 and λ = 1/k_d. Order-one prefactors (baroclinicScales.ts).
 */
export function matchedHeadline(
  p: Pick<ModelParams, 'shear' | 'depth_ratio' | 'beta' | 'kd' | 'Ly'>,
): BaroclinicHeadline {
  const Ld = 1 / p.kd;
  const xi = criticality(p.shear, p.depth_ratio, p.beta, Ld);
  const D = heldLarichevDiffusivity(xi, p.shear, Ld);
  const Lj = heldLarichevJetSpacing(xi, Ld);
  return {
    supercriticality: xi,
    eddy_velocity: heldLarichevVelocity(p.shear, p.depth_ratio, p.beta, Ld),
    eddy_diffusivity: D,
    heat_flux: D * p.shear,
    jet_spacing: Lj,
    jet_count: p.Ly / Lj,
  };
}
