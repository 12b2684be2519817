import { BUDGET_TERMS } from '../analysis/budgetSeries';
import { CYCLE_TERMS } from '../analysis/cycleSeries';
import { LAYER_PROFILES } from '../analysis/layerMonitor';
import { MEAN_PROFILES } from '../analysis/runMonitor';
import type { ModelParams } from '../model/params';
import { forcedModesForCost, modelMemory, type MemoryEstimate } from '../plan/cost';
import { TIME_MEAN_CAP } from './monitoredRun';

/**
 * The memory a measured run needs, counted array by array, so that a size that would not fit is
 * refused before anything is allocated (`stria run`, `stria sweep`, and the app before it builds a
 * model). The model's own arrays come from the planner's cost model (lib/plan/cost.ts `modelMemory`,
 * itself counted from lib/model); the rest is counted here from the constructors of lib/analysis and
 * lib/sweep, with the same names, and test/sweep/runMemory.test.ts checks the sum against every typed
 * array actually reachable from a built run. Strings and small objects are not counted; the process's
 * own baseline (a JavaScript runtime) is the caller's `runtimeBytes`.
 *
 * With S = ny(nx/2 + 1) half-plane modes and N = nx·ny points, in doubles unless noted:
 *   model               lib/plan/cost.ts, ≈ 157 bytes a point on large square grids
 *   measurement         a snapshot plan (grid, linear operator, transform: the model's rows of those
 *                       owners) + its spectrum 2S, gridded fields u, v, q, ζ, ψ 5N, the accumulators
 *                       (budget series 27(B + 1) + 26 with B = 4096, Hovmöller 512·ny + 512 + 2ny, time
 *                       means 256·8·ny + 3·256) and the profile plans (≈ 44·ny)
 *   snapshot files      a second snapshot plan and gridded fields, and a record buffer 5N + 1.5
 *   zonal-mean file     a record buffer 5·ny + 1.5
 *   retry checkpoint    a copy of q̂ (2S) and of the accumulators (blow-up retries keep one)
 *   checkpoint writing  transient: q̂ as bytes 16S bytes and as base64 text four times over (run file,
 *                       JSON, the progress splice, the write buffer), and the accumulators as base64
 *                       text the same way
 * Two layers (params.layers = 2): the model's own count (cost.ts), a state of 4S, and the layer
 * monitor in the measurement: a layer snapshot plan (grid, two-layer linear operator, transform,
 * spectrum 2S), the layers' fields 10N, their zonal means and profile plans (43·ny), the energy
 * cycle series (CYCLE_TERMS + 4 columns of B + 1, with B = 4096) and the time means of 13 layer
 * profiles (256·13·ny + 3·256, and 13·ny means); the snapshot file holds both layers (a layer
 * snapshot plan, 10N fields, a record of 10N + 1.5), the zonal-mean file 11·ny + 1.5.
 */
export interface RunMemoryOptions {
  snapshots?: boolean;
  zonal?: boolean;
  /** In-memory checkpoints for blow-up retries. */
  retry?: boolean;
  /** Checkpoint files written now and then (their encoding is transient but must fit). */
  checkpointFile?: boolean;
  /** The process's own baseline, bytes (0 in a library estimate; the command line states its own). */
  runtimeBytes?: number;
}

export interface MemoryItem {
  what: string;
  bytes: number;
}

export interface RunMemoryEstimate {
  nx: number;
  ny: number;
  items: MemoryItem[];
  totalBytes: number;
  /** totalBytes / (nx·ny). */
  bytesPerPoint: number;
}

/** Capacities of the run monitor's accumulators (lib/analysis/runMonitor.ts defaults). */
export const BUDGET_CAPACITY = 4096;
export const HOVMOLLER_CAP = 512;

const D = 8;

/**
 * Bytes of the accumulators a run keeps (budget series, Hovmöller record, time means) for ny rows;
 * with two layers also the energy cycle series and the layers' time means.
 */
export function accumulatorBytes(ny: number, layers: 1 | 2 = 1): number {
  const cols = 4 + 2 * (BUDGET_TERMS.length + 1);
  const budget = (cols + 1) * (BUDGET_CAPACITY + 1) + cols;
  const hovmoller = HOVMOLLER_CAP * ny + HOVMOLLER_CAP + 2 * ny;
  const means = TIME_MEAN_CAP * MEAN_PROFILES.length * ny + 3 * TIME_MEAN_CAP;
  const one = D * (budget + hovmoller + means);
  if (layers === 1) return one;
  const cycleCols = 3 + CYCLE_TERMS.length;
  const cycle = (cycleCols + 1) * (BUDGET_CAPACITY + 1) + cycleCols;
  const layerMeans = TIME_MEAN_CAP * LAYER_PROFILES.length * ny + 3 * TIME_MEAN_CAP;
  return one + D * (cycle + layerMeans);
}

function snapshotPlanBytes(model: MemoryEstimate, S: number): number {
  const owners = new Set(['Grid', 'LinearOperator', 'RealTransform2D', 'BatchFFT (y)', 'BatchFFT (x)']);
  return model.arrays.filter((a) => owners.has(a.owner)).reduce((s, a) => s + a.bytes, 0) + D * 2 * S;
}

