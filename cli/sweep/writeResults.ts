import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { formatCsv } from '../../lib/io/csv';
import type { ScalingFitOptions } from '../../lib/analysis/scalingFit';
import { sweepFits, type FitReport, type SweepFits } from '../../lib/sweep/sweepFits';
import type { SweepRecord } from '../../lib/sweep/sweepRecord';
import { pointKeysOf, tableColumns, tableCsvColumns, tableRows } from '../../lib/sweep/sweepTable';

/**
 * The results of a sweep directory, rewritten whole from its records: table.csv and table.json (one
 * row per run, sweep order) and fits.json (the scaling fits with bootstrap intervals).
 */
export function writeResults(dir: string, records: readonly SweepRecord[], fitOptions: ScalingFitOptions): SweepFits {
  const rows = tableRows(records);
  const columns = tableColumns(pointKeysOf(records));
  if (rows.length > 0) writeFileSync(join(dir, 'table.csv'), formatCsv(tableCsvColumns(rows, columns)));
  else writeFileSync(join(dir, 'table.csv'), `${columns.join(',')}\r\n`);
  writeFileSync(join(dir, 'table.json'), `${JSON.stringify(rows, null, 1)}\n`);
  const fits = sweepFits(rows, fitOptions);
  writeFileSync(join(dir, 'fits.json'), `${JSON.stringify({ fit_options: fitOptions, ...fits }, null, 2)}\n`);
  return fits;
}

/** The fits in a few lines for people. */
export function fitsText(fits: SweepFits): string {
  const one = (name: string, f: FitReport) => {
    if (f.error !== null) return `${name}: no fit (${f.error})`;
    const ci = (c: [number, number] | null) => (c && Number.isFinite(c[0]) ? ` [${g(c[0])}, ${g(c[1])}]` : '');
    return `${name}: exponent ${g(f.exponent!)}${ci(f.exponent_ci)}, prefactor ${g(f.prefactor!)}${ci(f.prefactor_ci)}; at exponent ${f.fixed_exponent ?? 1}, prefactor ${g(f.prefactor_at_fixed_exponent ?? f.prefactor_at_exponent_1!)}${ci(f.prefactor_at_fixed_exponent_ci ?? f.prefactor_at_exponent_1_ci)} (${f.n} runs, ${Math.round(f.level * 100)}% bootstrap intervals)`;
  };
  const lines = [
    one('jet_spacing ~ rhines_length', fits.jet_spacing_vs_rhines_length),
    one('u_rms ~ (eps/mu)^1/2', fits.u_rms_vs_balance_velocity),
  ];
  // The two-layer fits only when the sweep has two-layer runs (else they say why they cannot be made).
  const baroclinic = fits.eddy_diffusivity_vs_supercriticality;
  if (baroclinic.n > 0 || baroclinic.error === null)
    lines.push(
      one('D/(U lambda) ~ supercriticality', baroclinic),
      one('V/U ~ supercriticality', fits.eddy_velocity_vs_supercriticality),
    );
  return `${lines.join('\n')}\n`;
}

const g = (x: number) => String(Number(x.toPrecision(4)));
