import { balanceVelocity, rhinesLength } from '../analysis/scales';
import { SUMMARY_KEYS, SUMMARY_OTHER_KEYS } from '../analysis/summary';
import type { CsvColumn } from '../io/csv';
import type { SweepRecord } from './sweepRecord';

/**
 * The results table of a sweep: one row per run in sweep order, with the swept values, the seed, the
 * run summary (stable keys first, then the rest) and the two scales the fits are against:
 *   rhines_length     2π/k_R with the measured k_R = (β/2U)^½ (the summary's k_rhines), and its
 *                     standard error, rhines_length·δU/(2U) (the length goes as U^½) [derived]
 *   balance_velocity  (ε/μ)^½ from the parameters, the drag-balance rms velocity
 * and, for two-layer runs (null otherwise), the summary's eddy diffusivity and velocity in Held &
 * Larichev's units, U = shear/2 the thermal wind and λ = 1/kd (lib/plan/baroclinicScales.ts):
 *   diffusivity_scaled  eddy_diffusivity/(Uλ), and its standard error scaled alike
 *   velocity_scaled     eddy_velocity/U, and its standard error scaled alike
 * Missing numbers are null in JSON and empty fields in CSV (RFC 4180; docs/file-formats.md).
 */
export type TableValue = number | string | boolean | null;
export type TableRow = Record<string, TableValue>;

/** Column names in order, for records whose swept parameters are `pointKeys`. */
export function tableColumns(pointKeys: readonly string[]): string[] {
  return [
    'id',
    'index',
    ...pointKeys,
    'replica',
    'seed',
    'status',
    'stopped',
    ...SUMMARY_KEYS,
    ...SUMMARY_OTHER_KEYS,
    'rhines_length',
    'rhines_length_stderr',
    'balance_velocity',
    'diffusivity_scaled',
    'diffusivity_scaled_stderr',
    'velocity_scaled',
    'velocity_scaled_stderr',
    'wall_seconds',
  ];
}

/** The swept parameter names of a set of records, in first-seen order. */
export function pointKeysOf(records: readonly SweepRecord[]): string[] {
  const keys: string[] = [];
  for (const r of records) for (const k of Object.keys(r.point)) if (!keys.includes(k)) keys.push(k);
  return keys;
}

export function tableRows(records: readonly SweepRecord[]): TableRow[] {
  const keys = pointKeysOf(records);
  return records.map((r) => {
    const s = r.summary as unknown as Record<string, TableValue>;
    const row: TableRow = { id: r.id, index: r.index };
    for (const k of keys) row[k] = r.point[k] ?? null;
    Object.assign(row, { replica: r.replica, seed: r.seed, status: r.status, stopped: r.stopped });
    for (const k of [...SUMMARY_KEYS, ...SUMMARY_OTHER_KEYS]) row[k] = s[k] ?? null;
    const kR = r.summary.k_rhines;
    const U = r.summary.u_rms;
    const dU = r.summary.u_rms_stderr;
    const L = kR !== null && kR > 0 && U !== null ? rhinesLength(r.params.beta, U, 'kR') : null;
    row.rhines_length = L;
    row.rhines_length_stderr = L !== null && U !== null && dU !== null ? (L * dU) / (2 * U) : null;
    row.balance_velocity = r.params.mu > 0 ? balanceVelocity(r.params.eps, r.params.mu) : null;
    const two = r.params.layers === 2 && r.params.shear !== 0 && r.params.kd > 0;
    const Uth = two ? Math.abs(r.params.shear) / 2 : NaN;
    const lambda = two ? 1 / r.params.kd : NaN;
    const scaled = (x: number | null | undefined, by: number) => (two && typeof x === 'number' ? x / by : null);
    row.diffusivity_scaled = scaled(r.summary.eddy_diffusivity, Uth * lambda);
    row.diffusivity_scaled_stderr = scaled(r.summary.eddy_diffusivity_stderr, Uth * lambda);
    row.velocity_scaled = scaled(r.summary.eddy_velocity, Uth);
    row.velocity_scaled_stderr = scaled(r.summary.eddy_velocity_stderr, Uth);
    row.wall_seconds = r.wall_seconds;
    return row;
  });
}

/** Columns for lib/io/csv.ts: numbers stay numbers (null → NaN → empty field), the rest text. */
export function tableCsvColumns(rows: readonly TableRow[], columns: readonly string[]): CsvColumn[] {
  return columns.map((name) => {
    const values = rows.map((r) => r[name] ?? null);
    const numeric = values.every((x) => x === null || typeof x === 'number');
    return numeric
      ? { name, values: Float64Array.from(values, (x) => (x === null ? NaN : (x as number))) }
      : { name, values: values.map((x) => (x === null ? '' : String(x))) };
  });
}