/** A layer snapshot plan: the grid, the two-layer linear operator, a transform and a spectrum of 2S. */
function layerPlanBytes(model: MemoryEstimate, S: number): number {
  const owners = new Set(['Grid', 'TwoLayerLinearOperator', 'RealTransform2D', 'BatchFFT (y)', 'BatchFFT (x)']);
  return model.arrays.filter((a) => owners.has(a.owner)).reduce((s, a) => s + a.bytes, 0) + D * 2 * S;
}

/**
 * The estimate for a run of these parameters. Only nx, ny, Lx, Ly, kf, dkf and layers are read (the
 * forcing annulus sets the size of the forcing's mode lists).
 */
export function estimateRunMemory(
  p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly' | 'kf' | 'dkf'> & { layers?: 1 | 2 },
  options: RunMemoryOptions = {},
): RunMemoryEstimate {
  const { nx, ny } = p;
  const layers = p.layers ?? 1;
  const S = ny * (nx / 2 + 1);
  const N = nx * ny;
  const model = modelMemory(nx, ny, forcedModesForCost(p), layers);
  const plan = snapshotPlanBytes(model, S);
  const acc = accumulatorBytes(ny, layers);
  // Zonal means (9, and the 3 plain eddy means) and time-mean profiles (8), three profile transforms
  // (4 each), y, jet amplitudes, gradient.
  const profiles = D * (12 * ny + MEAN_PROFILES.length * ny + 3 * 4 * ny + ny + (ny / 2 + 1) + ny);
  // Two layers: the layer plan, both layers' fields, their zonal means (2 × 12 + 5 profiles), the
  // plans of the layer zonal means (2 × (y + a profile transform) + a profile transform) and the means.
  const layerPlan = layers === 2 ? layerPlanBytes(model, S) : 0;
  const layerMonitor = layers === 2 ? layerPlan + D * (10 * N + 29 * ny + 14 * ny + LAYER_PROFILES.length * ny) : 0;
  const items: MemoryItem[] = [
    { what: 'model', bytes: model.totalBytes },
    { what: 'measurement', bytes: plan + D * 5 * N + acc + profiles + layerMonitor },
  ];
  if (options.snapshots)
    items.push({
      what: 'snapshot file',
      bytes: layers === 2 ? layerPlan + D * 10 * N + D * 10 * N + 12 : plan + D * 5 * N + D * 5 * N + 12,
    });
  if (options.zonal) items.push({ what: 'zonal-mean file', bytes: D * (layers === 2 ? 11 : 5) * ny + 12 });
  if (options.retry) items.push({ what: 'retry checkpoint', bytes: D * 2 * layers * S + acc });
  if (options.checkpointFile) {
    const state = D * 2 * layers * S;
    items.push({ what: 'checkpoint writing', bytes: Math.ceil(state + 4 * (4 / 3) * state + acc + 4 * (4 / 3) * acc) });
  }
  if (options.runtimeBytes) items.push({ what: 'runtime', bytes: options.runtimeBytes });
  const totalBytes = items.reduce((s, i) => s + i.bytes, 0);
  return { nx, ny, items, totalBytes, bytesPerPoint: totalBytes / N };
}

/** A run refused for its memory: the estimate and the budget it exceeds. */
export class MemoryBudgetError extends RangeError {
  constructor(
    readonly estimate: RunMemoryEstimate,
    readonly budgetBytes: number,
    what = `a ${estimate.nx} × ${estimate.ny} run`,
  ) {
    super(
      `${what} needs about ${formatBytes(estimate.totalBytes)} (${describeItems(estimate)}), more than the memory budget of ${formatBytes(budgetBytes)}`,
    );
    this.name = 'MemoryBudgetError';
  }
}

/** Throws MemoryBudgetError when the estimate exceeds the budget (bytes); returns the estimate. */
export function checkMemoryBudget(estimate: RunMemoryEstimate, budgetBytes: number, what?: string): RunMemoryEstimate {
  if (!(budgetBytes > 0)) throw new RangeError(`memory budget must be > 0 bytes, got ${budgetBytes}`);
  if (estimate.totalBytes > budgetBytes) throw new MemoryBudgetError(estimate, budgetBytes, what);
  return estimate;
}

/** "model 12.0 MiB, measurement 9.1 MiB, …" */
export function describeItems(e: RunMemoryEstimate): string {
  return e.items.map((i) => `${i.what} ${formatBytes(i.bytes)}`).join(', ');
}

/** Bytes in binary units, three significant digits: "512 B", "1.50 KiB", "2.00 GiB". */
export function formatBytes(bytes: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB'];
  let x = bytes;
  let u = 0;
  while (x >= 1024 && u < units.length - 1) {
    x /= 1024;
    u++;
  }
  return u === 0 ? `${Math.round(x)} B` : `${x.toPrecision(3)} ${units[u]}`;
}
