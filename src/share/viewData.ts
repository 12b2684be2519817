import type { BudgetSeriesColumns } from '../../lib/analysis/budgetSeries';
import type { CsvColumn } from '../../lib/io/csv';
import type { FluxPayload, HovmollerPayload, SpectraPayload, ZonalPayload } from '../../workers/diagnosticsApi';
import type { ScaleLadder } from '../runScales';
import { staircaseProfile } from '../views/staircaseProfile';
import { csvFile, gridNetcdf, numbers, type DataFile } from './figureData';
import { timeStamp } from './download';

/**
 * The data behind each view's figure, as the files its export buttons save: the numbers drawn, in
 * model units, one column per series (names say what each holds). Pure functions of the payloads.
 */

/** Zonal view: the latest and time-mean profiles on the grid rows, and the fitted staircase. */
export function zonalData(z: ZonalPayload): DataFile {
  const stairs = z.staircase
    ? staircaseProfile(z.y, z.staircase, z.beta, z.Ly)
    : new Float64Array(z.y.length).fill(NaN);
  const w = z.window;
  return csvFile(
    `stria-zonal-profiles-${timeStamp(z.time)}.csv`,
    [
      numbers('y', z.y),
      numbers('ubar_latest', z.ubar),
      numbers('ubar_time_mean', z.meanUbar),
      numbers('conv_upvp_latest', z.convUpvp),
      numbers('conv_upvp_time_mean', z.meanConvUpvp),
      numbers('qtot_latest', z.qtot),
      numbers('qtot_time_mean', z.meanQtot),
      numbers('qtot_staircase_fit', stairs),
    ],
    `profiles on ${z.y.length} points in y: latest sample at t = ${z.time.toFixed(2)}, time means over t = ${w.tStart.toFixed(2)}–${w.tEnd.toFixed(2)} (${w.count} samples)`,
  );
}

/** The jets of the Zonal view's time mean: position, speed, half-level edges and core forcing. */
export function zonalJetsData(z: ZonalPayload): DataFile | string {
  if (z.jets.length === 0) return `no jets to save: ${z.jetReason}`;
  return csvFile(
    `stria-zonal-jets-${timeStamp(z.time)}.csv`,
    [
      numbers(
        'y',
        z.jets.map((j) => j.y),
      ),
      numbers(
        'speed',
        z.jets.map((j) => j.speed),
      ),
      numbers(
        'y_south',
        z.jets.map((j) => j.ySouth),
      ),
      numbers(
        'y_north',
        z.jets.map((j) => j.yNorth),
      ),
      numbers(
        'core_forcing',
        z.jets.map((j) => j.coreForcing),
      ),
    ],
    `${z.jets.length} significant jets of the time mean`,
  );
}

/** Hovmöller view: ū(t, y), one row per column of the record, as NetCDF (2D data). */
export function hovmollerData(h: HovmollerPayload): DataFile {
  const y = Float64Array.from({ length: h.ny }, (_, j) => (j * h.Ly) / h.ny);
  return gridNetcdf({
    name: `stria-hovmoller-${timeStamp(h.t[h.columns - 1] ?? 0)}.nc`,
    title: 'Stria Hovmöller record of the zonal-mean zonal velocity',
    comment: `each time is the mean of ${h.samplesPerColumn} consecutive samples; model units (length L, time T)`,
    y: { name: 'time', units: '1', longName: 'model time (centre of the column)', values: h.t.subarray(0, h.columns) },
    x: { name: 'y', units: '1', longName: 'meridional position (model length)', values: y },
    fields: [
      {
        name: 'ubar',
        units: '1',
        longName: 'zonal-mean zonal velocity (model length per model time)',
        data: h.data.subarray(0, h.columns * h.ny),
      },
    ],
  });
}

/** Hovmöller view: the jet tracks, one row per point, with the track it belongs to. */
export function hovmollerTracksData(h: HovmollerPayload): DataFile | string {
  if (h.tracks.length === 0) return 'no jet tracks yet';
  const track: number[] = [];
  const t: number[] = [];
  const y: number[] = [];
  h.tracks.forEach((tr, k) => {
    for (let i = 0; i < tr.t.length; i++) {
      track.push(k);
      t.push(tr.t[i]);
      y.push(tr.y[i]);
    }
  });
  return csvFile(
    `stria-jet-tracks-${timeStamp(h.t[h.columns - 1] ?? 0)}.csv`,
    [numbers('track', track), numbers('time', t), numbers('y_unwrapped', y)],
    `${h.tracks.length} jet tracks`,
  );
}

