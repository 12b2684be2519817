import type { DatasetReader } from '../io/datasetReader';
import { isPow2 } from '../analysis/profileExtension';
import { formatBytes, type MemoryItem } from '../run/runMemory';
import { planDerivation } from './derivedFields';
import type { CoordinateAxis } from './coordinateAxis';
import type { Discovery } from './fieldDiscovery';
import { ordinal } from './fieldSource';
import type { UserRole } from './userData';

/**
 * The memory an analysis of a user's file takes, estimated from the file's dimensions before a value
 * is read, so that a file whose dimensions are large but whose data were never written (a netCDF-4
 * file of a few hundred kB can declare 16384² points) is refused with the estimate instead of
 * allocating gigabytes. Counted as gridAnalysis.ts allocates, with N = nx·ny points of the grid
 * analysed (after any subsample), in bytes:
 *   file in memory     the file's bytes when it is held whole (netCDF-4, or bytes already in memory)
 *   read buffer        NetCDF-3: the reused read scratch (at most 8 MiB); a reordered grid: 8 × the
 *                      file's N; a subsample: one file row
 *   fields             8N per field read or derived (derivedFields.ts), one more for ζ from u and v
 *   spectral plans     on a 2^k grid that may be periodic: transforms and scratch 13 × 8N, and with
 *                      spectra the spectral flux's model plan and the spectra 17 × 8N (measured
 *                      12.5 and 16.5 × 8N from 64² to 256² with the AllocationMeter)
 *   profiles           16 × 8 bytes a row; the time coordinate, 8 bytes a record; the records'
 *                      own ū and q̄ profiles for the jet detector, 2 × 256 rows (gridAnalysis.ts
 *                      RECORD_BINS), and on a gridded file the first record's u and q by column, 2 × 8N
 *   chunk decoding     netCDF-4 with filters: one chunk's stored and decoded copies at a time
 *   runtime            the caller's own baseline (the command line's process, the page)
 * test/userfile/userFileMemory.test.ts checks that the estimate bounds what the meter counts.
 */
export interface UserFileMemoryEstimate {
  nx: number;
  ny: number;
  items: MemoryItem[];
  totalBytes: number;
}

export interface UserFileMemoryInput {
  reader: DatasetReader;
  discovery: Discovery;
  /** Bytes of the file held in memory whole (0 when it is read record by record from disk). */
  fileBytes: number;
  subsample?: number;
  kd?: number;
  spectra?: boolean;
  periodic?: { x?: boolean; y?: boolean };
  runtimeBytes?: number;
}

const D = 8;
/** NetCDF-3 reads go through one scratch buffer of at most this many bytes (netcdf3Dataset.ts). */
const NETCDF3_READ_PIECE = 8 * 1024 * 1024;

