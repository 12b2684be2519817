import { rhinesLength } from '../analysis/scales';
import type { ModelParams } from '../model/params';
import { SIZE_MAX, SIZE_MIN } from '../model/params';
import { keptRadius } from '../model/validateParams';
import { annulusModeCount, MEASURED_STEP, runCost, type MeasuredStep, type RunCost } from './cost';
import { fmt } from './format';
import type { PlanInput } from './planInput';
import { evaluateMatched, roundMatched } from './matchedRounding';
import { predictPlan, type PlanPredictions } from './predictions';
import type { ResolvedPlan } from './resolvePlan';
import { THRESHOLDS as T } from './thresholds';
import { planRatios, type RatioId, type RatioSet } from './ratios';

/**
 * A cheap run that keeps the planned run's dimensionless ratios, in model units (length unit so that
 * Lx = 2π, time unit so that U = 1), on a grid that runs here within a target wall time.
 *
 * On an nx × ny grid with the planned aspect, the key ratios are tied by one integer constraint:
 * (jets per domain)·(k_f/k_R)·(k_max/k_f) = k_max·√2·Ly/γ, with L_jet = γ(U/β)^½ (γ from the Rhines
 * convention). A smaller grid than the planned one cannot keep all three. R_β depends on β, ε, μ
 * alone and is always kept. The others give in this order, each down to a floor:
 *   1. k_f/k_R (the inertial range between forcing and jets) — down to the scale-separation threshold;
 *   2. jets per domain — down to the minimum for measuring a spacing;
 *   3. k_max/k_f (the forcing's resolution) — down to what still fits the annulus inside k_max.
 * The floors are the planner's own check thresholds (THRESHOLDS), so a matched run passes the
 * scale-separation, jet-count and forcing checks whenever the planned run does; a grid that cannot
 * hold all three floors is refused. The secondary ratios k_d/k_R, τ/τ_f (grid damping over forcing
 * turnover), δk/k_f and Ly/Lx are kept, except that a too-thin annulus is widened to hold grid
 * modes. The run length is, by default, two times to statistical steady state (spin-up, then as long
 * again to average), or the planned μT if shorter; `runLength: 'planned'` keeps the planned μT.
 */
export interface MatchedRatio {
  id: RatioId;
  label: string;
  planned: number;
  matched: number;
  kept: boolean;
  /** Why it changed (empty when kept). */
  why: string;
}

export interface MatchedRun {
  /** The matched run as a model-unit plan (so every prediction and check applies to it). */
  input: PlanInput;
  plan: ResolvedPlan;
  predictions: PlanPredictions;
  /**
   * The matched run's model parameters, accepted by validateParams, rounded to `digits` significant
   * figures (matchedRounding.ts): the numbers the panel, the link and the files show.
   */
  params: ModelParams;
  /** Significant figures of the parameters and the run length (17: not rounded). */
  digits: number;
  ratios: MatchedRatio[];
  /** The ratio that gave last in the priority order ('none' when all are kept). */
  gives: 'none' | 'kfOverKR' | 'jetsPerDomain' | 'kmaxOverKf';
  cost: RunCost;
  targetWallSeconds: number;
  withinTarget: boolean;
  notes: string[];
}

export interface MatchedRunOptions {
  /** Wall time the matched run should fit (s); default 600, ten minutes. */
  targetWallSeconds?: number;
  /** Machine speed relative to the one that measured the step time (2 = twice as fast). */
  speed?: number;
  reference?: MeasuredStep;
  /** 'steady' (default): reach steady state and average as long again; 'planned': the planned μT. */
  runLength?: 'steady' | 'planned';
}

/** Default wall-time target of a matched run (s): ten minutes on this machine. */
export const DEFAULT_TARGET_SECONDS = 600;

/** Tolerance for calling a ratio kept: the round-off of the few operations between plan and match. */
const KEPT_TOL = 1e-9;
/** Floors sit this far above their thresholds, so round-off cannot put a matched run below one. */
const FLOOR_MARGIN = 1 + 1e-9;

/**
 * The matched cheap run of a plan: the largest grid (not above the planned one, nor the model's
 * 1024) whose predicted wall time is within the target; the smallest workable grid, flagged, when
 * none is. Throws RangeError when no grid from 32 up can hold the run.
 */
