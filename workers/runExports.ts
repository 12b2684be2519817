import type { StriaRunInfo } from '../lib/io/cfGlobalAttributes';
import { fileKindsOf } from '../lib/io/cfStria';
import { encodeSnapshotFile, encodeStriaFile, layerSnapshotFrame, snapshotFrame } from '../lib/io/cfStriaWriter';
import { encodeCsv, type CsvColumn } from '../lib/io/csv';
import type { Model } from '../lib/model/model';
import pkg from '../package.json';
import type { RunDiagnostics } from './runDiagnostics';
import { frameFields } from './zonalFrameStore';

/** The files a run exports: bytes, a suggested name, and what they hold in words. */
export interface ExportedFile {
  name: string;
  mime: string;
  bytes: Uint8Array;
  /** e.g. "1 record of 5 fields on 128 × 128". */
  description: string;
}

function runInfo(model: Model, action: string): StriaRunInfo {
  return {
    params: { ...model.params },
    striaVersion: pkg.version,
    createdAt: new Date().toISOString(),
    command: `Stria app: ${action}`,
  };
}

const stamp = (t: number) => `t${t.toFixed(2)}`;

/**
 * The current state as a one-record snapshot file (CF NetCDF, docs/file-formats.md); with two layers
 * the layered file of the command line (a layer dimension, each field upper then lower).
 */
export function snapshotExport(model: Model, diag: RunDiagnostics): ExportedFile {
  const run = runInfo(model, 'export the current state');
  const layers = diag.monitor.layers;
  const { nx, ny } = model.params;
  let bytes: Uint8Array;
  let what = 'q, ζ, ψ, u, v';
  if (model.layers === 2 && layers) {
    const upper = layers.plan.gridFields(model.qHat, 'upper');
    const lower = layers.plan.gridFields(model.qHat, 'lower');
    bytes = encodeStriaFile(fileKindsOf(2).snapshots, run, [layerSnapshotFrame(model.time, model.steps, upper, lower)]);
    what += ' of both layers';
  } else {
    const fields = diag.monitor.snap.gridFields(diag.sampled(model));
    bytes = encodeSnapshotFile(run, [snapshotFrame(model.time, model.steps, fields)]);
  }
  return {
    name: `stria-snapshot-${stamp(model.time)}.nc`,
    mime: 'application/x-netcdf',
    bytes,
    description: `1 record of ${what} on ${nx} × ${ny} at t = ${model.time.toFixed(3)}`,
  };
}

/** The zonal-mean samples gathered since the diagnostics (re)started, as a CF NetCDF time series. */
export function zonalNetcdfExport(model: Model, diag: RunDiagnostics): ExportedFile {
  const frames = diag.frames.frameList();
  if (frames.length === 0)
    throw new RangeError('no zonal-mean samples yet: let the run go on for a sample interval first');
  // The summary over the views' window goes with the series: its numbers, standard errors and verdicts.
  const bytes = encodeStriaFile(
    fileKindsOf(model.params.layers).zonal,
    { ...runInfo(model, 'export the zonal-mean time series'), summary: diag.summary(model) },
    frames,
  );
  return {
    name: `stria-zonal-${stamp(model.time)}.nc`,
    mime: 'application/x-netcdf',
    bytes,
    description: describe(diag, frames.length),
  };
}

/**
 * The same samples as CSV in long form, one row per (time, y), so it loads as a table as it is:
 * time, step, y, ubar, qbar (the total PV q̄ + βy, as in the NetCDF file), upvp, vpqp, eke; with two
 * layers each of these per layer (suffix 1 the upper, 2 the lower; qbar_i = q̄_i + Q_i y) and heat_flux.
 */
export function zonalCsvExport(model: Model, diag: RunDiagnostics): ExportedFile {
  const frames = diag.frames.frameList();
  if (frames.length === 0)
    throw new RangeError('no zonal-mean samples yet: let the run go on for a sample interval first');
  const { ny, Ly } = model.params;
  const rows = frames.length * ny;
  const col = () => new Float64Array(rows);
  const cols: Record<string, Float64Array> = { time: col(), step: col(), y: col() };
  // Each column: a field of the frame and the offset of its profile (the lower layer's follows the upper's).
  const parts = frameFields(model.params.layers).flatMap(({ name, rows }) =>
    rows === 1
      ? [{ column: name, name, at: 0 }]
      : [1, 2].map((l) => ({ column: `${name}${l}`, name, at: (l - 1) * ny })),
  );
  for (const p of parts) cols[p.column] = col();
  frames.forEach((f, r) => {
    for (let j = 0; j < ny; j++) {
      const i = r * ny + j;
      cols.time[i] = f.time;
      cols.step[i] = f.steps;
      cols.y[i] = (j * Ly) / ny;
      for (const p of parts) cols[p.column][i] = f.fields[p.name][p.at + j];
    }
  });
  const columns: CsvColumn[] = Object.entries(cols).map(([name, values]) => ({ name, values }));
  return {
    name: `stria-zonal-${stamp(model.time)}.csv`,
    mime: 'text/csv',
    bytes: encodeCsv(columns),
    description: describe(diag, frames.length),
  };
}

function describe(diag: RunDiagnostics, n: number): string {
  const every = diag.sampling.sampleEvery * diag.frames.samplesPerFrame;
  const what =
    diag.params.layers === 2
      ? 'ū, q̄ + Qy, u′v′, v′q′, EKE of each layer and the heat flux'
      : 'ū, q̄ + βy, u′v′, v′q′, EKE';
  return `${n} records of ${what} on ${diag.params.ny} points in y, every ${Number(every.toPrecision(4))} T`;
}