export function estimateUserFileMemory(m: UserFileMemoryInput): UserFileMemoryEstimate {
  const d = m.discovery;
  const K = m.subsample ?? 1;
  const profile = d.layout === 'zonal-mean';
  const fileNx = d.x?.n ?? 1;
  const nx = Math.ceil(fileNx / K);
  const ny = Math.ceil(d.y.n / K);
  const N = nx * ny;
  const roles = Object.keys(d.fields) as UserRole[];
  const lengths = d.y.kind !== 'latitude' && d.x?.kind !== 'longitude';
  // Periodicity is settled by the data later; an axis counts as possibly periodic unless it cannot be.
  const mayBePeriodic = (a: CoordinateAxis | null, forced: boolean | undefined) => {
    if (forced !== undefined) return forced;
    if (!a || a.kind === 'latitude') return false;
    return a.period === null || Math.abs(Math.ceil(a.n / K) * K * a.spacing - a.period) <= 1e-3 * K * a.spacing;
  };
  const spectral =
    !profile &&
    lengths &&
    isPow2(nx) &&
    isPow2(ny) &&
    mayBePeriodic(d.x, m.periodic?.x) &&
    mayBePeriodic(d.y, m.periodic?.y);
  const items: MemoryItem[] = [];
  const add = (what: string, bytes: number) => {
    if (bytes > 0) items.push({ what, bytes: Math.ceil(bytes) });
  };
  add('file in memory', m.fileBytes);
  const largest = Math.max(...roles.map((r) => m.reader.recordLength(d.fields[r]!.variable)), 1);
  const rowBytes = D * (d.order === 'xy' ? d.y.n : fileNx);
  const netcdf3 = m.reader.format !== 'netcdf4';
  const scratch = netcdf3 ? Math.min(NETCDF3_READ_PIECE, D * (K > 1 ? rowBytes / D : largest)) : 0;
  const reorder = K === 1 && (d.order === 'xy' || d.y.reversed || !!d.x?.reversed) ? D * fileNx * d.y.n : 0;
  add('read buffer', scratch + reorder + (K > 1 ? rowBytes : 0));
  // A layer dimension: the depth-weighted mean gathers each layer in one more buffer; a two-layer
  // file with ψ and v adds the heat flux: ψ and v of the upper layer, ψ of the lower, and the
  // sources' own read buffers (heatFlux.ts).
  const level = d.level;
  const layerBuffer = level && level.index === null ? D * N : 0;
  const heat =
    !profile && level && level.count === 2 && d.fields.psi && d.fields.v
      ? 3 * D * N + D * ny + 2 * (reorder + (K > 1 ? rowBytes : 0))
      : profile && m.reader.has('heat_flux')
        ? 2 * D * ny
        : 0;
  add('layers', layerBuffer + (level ? (K > 1 ? rowBytes : 0) : 0));
  add('heat flux', heat);
  let fields: number;
  if (profile) fields = roles.length * D * ny;
  else {
    const plan = planDerivation(roles, m.kd ?? 0, lengths, spectral);
    const n = (['u', 'v', 'zeta', 'psi', 'q'] as const).filter((k) => plan[k] !== null).length;
    fields = D * N * (n + (plan.zeta === 'uv' ? 1 : 0));
  }
  add('fields', fields);
  if (spectral) add('spectral plans', D * N * (13 + (m.spectra === false ? 0 : 17)));
  add('profiles', D * (16 * ny + d.records.count + 2 * 256 * ny + (profile ? 0 : 2 * N)));
  add('chunk decoding', Math.max(0, ...roles.map((r) => m.reader.recordReadBytes(d.fields[r]!.variable))));
  add('runtime', m.runtimeBytes ?? 0);
  return { nx, ny, items, totalBytes: items.reduce((s, i) => s + i.bytes, 0) };
}

/**
 * An analysis refused for its memory: the estimate, the budget, and the smallest subsample K that
 * fits (null when none does, e.g. the file itself is larger than the budget).
 */
export class UserFileMemoryError extends RangeError {
  constructor(
    readonly estimate: UserFileMemoryEstimate,
    readonly budgetBytes: number,
    readonly fitsAt: number | null,
    fields: string,
    fitting: UserFileMemoryEstimate | null,
  ) {
    const { nx, ny, totalBytes, items } = estimate;
    super(
      `${fields} on ${nx} × ${ny} points need about ${formatBytes(totalBytes)} (${items.map((i) => `${i.what} ${formatBytes(i.bytes)}`).join(', ')}), more than the memory budget of ${formatBytes(budgetBytes)}; ` +
        (fitsAt !== null && fitting
          ? `every ${ordinal(fitsAt)} point (${fitting.nx} × ${fitting.ny}) would fit`
          : 'no subsample fits: the file itself takes most of it'),
    );
    this.name = 'UserFileMemoryError';
  }
}

/**
 * Throws UserFileMemoryError when the estimate of `m` exceeds `budgetBytes`; returns the estimate.
 * The subsample offered is the smallest K ≥ 2 (beyond the one asked) whose estimate fits.
 */
export function checkUserFileMemory(m: UserFileMemoryInput, budgetBytes: number): UserFileMemoryEstimate {
  const e = estimateUserFileMemory(m);
  if (e.totalBytes <= budgetBytes) return e;
  const K = m.subsample ?? 1;
  const most = Math.max(m.discovery.x?.n ?? 1, m.discovery.y.n);
  let fitsAt: number | null = null;
  let fitting: UserFileMemoryEstimate | null = null;
  for (let k = K + 1; k <= most; k = k < 8 ? k + 1 : Math.ceil(k * 1.25)) {
    const f = estimateUserFileMemory({ ...m, subsample: k });
    if (f.totalBytes <= budgetBytes) {
      fitsAt = k;
      fitting = f;
      break;
    }
  }
  const names = Object.values(m.discovery.fields).map((f) => `"${f!.variable}"`);
  const fields = names.length > 1 ? `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}` : names[0];
  throw new UserFileMemoryError(e, budgetBytes, fitsAt, fields, fitting);
}
