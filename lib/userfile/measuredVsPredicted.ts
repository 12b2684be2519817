import type { UserAnalysis } from './summary';
import { rhinesLabel } from '../plan/rhinesLabels';
import { regimeOf, staircaseSpacing } from '../analysis/scales';
import type { PlanInput, UnitSystem } from '../plan/planInput';
import { predictPlan, type PlanPredictions, type PredictionId, type Quantity } from '../plan/predictions';
import { REFERENCES } from '../plan/references';
import { judge, type Verdict, type VerdictKey } from '../plan/verdict';
import { resolvePlan } from '../plan/resolvePlan';
import { fileUnitLabels, type UnitLabels } from './unitLabels';

/**
 * A user's measured values beside what Stria's planner predicts for the same parameters: the
 * planner's own predictPlan, on a plan made of the user's β, ε, μ (and k_d) and the file's domain.
 * predictPlan needs a complete plan; what a file cannot tell (forcing wavelength, hyperviscosity,
 * run length) is filled with neutral values, and no prediction that depends on them is shown: only
 * U, k_R, the Rhines length, R_β and the regime, the jet spacings and jet counts, which depend on
 * β, ε, μ and Ly alone. Without ε and μ there are no planner predictions; the rows that follow from
 * the measured U_rms (the staircase relation) are given whenever β is.
 */
export interface ComparisonRow {
  id: string;
  label: string;
  quantity: Quantity;
  measured: number | null;
  predicted: number | null;
  /** measured / predicted. */
  ratio: number | null;
  /** The verdict of the row (lib/plan/verdict.ts) where the planner predicts it, and why. */
  verdict?: Verdict;
  verdictNote?: string;
  /** The regime's name, for the regime row. */
  measuredText?: string;
  predictedText?: string;
  formula: string;
  reference: string;
}

export interface Comparison {
  units: UnitSystem;
  /** The unit of each kind of quantity as the rows hold it (the file's own: unitLabels.ts). */
  labels: UnitLabels;
  rows: ComparisonRow[];
  /** Why there are no planner predictions, when there are none. */
  missing: string | null;
}

export interface ComparisonParams {
  beta?: number;
  eps?: number;
  mu?: number;
  kd?: number;
}

