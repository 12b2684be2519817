import type { RunSummary } from '../../lib/analysis/summary';
import type { PlanPredictions, Quantity } from '../../lib/plan/predictions';

/**
 * The numbers a prediction and a measured run are compared by, under the run summary's keys (the
 * same pairing `stria plan --matched` prints): the prediction, its formula and source, and the
 * measurement of the summary.
 */
export interface HeadlineRow {
  key: keyof RunSummary;
  label: string;
  quantity: Quantity;
  predicted: number | string;
  formula: string;
  reference: string;
}

export function headlineRows(p: PlanPredictions): HeadlineRow[] {
  const row = (key: keyof RunSummary, label: string, id: keyof PlanPredictions): HeadlineRow => ({
    key,
    label,
    quantity: p[id].quantity,
    predicted: p[id].value,
    formula: p[id].formula,
    reference: p[id].reference,
  });
  return [
    {
      key: 'regime',
      label: 'regime',
      quantity: 'ratio',
      predicted: p.regime.text,
      formula: p.regime.formula,
      reference: p.regime.reference,
    },
    row('jet_count', 'jets in the domain', 'jetsRhines'),
    row('jet_spacing', 'jet spacing', 'jetSpacingRhines'),
    row('u_rms', 'rms velocity U', 'U'),
    row('k_rhines', 'Rhines wavenumber k_R', 'kR'),
    row('k_beta', 'transitional wavenumber k_β', 'kBeta'),
    row('zonostrophy_index', 'zonostrophy index R_β', 'R_beta'),
  ];
}
