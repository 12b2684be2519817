import type { ModelParams } from '../lib/model/params';
import { modelMemory } from '../lib/plan/cost';
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
  const { nx, ny } = p;
  const S = ny * (nx / 2 + 1);
  // Zonal-mean frames: as many as fit in ZONAL_STORE_BYTES, even, 2 to 1024 (two layers: 11 profiles a frame, not 5).
  const rows = frameRows(p.layers ?? 1);
  const fit = Math.floor(ZONAL_STORE_BYTES / (D * rows * ny + 16));
  const cap = Math.max(2, Math.min(1024, fit - (fit % 2)));
  const frames = D * (cap * rows * ny + 2 * cap);
  const { shells, shellPlan, block, blockSides } = spectraShells(p);
  const spectraPlan = shellPlan + D * blockSides;
  const spectraOut = D * 7 * shells + D * blockSides + D * block;
  const ring = (n: number) => D * (n * average + average);
  const spectraMeans = 3 * ring(shells) + 2 * D * block;
  // Flux: the nonlinear term (its spectrum and its pair of largest speeds), eight shell arrays, two
  // running means, the conversion series.
  const flux = D * (2 * S + 2) + D * 8 * shells + 2 * ring(shells) + 2 * D * CONVERSION_SAMPLES;
  const budgetRows = D * BUDGET_ROWS_MAX * BUDGET_ROW_WIDTH;
  const layers = p.layers === 2 ? layerSpectraBytes(p, average) : 0;
  return frames + spectraPlan + spectraOut + spectraMeans + flux + budgetRows + layers;
}

/**
 * Two layers: the barotropic and baroclinic spectra while asked for (layerSpectralDiagnostics.ts):
 * the LayerSpectraPlan of lib/analysis/layerSpectra.ts (a layer snapshot plan, the two-layer nonlinear
 * term, the one-layer nonlinear term of the barotropic flow with its grid and transform, the shells, four
 * spectra of 2S), its output (12 shell arrays) and seven running means of shells and one of Σ X.
 * Counted from the constructors and the model's own table (lib/plan/cost.ts modelMemory);
 * test/workers/diagnosticsMemory.test.ts checks it against the arrays really held.
 */
export function layerSpectraBytes(
  p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'>,
  average = MAX_SPECTRAL_AVERAGE,
): number {
  const { nx, ny } = p;
  const S = ny * (nx / 2 + 1);
  const { shells, shellPlan, blockSides } = spectraShells(p);
  const sum = (rows: { owner: string; bytes: number }[], keep: (owner: string) => boolean) =>
    rows.filter((a) => keep(a.owner)).reduce((t, a) => t + a.bytes, 0);
  const transformOwners = ['Grid', 'RealTransform2D', 'BatchFFT (y)', 'BatchFFT (x)'];
  const two = modelMemory(nx, ny, 0, 2).arrays;
  const one = modelMemory(nx, ny, 0, 1).arrays;
  const layerPlan = sum(two, (o) => [...transformOwners, 'TwoLayerLinearOperator'].includes(o)) + D * 2 * S;
  const twoLayerTerm = sum(two, (o) => o.startsWith('TwoLayerNonlinearTerm'));
  // Of the barotropic snapshot plan only what its nonlinear term keeps: grid, operator and transform.
  const barotropicPlan = sum(one, (o) => [...transformOwners, 'LinearOperator'].includes(o));
  const selfTerm = sum(one, (o) => o === 'NonlinearTerm');
  const ring = (n: number) => D * (n * average + average);
  return (
    layerPlan +
    twoLayerTerm +
    barotropicPlan +
    selfTerm +
    shellPlan +
    D * blockSides +
    D * 4 * 2 * S +
    D * 12 * shells +
    7 * ring(shells) +
    ring(1) +
    D
  );
}

/**
 * The shells of the spectra (up to the corner of the stored half plane) and the bytes of their plan
 * (lib/analysis/spectra.ts) without its 2D block sides, the 2D block and its sides.
 */
function spectraShells(p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'>) {
  const { nx, ny, Lx, Ly } = p;
  const S = ny * (nx / 2 + 1);
  const dkx = (2 * Math.PI) / Lx;
  const dky = (2 * Math.PI) / Ly;
  const shells = Math.round(Math.hypot((nx / 2) * dkx, dky * (ny / 2)) / Math.min(dkx, dky));
  const block = (Math.floor(nx / 3) + 1) * (2 * Math.floor(ny / 3) + 1);
  const blockSides = Math.floor(nx / 3) + 1 + (2 * Math.floor(ny / 3) + 1);
  const shellPlan = D * shells + I * shells + (I + D + D + I) * S;
  return { shells, shellPlan, block, blockSides };
}

/** The budget rows at their largest, included in viewDiagnosticsBytes (a test needs them apart). */
export const BUDGET_ROWS_MAX_BYTES = D * BUDGET_ROWS_MAX * BUDGET_ROW_WIDTH;