/**
 * Spectra view: the shell spectra as densities (shell sum / dk, as drawn), the reference lines and the
 * fit, one row per shell; `columns` are the chart's columns (spectraFigure).
 */
export function spectraData(s: SpectraPayload, columns: readonly ArrayLike<number | null>[]): DataFile {
  const names = ['k', 'E_total', 'E_zonal', 'E_residual', 'ref_CK_eps23_k-53', 'ref_k-3', 'ref_CZ_beta2_k-5', 'fit'];
  return csvFile(
    `stria-spectra-${timeStamp(s.tEnd)}.csv`,
    names.map((n, i) => numbers(n, columns[i] ?? [])),
    `${s.k.length} shells (dk = ${s.dk.toPrecision(3)}), mean of ${s.count} spectra over t = ${s.tStart.toFixed(2)}–${s.tEnd.toFixed(2)}; densities E/dk`,
  );
}

/** Spectra view: the 2D spectrum E(kx, ky) as NetCDF. */
export function spectrum2dData(s: SpectraPayload): DataFile | string {
  if (!s.E2d || !s.kx2d || !s.ky2d) return 'switch the 2D spectrum on first';
  return gridNetcdf({
    name: `stria-spectrum-2d-${timeStamp(s.tEnd)}.nc`,
    title: 'Stria 2D energy spectrum E(kx, ky)',
    comment: `mean of ${s.count2d} blocks of samples ending at t = ${s.tEnd.toFixed(2)}; model units`,
    y: { name: 'ky', units: '1', longName: 'meridional wavenumber (rad per model length)', values: s.ky2d },
    x: { name: 'kx', units: '1', longName: 'zonal wavenumber (rad per model length)', values: s.kx2d },
    fields: [{ name: 'E', units: '1', longName: 'energy of each mode', data: s.E2d }],
  });
}

/** Flux view: Π_E and Π_Z through the shell edges. */
export function fluxData(f: FluxPayload): DataFile {
  return csvFile(
    `stria-flux-${timeStamp(f.tEnd)}.csv`,
    [numbers('k_edge', f.kEdge), numbers('Pi_E', f.PiE), numbers('Pi_Z', f.PiZ)],
    `fluxes through ${f.kEdge.length} shell edges, mean of ${f.count} samples over t = ${f.tStart.toFixed(2)}–${f.tEnd.toFixed(2)}`,
  );
}

/** Flux view: the eddy-to-mean conversion series. */
export function conversionData(f: FluxPayload): DataFile {
  return csvFile(
    `stria-conversion-${timeStamp(f.tEnd)}.csv`,
    [numbers('time', f.conversionT), numbers('conversion_C', f.conversion)],
    `${f.conversion.length} samples of the eddy-to-mean conversion`,
  );
}

/** Budget view: every sample of the budget history (time, energies, rates, residuals). */
export function budgetData(c: BudgetSeriesColumns): DataFile | string {
  if (c.time.length === 0) return 'no budget samples yet';
  const cols: CsvColumn[] = [
    numbers('time', c.time),
    numbers('steps', c.steps),
    numbers('duration', c.duration),
    numbers('kinetic_energy', c.kinetic),
  ];
  for (const [prefix, b] of [
    ['energy', c.energy],
    ['enstrophy', c.enstrophy],
  ] as const)
    for (const [term, values] of Object.entries(b)) cols.push(numbers(`${prefix}_${term}`, values));
  return csvFile(
    `stria-budget-${timeStamp(c.time[c.time.length - 1])}.csv`,
    cols,
    `${c.time.length} samples of the energy and enstrophy budgets`,
  );
}

/** Scale ladder: each rung with its row, wavenumber and what it is. */
export function ladderData(ladder: ScaleLadder, time: number): DataFile {
  const rows = (['fixed', 'predicted', 'measured'] as const).flatMap((row) => ladder[row].map((r) => ({ row, ...r })));
  return csvFile(
    `stria-scale-ladder-${timeStamp(time)}.csv`,
    [
      { name: 'row', values: rows.map((r) => r.row) },
      { name: 'scale', values: rows.map((r) => r.id) },
      { name: 'symbol', values: rows.map((r) => r.symbol) },
      numbers(
        'k',
        rows.map((r) => r.k),
      ),
      numbers(
        'length_2pi_over_k',
        rows.map((r) => (2 * Math.PI) / r.k),
      ),
      { name: 'what', values: rows.map((r) => r.title) },
    ],
    `${rows.length} wavenumbers of the run`,
  );
}