export function matchedRun(
  plan: ResolvedPlan,
  pred: PlanPredictions = predictPlan(plan),
  opts: MatchedRunOptions = {},
): MatchedRun {
  const target = opts.targetWallSeconds ?? DEFAULT_TARGET_SECONDS;
  const speed = opts.speed ?? 1;
  const ref = opts.reference ?? MEASURED_STEP;
  const want = planRatios(plan, pred);
  const candidates: MatchedRun[] = [];
  const refusals: string[] = [];
  for (let ny = Math.min(plan.ny, SIZE_MAX); ny >= SIZE_MIN; ny /= 2) {
    const nx = (ny * plan.nx) / plan.ny;
    if (nx < SIZE_MIN || nx > SIZE_MAX) continue;
    const built = buildMatched(plan, want, nx, ny, target, speed, ref, opts.runLength ?? 'steady');
    if (typeof built === 'string') refusals.push(`${nx} × ${ny}: ${built}`);
    else {
      candidates.push(built);
      if (built.withinTarget) return built;
    }
  }
  const smallest = candidates[candidates.length - 1];
  if (!smallest)
    throw new RangeError(
      `no grid can hold a matched run of this plan (${refusals.join('; ') || 'the planned aspect needs sizes outside 32..1024'})`,
    );
  smallest.notes.push(
    `no workable grid fits the target of ${fmt(target)} s; the smallest workable one takes ${fmt(smallest.cost.wallSeconds)} s: shorten the run length or raise the target`,
  );
  return smallest;
}

/** The matched run on nx × ny, or the reason it cannot be made there. */
function buildMatched(
  plan: ResolvedPlan,
  want: RatioSet,
  nx: number,
  ny: number,
  target: number,
  speed: number,
  ref: MeasuredStep,
  length: 'steady' | 'planned',
): MatchedRun | string {
  const conv = plan.input.rhines;
  const gamma = rhinesLength(1, 1, conv); // L_jet = γ (U/β)^½
  const Lx = 2 * Math.PI;
  const Ly = Lx * want.aspect;
  const kMax = keptRadius({ nx, ny, Lx, Ly });
  const available = (kMax * Math.SQRT2 * Ly) / gamma; // = jets · (k_f/k_R) · (k_max/k_f)
  const needed = want.jetsPerDomain * want.kfOverKR * want.kmaxOverKf;
  let J = want.jetsPerDomain;
  let b = want.kmaxOverKf;
  let gives: MatchedRun['gives'] = 'none';
  const notes: string[] = [];
  const why: Partial<Record<RatioId, string>> = {};
  const grid = `${nx} × ${ny}`;
  if (Math.abs(available / needed - 1) > KEPT_TOL) {
    const f = floors(want, gamma, plan.order);
    const limits = `${grid} holds jets·(k_f/k_R)·(k_max/k_f) = ${fmt(available)}, the plan needs ${fmt(needed)}`;
    let a = available / (J * b);
    gives = 'kfOverKR';
    why.kfOverKR = `gives first: ${limits}; shortening the inertial range keeps the regime, the jet count and the forcing resolution`;
    if (a < f.a) {
      a = f.a;
      J = available / (a * b);
      gives = 'jetsPerDomain';
      why.kfOverKR = `held at its floor ${fmt(f.a)} (the scale-separation threshold L_jet/λ_f = ${T.minJetToForcing}): ${limits}`;
      why.jetsPerDomain = `gives second, once k_f/k_R is at its floor: ${limits}`;
      if (J < f.J) {
        J = f.J;
        b = available / (a * J);
        gives = 'kmaxOverKf';
        why.jetsPerDomain = `held at its floor ${fmt(f.J)} (the fewest jets that give a spacing): ${limits}`;
        why.kmaxOverKf = `gives last, with k_f/k_R and the jet count at their floors: ${limits}`;
        if (b < f.b)
          return `too small: even with k_f/k_R and the jet count at their floors, k_max/k_f would be ${fmt(b)}, below its floor ${fmt(f.b)}`;
      }
    }
    if (a < want.RBeta && want.kfOverKR >= want.RBeta)
      notes.push(
        `k_f/k_R = ${fmt(a)} is below R_β = ${fmt(want.RBeta)}: the forcing now lies below k_β, inside the anisotropic range`,
      );
  }
  // Model units: U = 1, L_jet = Ly/J, so k_R = γJ/(√2 Ly), β = 2k_R², and R_β fixes ε = β³/k_β⁵ = μ.
  const kR = (gamma * J) / (Math.SQRT2 * Ly);
  const beta = 2 * kR * kR;
  const eps = Math.pow(beta, 3) / Math.pow(want.RBeta * kR, 5);
  const mu = eps;
  const kf = kMax / b;
  const dkMesh = Math.max((2 * Math.PI) / Lx, (2 * Math.PI) / Ly) / 2;
  let halfWidth = want.annulusHalfWidth;
  if (halfWidth * kf < dkMesh) {
    halfWidth = dkMesh / kf;
    why.annulusHalfWidth = `widened to half a grid wavenumber, the least that surely holds modes on ${grid}`;
  }
  if (!(halfWidth < 1) || kf * (1 + halfWidth) > kMax * (1 + KEPT_TOL))
    return `the forcing annulus does not fit below k_max = ${fmt(kMax)}`;
  const tauF = Math.pow(eps * kf * kf, -1 / 3);
  const input: PlanInput = {
    units: 'model',
    title: `matched run of ${plan.input.title ?? 'the plan'}`.slice(0, 200), // the title's length limit
    rotation: { kind: 'beta', beta },
    deformation: want.kdOverKR > 0 ? { kind: 'radius', Ld: 1 / (want.kdOverKR * kR) } : { kind: 'none' },
    drive: { kind: 'injection', eps },
    dragTime: 1 / mu,
    forcing: { wavelength: (2 * Math.PI) / kf, halfWidth },
    domain: { Lx, Ly },
    grid: { kind: 'points', nx, ny },
    hyperviscosity: { order: plan.order, gridDampingTime: want.gridDampingOverTurnover * tauF },
    runLength: runDragTimes(want, length) / mu,
    cfl: plan.cfl,
    rhines: conv,
  };
  const exact = evaluateMatched(input);
  if (typeof exact === 'string') return exact;
  const form = roundMatched(exact);
  const { plan: mPlan, predictions: mPred, params } = form;
  // A ratio is kept when it moved no more than the rounding of the parameters can move it.
  const keptTol = form.digits >= 17 ? KEPT_TOL : Math.max(KEPT_TOL, 4 * 0.5 * Math.pow(10, 1 - form.digits));
  const got = planRatios(mPlan, mPred);
  const ratios = (Object.keys(RATIO_LABELS) as RatioId[]).map((id) => {
    const kept = Math.abs(got[id] / want[id] - 1) <= keptTol || got[id] === want[id];
    if (id === 'runDragTimes' && !kept)
      why.runDragTimes = `shortened to two times to statistical steady state (${T.steadyMultiple} drag times): spin-up, then as long again to average; long statistics are the planned run's job`;
    return {
      id,
      label: RATIO_LABELS[id],
      planned: want[id],
      matched: got[id],
      kept,
      why: kept ? '' : (why[id] ?? 'follows from the ratios above'),
    };
  });
  const cost = runCost(nx, ny, mPred.stepsPlanned.value, annulusModeCount(params), speed, ref);
  return {
    input: form.input,
    plan: mPlan,
    predictions: mPred,
    params,
    digits: form.digits,
    ratios,
    gives,
    cost,
    targetWallSeconds: target,
    withinTarget: cost.wallSeconds <= target,
    notes,
  };
}

