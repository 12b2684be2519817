import type { RunSummary } from '../analysis/summary';
import type { PlanPredictions } from './predictions';
import { REFERENCES } from './references';

/**
 * Measured against predicted, row by row, with a verdict: does the measurement agree with the
 * prediction within the combined uncertainty of the two, and if not, what to change?
 *
 * A row agrees when |ln(measured/predicted)| ≤ 2·((σ_m/measured)² + r²)^½, σ_m the measurement's
 * standard error (the run summary's *_stderr, docs/significance.md) and r the relative scatter the
 * scaling itself keeps about its prediction (SCATTER, each with its source or marked as practice);
 * 2 is the two-sided 95 % factor of a normal error [practice]. The comparison is of logarithms, so
 * a factor too large and the same factor too small are judged alike (scalings are laws of ratios);
 * a measured count of zero is compared directly, |m − p| ≤ 2·(σ_m² + (r·p)²)^½. It cannot tell when the run has not
 * reached its steady state, the window was too short for the jet detector, or a number is missing.
 */
export type Verdict = 'agrees' | 'does not agree' | 'cannot tell';

export interface VerdictRow {
  /** The run summary's key of the quantity. */
  key: VerdictKey;
  predicted: number | string | null;
  measured: number | string | null;
  /** Standard error of the measurement, null when unknown. */
  stderr: number | null;
  /** Relative scatter of the scaling about its prediction, and where it comes from. */
  scatter: number;
  scatterSource: string;
  /** The largest |ln(measured/predicted)| that still agrees (or |measured − predicted| for a zero count), null for text rows or when it cannot tell. */
  tolerance: number | null;
  verdict: Verdict;
  /** Why, and (for 'does not agree' and 'cannot tell') what to change. */
  note: string;
}

export type VerdictKey = 'u_rms' | 'k_rhines' | 'k_beta' | 'zonostrophy_index' | 'jet_spacing' | 'jet_count' | 'regime';

/**
 * The relative scatter of each prediction about the truth, beyond sampling error.
 * - u_rms from the drag balance (ε/μ)^½: the share of the injection the hyperviscosity takes instead
 *   of drag lowers it, typically by 5–20 % in Stria's scenarios [practice]; 0.15.
 * - k_rhines, zonostrophy_index: as U^½, half of U's scatter [derived].
 * - k_beta = (β³/ε)^{1/5}: exact for the measured injection, which the white forcing makes ε [derived]; 0.02.
 * - jet_spacing and jet_count: jets sit about a Rhines length apart with an order-one prefactor that
 *   differs between studies and conventions; ±30 % [practice; memory for the spread].
 */
export const SCATTER: Readonly<Record<Exclude<VerdictKey, 'regime'>, { r: number; source: string }>> = Object.freeze({
  u_rms: { r: 0.15, source: `${REFERENCES.energyBalance}; hyperviscous share [practice]` },
  k_rhines: { r: 0.075, source: 'half the scatter of U (k_R ∝ U^−½) [derived]' },
  k_beta: { r: 0.02, source: 'exact for the measured injection [derived]' },
  zonostrophy_index: { r: 0.075, source: 'half the scatter of U (R_β ∝ U^½) [derived]' },
  jet_spacing: { r: 0.3, source: 'order-one prefactor of the Rhines scaling [practice; memory for the spread]' },
  jet_count: { r: 0.3, source: 'order-one prefactor of the Rhines scaling [practice; memory for the spread]' },
});

const ADVICE: Readonly<Record<Exclude<VerdictKey, 'regime'>, string>> = Object.freeze({
  u_rms: 'check ε and μ; if the hyperviscosity takes much of the injection, refine the grid or weaken ν',
  k_rhines: 'as for u_rms (k_R follows from U)',
  k_beta: 'check β and ε',
  zonostrophy_index: 'as for u_rms; the index follows from U and ε',
  jet_spacing: 'run longer (more independent samples), take a larger domain (more jets), or widen k_f/k_R',
  jet_count: 'run longer, take a larger domain, or widen k_f/k_R; the count is whole, so a small domain misses by ±1',
});

/**
 * The verdict of one number: `steady` false (a run still spinning up) or a missing measurement
 * cannot tell; `missing` says why a number is missing.
 */
