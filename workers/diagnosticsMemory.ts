import type { ModelParams } from '../lib/model/params';
import { BUDGET_ROW_WIDTH } from './budgetRows';
import { MAX_SPECTRAL_AVERAGE } from './diagnosticsPublisher';
import { CONVERSION_SAMPLES } from './spectralDiagnostics';
import { frameRows, ZONAL_STORE_BYTES } from './zonalFrameStore';

const D = 8;
const I = 4;
/** Most rows the budget row buffer holds between two snapshots (budgetRows.ts default). */
const BUDGET_ROWS_MAX = 1 << 14;

/**
 * Bytes of the arrays the worker holds for the views beyond the run's own measurement (which
 * lib/run/runMemory.ts counts, the time means included: the views share the run's window), the
 * zonal-mean frames kept for export, the
 * spectra and spectral flux plans with their outputs and running means (all views shown, averaged
 * over the most samples allowed, MAX_SPECTRAL_AVERAGE), and the budget rows at their largest.
 * Counted from the constructors of runDiagnostics.ts, zonalFrameStore.ts, spectralDiagnostics.ts,
 * recentMean.ts, lib/analysis/spectra.ts and spectralFlux.ts; test/workers/diagnosticsMemory.test.ts
 * checks it against the typed arrays a SimulationHost with every view on really holds.
 */
export function viewDiagnosticsBytes(
  p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'> & Partial<Pick<ModelParams, 'layers'>>,
  average = MAX_SPECTRAL_AVERAGE,
): number {
  const { nx, ny, Lx, Ly } = p;
  const S = ny * (nx / 2 + 1);
  // Zonal-mean frames: as many as fit in ZONAL_STORE_BYTES, even, 2 to 1024 (two layers: 11 profiles a frame, not 5).
  const rows = frameRows(p.layers ?? 1);
  const fit = Math.floor(ZONAL_STORE_BYTES / (D * rows * ny + 16));
  const cap = Math.max(2, Math.min(1024, fit - (fit % 2)));
  const frames = D * (cap * rows * ny + 2 * cap);
  // Spectra: shells up to the corner of the stored half plane, a 2D block of the kept modes.
  const dkx = (2 * Math.PI) / Lx;
  const dky = (2 * Math.PI) / Ly;
  const shells = Math.round(Math.hypot((nx / 2) * dkx, dky * (ny / 2)) / Math.min(dkx, dky));
  const block = (Math.floor(nx / 3) + 1) * (2 * Math.floor(ny / 3) + 1);
  const blockSides = Math.floor(nx / 3) + 1 + (2 * Math.floor(ny / 3) + 1);
  const spectraPlan = D * shells + I * shells + (I + D + D + I) * S + D * blockSides;
  const spectraOut = D * 7 * shells + D * blockSides + D * block;
  const ring = (n: number) => D * (n * average + average);
  const spectraMeans = 3 * ring(shells) + 2 * D * block;
  // Flux: the nonlinear term (its spectrum and its pair of largest speeds), eight shell arrays, two
  // running means, the conversion series.
  const flux = D * (2 * S + 2) + D * 8 * shells + 2 * ring(shells) + 2 * D * CONVERSION_SAMPLES;
  const budgetRows = D * BUDGET_ROWS_MAX * BUDGET_ROW_WIDTH;
  return frames + spectraPlan + spectraOut + spectraMeans + flux + budgetRows;
}

/** The budget rows at their largest, included in viewDiagnosticsBytes (a test needs them apart). */
export const BUDGET_ROWS_MAX_BYTES = D * BUDGET_ROWS_MAX * BUDGET_ROW_WIDTH;