export function measuredVsPredicted(
  a: UserAnalysis,
  p: ComparisonParams,
  labels: UnitLabels = fileUnitLabels(a.grid.lengthUnit, null),
): Comparison {
  const units: UnitSystem = a.grid.lengthUnit === 'm' ? 'physical' : 'model';
  const rows: ComparisonRow[] = [];
  const ratio = (m: number | null, q: number | null) => (m !== null && q !== null && q !== 0 ? m / q : null);
  const put = (
    id: string,
    label: string,
    quantity: Quantity,
    measured: number | null,
    predicted: number | null,
    formula: string,
    reference: string,
  ) => rows.push({ id, label, quantity, measured, predicted, ratio: ratio(measured, predicted), formula, reference });
  const lengths = a.grid.lengthUnit !== 'degrees';
  const Ly = a.grid.periodicY ? a.grid.ny * a.grid.dy : (a.grid.ny - 1) * a.grid.dy;
  const U = a.uRms?.value ?? null;
  const spacing = a.jets?.meanSpacing ?? null;
  const absent = [p.beta === undefined ? 'β' : '', p.eps === undefined ? 'ε' : '', p.mu === undefined ? 'μ' : '']
    .filter(Boolean)
    .join(', ');
  const missing = !lengths
    ? 'the grid is in degrees (give a planet to map it onto the tangent plane)'
    : absent
      ? `give ${absent}`
      : '';
  const pred =
    lengths && !missing
      ? planPredictions(a, p as Required<Omit<ComparisonParams, 'kd'>> & { kd?: number }, units, Ly)
      : null;
  const P = (id: PredictionId) => (pred ? pred[id].value : null);
  const F = (id: PredictionId, fallback: string) => (pred ? pred[id].formula : fallback);
  const R = (id: PredictionId, fallback: string) => (pred ? pred[id].reference : fallback);
  const conv = a.scales.rhinesConvention;

  put('U', 'rms velocity U', 'velocity', U, P('U'), F('U', 'U = (ε/μ)^½'), R('U', REFERENCES.energyBalance));
  put(
    'kR',
    'Rhines wavenumber k_R',
    'wavenumber',
    a.scales.kRhines,
    P('kR'),
    F('kR', 'k_R = (β/2U)^½'),
    R('kR', REFERENCES.rhines),
  );
  put(
    'rhines',
    `Rhines length ${rhinesLabel(conv)}`,
    'length',
    a.scales.rhinesLength,
    P(`rhines_${conv}`),
    F(`rhines_${conv}`, rhinesLabel(conv)),
    R(`rhines_${conv}`, REFERENCES.rhinesConventions),
  );
  put(
    'spacingRhines',
    'jet spacing vs the Rhines spacing',
    'length',
    spacing,
    P('jetSpacingRhines'),
    F('jetSpacingRhines', 'L_jet = Rhines length'),
    R('jetSpacingRhines', REFERENCES.rhinesConventions),
  );
  put(
    'spacingStaircase',
    'jet spacing vs the ideal staircase',
    'length',
    spacing,
    P('jetSpacingStaircase'),
    F('jetSpacingStaircase', 'L = 720^{1/4}(U/β)^½'),
    R('jetSpacingStaircase', REFERENCES.staircase),
  );
  put(
    'stepStaircase',
    'PV step width vs the ideal staircase',
    'length',
    a.staircase?.meanWidth ?? null,
    P('jetSpacingStaircase'),
    F('jetSpacingStaircase', 'L = 720^{1/4}(U/β)^½'),
    R('jetSpacingStaircase', REFERENCES.staircase),
  );
  put(
    'jetsRhines',
    'jets in the domain vs Rhines',
    'count',
    a.jets?.count ?? null,
    P('jetsRhines'),
    F('jetsRhines', 'Ly / L_jet'),
    R('jetsRhines', REFERENCES.practice),
  );
  put(
    'jetsStaircase',
    'jets in the domain vs staircase',
    'count',
    a.jets?.count ?? null,
    P('jetsStaircase'),
    F('jetsStaircase', 'Ly / L_stair'),
    R('jetsStaircase', REFERENCES.practice),
  );
  put(
    'R_beta',
    'zonostrophy index R_β',
    'ratio',
    a.scales.zonostrophyIndex,
    P('R_beta'),
    F('R_beta', 'R_β = k_β/k_R'),
    R('R_beta', REFERENCES.zonostrophy),
  );
  const regime = rows[rows.length - 1];
  if (a.scales.regime) regime.measuredText = a.scales.regime;
  if (pred) regime.predictedText = regimeOf(pred.R_beta.value);
  // The staircase relation applied to the measured U_rms: needs β alone.
  if (p.beta !== undefined && U !== null && lengths) {
    put(
      'spacingFromU',
      'jet spacing vs 720^{1/4}(U_rms/β)^½ of the measured U_rms',
      'length',
      spacing,
      staircaseSpacing(p.beta, U),
      'L = 720^{1/4}(U_rms/β)^½ with the measured U_rms',
      REFERENCES.staircase,
    );
  }
  // Verdicts where a row is a prediction of the planner with a known scatter (lib/plan/verdict.ts).
  const judged: Record<string, [Exclude<VerdictKey, 'regime'>, number | null]> = {
    U: ['u_rms', null],
    kR: ['k_rhines', null],
    R_beta: ['zonostrophy_index', null],
    spacingRhines: ['jet_spacing', a.jets?.spacingStderr ?? null],
    jetsRhines: ['jet_count', null],
  };
  for (const row of rows) {
    const j = judged[row.id];
    if (!j || row.predicted === null) continue;
    const v = judge(j[0], row.predicted, row.measured, j[1], {
      missing: a.jets?.verdict === 'too-short' ? 'the records are too few for the jet detector' : undefined,
    });
    row.verdict = v.verdict;
    row.verdictNote = v.note;
  }
  return { units, labels, rows, missing: missing ? `no planner predictions: ${missing}` : null };
}

/**
 * predictPlan on the user's parameters. The forcing wavelength (4 grid spacings), hyperviscosity
 * (order 4, damping time 1) and run length (1) are neutral fill-ins for resolvePlan's validation;
 * the rows above use no prediction that depends on them.
 */
function planPredictions(
  a: UserAnalysis,
  p: { beta: number; eps: number; mu: number; kd?: number },
  units: UnitSystem,
  Ly: number,
): PlanPredictions {
  const Lx = Math.max(a.grid.nx, 1) * a.grid.dx;
  const input: PlanInput = {
    units,
    rotation: { kind: 'beta', beta: p.beta },
    deformation: p.kd ? { kind: 'radius', Ld: 1 / p.kd } : { kind: 'none' },
    drive: { kind: 'injection', eps: p.eps },
    dragTime: 1 / p.mu,
    forcing: { wavelength: 4 * a.grid.dy, halfWidth: 0.1 },
    domain: { Lx, Ly },
    grid: { kind: 'spacing', dx: a.grid.dx, dy: a.grid.dy },
    hyperviscosity: { order: 4, gridDampingTime: 1 },
    runLength: 1,
    rhines: a.scales.rhinesConvention,
  };
  return predictPlan(resolvePlan(input));
}
