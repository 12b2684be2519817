import type { ModelParams } from '../lib/model/params';
import { estimateRunMemory, formatBytes, type MemoryItem } from '../lib/run/runMemory';
import { viewDiagnosticsBytes } from '../workers/diagnosticsMemory';

const GiB = 1024 ** 3;
const MiB = 1024 ** 2;

/** The most the app lets one run take, whatever the device. */
export const APP_BUDGET_CAP = 1 * GiB;
/** The least: the scenarios (128², about 86 MiB here) must open with room on any device. */
export const APP_BUDGET_FLOOR = 256 * MiB;

/**
 * The page's JavaScript heaps and code, beyond the arrays counted: the page's heap measures about
 * 18 MiB in Chromium with every view opened (performance.memory), and the worker's holds little
 * more than the model's small objects. [practice]
 */
export const APP_RUNTIME_BYTES = 64 * MiB;

export interface MemoryBudget {
  bytes: number;
  /** How the budget was set, for the message. */
  reason: string;
}

/**
 * The app's memory budget for a run: a quarter of the device's memory as the browser reports it,
 * between APP_BUDGET_FLOOR (256 MiB) and APP_BUDGET_CAP (1 GiB). The page and its workers share one renderer process, which shares the
 * device with the browser's other processes and everything else running; a quarter leaves them room.
 * navigator.deviceMemory is the Device Memory API (W3C): the device's RAM in GiB, rounded down to a
 * power of two, reported by Chromium between 0.25 and 8. Browsers without it get the cap.
 */
export function appMemoryBudget(deviceMemoryGiB: number | undefined = readDeviceMemory()): MemoryBudget {
  if (typeof deviceMemoryGiB === 'number' && Number.isFinite(deviceMemoryGiB) && deviceMemoryGiB > 0) {
    const quarter = (deviceMemoryGiB * GiB) / 4;
    if (quarter <= APP_BUDGET_FLOOR)
      return { bytes: APP_BUDGET_FLOOR, reason: `its least; this device has ${deviceMemoryGiB} GiB` };
    if (quarter < APP_BUDGET_CAP)
      return { bytes: quarter, reason: `a quarter of this device's ${deviceMemoryGiB} GiB` };
  }
  return { bytes: APP_BUDGET_CAP, reason: '' };
}

function readDeviceMemory(): number | undefined {
  return (globalThis.navigator as { deviceMemory?: number } | undefined)?.deviceMemory;
}

type GridParams = Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly' | 'kf' | 'dkf'> & { layers?: 1 | 2 };

export interface AppMemoryEstimate {
  nx: number;
  ny: number;
  items: MemoryItem[];
  totalBytes: number;
}

/**
 * What a run of `p` takes in the app, item by item (N = nx·ny points, S = ny(nx/2 + 1) modes):
 *   model, measurement   lib/run/runMemory.ts (the worker's model and RunMonitor)
 *   views                workers/diagnosticsMemory.ts (every view shown, the longest averages)
 *   kept states          copies of q̂ (16S bytes each): the worker's rescue point (workers/
 *                        rescuePoint.ts), its copy with the step halved after a blow-up, and the
 *                        page's copy for a worker that dies (src/keep/keptCheckpoint.ts)
 *   fields on screen     the snapshot shown and the one coming back (8N each), the field image and
 *                        its canvas (4N each)
 *   runtime              APP_RUNTIME_BYTES
 * and the larger of two moments that do not overlap:
 *   exporting            a snapshot file: the fields (40N) and the file (40N) in the worker, the file
 *                        read back (40N) and its download copy (40N) in the page; this also covers
 *                        saving a run file or the autosave (q̂ 16S, its base64 text about 21S, the
 *                        file's text and the stored copy: about 80S ≈ 40N)
 *   replacing a run      while a new grid, domain or loaded run is built, the run it replaces (its
 *                        model, measurement, views and rescue point) is still held: `replacing`
 */
export function estimateAppMemory(p: GridParams, replacing: GridParams | null = null): AppMemoryEstimate {
  const N = p.nx * p.ny;
  const run = estimateRunMemory(p);
  const resident = (q: GridParams) => {
    const r = estimateRunMemory(q);
    return r.items[0].bytes + r.items[1].bytes + viewDiagnosticsBytes(q) + 16 * q.ny * (q.nx / 2 + 1);
  };
  const items: MemoryItem[] = [
    run.items[0],
    run.items[1],
    { what: 'views', bytes: viewDiagnosticsBytes(p) },
    { what: 'kept states', bytes: 3 * 16 * p.ny * (p.nx / 2 + 1) },
    { what: 'fields on screen', bytes: 24 * N },
    { what: 'runtime', bytes: APP_RUNTIME_BYTES },
  ];
  const exporting = 160 * N;
  const replaced = replacing ? resident(replacing) : 0;
  items.push(
    replaced > exporting
      ? { what: `the ${replacing!.nx} × ${replacing!.ny} run it replaces`, bytes: replaced }
      : { what: 'exporting a snapshot', bytes: exporting },
  );
  return { nx: p.nx, ny: p.ny, items, totalBytes: items.reduce((s, i) => s + i.bytes, 0) };
}

/** Bytes in binary units without trailing zeros: "1 GiB", "512 MiB", "1.4 GiB". */
export function roughBytes(bytes: number): string {
  return formatBytes(bytes)
    .replace(/\.0+ /, ' ')
    .replace(/(\.\d*?)0+ /, '$1 ');
}

/**
 * Why the app refuses a run of `p` (replacing the run of `replacing`, if any), or null when it
 * fits the budget: "1024 × 1024 needs ≈ 645 MiB; the app's budget is 512 MiB (a quarter of this
 * device's 2 GiB)".
 */
export function memoryRefusal(
  p: GridParams,
  replacing: GridParams | null = null,
  budget: MemoryBudget = appMemoryBudget(),
): string | null {
  const e = estimateAppMemory(p, replacing);
  if (e.totalBytes <= budget.bytes) return null;
  const along =
    replacing && e.items.some((i) => i.what.endsWith('it replaces'))
      ? ` with the ${replacing.nx} × ${replacing.ny} run it replaces`
      : '';
  return `${p.nx} × ${p.ny} needs ≈ ${roughBytes(e.totalBytes)}${along}; the app's budget is ${roughBytes(budget.bytes)}${budget.reason ? ` (${budget.reason})` : ''}`;
}