/**
 * The floors of the three key ratios, each the value at which the planned run's own checks would
 * start to complain (or the planned value, when the plan is already below it):
 *   k_f/k_R ≥ minJetToForcing · k_jet/k_R, with k_jet/k_R = 2π√2/γ;
 *   jets ≥ minJets, counted by the wider of the convention's and the staircase spacing;
 *   k_max/k_f ≥ the largest of minForcingToDissipation · k_max/k_ν, (h·maxForcingDamping)^{−1/(2p)} and
 *   1 + δk/k_f, where h = τ/τ_f and k_max/k_ν = h^{−1/(2p)} (both fixed by the kept τ/τ_f).
 */
function floors(want: RatioSet, gamma: number, order: number): { a: number; J: number; b: number } {
  const h = want.gridDampingOverTurnover;
  const stairOverConv = Math.pow(720, 0.25) / gamma;
  const b = Math.max(
    T.minForcingToDissipation * Math.pow(h, -1 / (2 * order)),
    Math.pow(h * T.maxForcingDamping, -1 / (2 * order)),
    1 + want.annulusHalfWidth,
  );
  return {
    a: Math.min(want.kfOverKR, FLOOR_MARGIN * ((T.minJetToForcing * 2 * Math.PI * Math.SQRT2) / gamma)),
    J: Math.min(want.jetsPerDomain, FLOOR_MARGIN * T.minJets * Math.max(1, stairOverConv)),
    b: Math.min(want.kmaxOverKf, FLOOR_MARGIN * b),
  };
}

/** Run length of the matched run in drag times μT. */
function runDragTimes(want: RatioSet, length: 'steady' | 'planned'): number {
  // Two times to steady state, 2·steadyMultiple/(2μ), is steadyMultiple drag times.
  return length === 'planned' ? want.runDragTimes : Math.min(want.runDragTimes, T.steadyMultiple);
}

export const RATIO_LABELS: Readonly<Record<RatioId, string>> = Object.freeze({
  RBeta: 'zonostrophy index R_β',
  jetsPerDomain: 'jets per domain Ly/L_jet',
  kfOverKR: 'forcing over Rhines wavenumber k_f/k_R',
  kmaxOverKf: 'grid over forcing wavenumber k_max/k_f',
  kdOverKR: 'deformation over Rhines wavenumber k_d/k_R',
  gridDampingOverTurnover: 'grid damping time over forcing turnover τ/τ_f',
  annulusHalfWidth: 'annulus half-width δk/k_f',
  runDragTimes: 'run length in drag times μT',
  aspect: 'domain aspect Ly/Lx',
});