export function judge(
  key: Exclude<VerdictKey, 'regime'>,
  predicted: number | null,
  measured: number | null,
  stderr: number | null,
  context: { steady?: boolean; missing?: string } = {},
): VerdictRow {
  const { r, source } = SCATTER[key];
  const base = { key, predicted, measured, stderr, scatter: r, scatterSource: source };
  if (context.steady === false)
    return {
      ...base,
      tolerance: null,
      verdict: 'cannot tell',
      note: 'the run has not reached its steady state: run longer',
    };
  if (measured === null || predicted === null || !Number.isFinite(predicted))
    return { ...base, tolerance: null, verdict: 'cannot tell', note: context.missing ?? 'not measured' };
  const logs = measured > 0 && predicted > 0;
  const tolerance = logs ? 2 * Math.hypot((stderr ?? 0) / measured, r) : 2 * Math.hypot(stderr ?? 0, r * predicted);
  const miss = logs ? Math.abs(Math.log(measured / predicted)) : Math.abs(measured - predicted);
  const ok = miss <= tolerance;
  const rule = logs ? `|ln(m/p)| = ${short(miss)}` : `|m − p| = ${short(miss)}`;
  const note = `${rule} ${ok ? '≤' : '>'} ${short(tolerance)}${stderr === null ? ' (no standard error: the scaling’s scatter alone)' : ''}`;
  return { ...base, tolerance, verdict: ok ? 'agrees' : 'does not agree', note: ok ? note : `${note}; ${ADVICE[key]}` };
}

/** Why the jet rows of a summary have no measurement. */
export function jetsMissing(verdict: RunSummary['jet_verdict']): string {
  return `no jet measurement (${verdict === 'too-short' ? 'the window is too short for the detector: average over a longer window' : 'no significant jets, or only one'})`;
}

/** The verdicts of a measured run summary against the predictions of its plan (the same units). */
export function verdicts(p: PlanPredictions, m: RunSummary): VerdictRow[] {
  const rows: VerdictRow[] = [];
  const spinning = !m.steady;
  const numeric = (
    key: Exclude<VerdictKey, 'regime'>,
    predicted: number,
    measured: number | null,
    stderr: number | null,
  ) =>
    rows.push(
      judge(key, predicted, measured, stderr, {
        steady: m.steady,
        missing: key === 'jet_spacing' || key === 'jet_count' ? jetsMissing(m.jet_verdict) : undefined,
      }),
    );
  numeric('u_rms', p.U.value, m.u_rms, m.u_rms_stderr);
  const kRerr =
    m.k_rhines !== null && m.u_rms && m.u_rms_stderr !== null ? (m.k_rhines * m.u_rms_stderr) / (2 * m.u_rms) : null;
  numeric('k_rhines', p.kR.value, m.k_rhines, kRerr);
  numeric('k_beta', p.kBeta.value, m.k_beta, null);
  numeric('zonostrophy_index', p.R_beta.value, m.zonostrophy_index, m.zonostrophy_index_stderr);
  numeric('jet_spacing', p.jetSpacingRhines.value, m.jet_spacing, m.jet_spacing_stderr);
  const countErr =
    m.jet_count !== null && m.jet_spacing && m.jet_spacing_stderr !== null
      ? (m.jet_count * m.jet_spacing_stderr) / m.jet_spacing
      : null;
  numeric('jet_count', p.jetsRhines.value, m.jet_verdict === 'no-jets' ? 0 : m.jet_count, countErr);
  // The regime: the measured R_β with its error may straddle a threshold; it agrees when the
  // prediction's regime is among those the measured interval reaches.
  const predictedRegime = p.regime.text;
  const regimeRow: VerdictRow = {
    key: 'regime',
    predicted: predictedRegime,
    measured: m.regime,
    stderr: m.zonostrophy_index_stderr,
    scatter: SCATTER.zonostrophy_index.r,
    scatterSource: SCATTER.zonostrophy_index.source,
    tolerance: null,
    verdict: 'cannot tell',
    note: 'the run has not reached its steady state: run longer',
  };
  if (!spinning && m.zonostrophy_index !== null) {
    const R = m.zonostrophy_index;
    const d = 2 * Math.hypot(m.zonostrophy_index_stderr ?? 0, SCATTER.zonostrophy_index.r * R);
    const reach = regimesBetween(R - d, R + d);
    const ok = reach.includes(predictedRegime);
    regimeRow.verdict = ok ? 'agrees' : 'does not agree';
    regimeRow.note = `measured R_β = ${short(R)} ± ${short(d)} reaches ${reach.join(' and ')}${ok ? '' : '; widen or narrow the scale separation (β, ε, μ) to move R_β'}`;
  }
  rows.push(regimeRow);
  return rows;
}

/** The regimes an interval of R_β reaches (thresholds 1.5 and 2.5, as lib/analysis/scales.ts regimeOf). */
function regimesBetween(lo: number, hi: number): string[] {
  const out: string[] = [];
  if (lo < 1.5) out.push('friction-dominated');
  if (hi >= 1.5 && lo < 2.5) out.push('transitional');
  if (hi >= 2.5) out.push('zonostrophic');
  return out;
}

function short(x: number): string {
  return String(Number(x.toPrecision(3)));
}
