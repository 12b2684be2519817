import type { AllocationMeter } from '../io/allocationMeter';
import type { UserGrid, UserRecordInfo, UserRecordSource, UserRole } from './userData';
import type { CoordinateAxis } from './coordinateAxis';
import type { DatasetReader } from '../io/datasetReader';
import type { Discovery } from './fieldDiscovery';
import { applyValueRule, newMaskCounts, valueRule, type MaskCounts, type ValueRule } from './fieldValues';
import { printable } from '../io/fileErrors';

/**
 * The fields that fieldDiscovery.ts found, as a UserRecordSource: one record at a time, masked
 * (fieldValues.ts), unpacked and converted to SI when the file gives SI units, reordered to Stria's
 * layout (y slow, both axes ascending). Longitude/latitude grids stay in degrees unless a tangent
 * plane is given: then, with R the planet's radius, φ0 and λ0 the central latitude and longitude,
 *   x = R cos φ0 (λ − λ0),   y = R (φ − φ0)   (metres),
 * which approximates the sphere: it keeps distances along φ0 and along meridians, and neglects the
 * convergence of meridians (x-distances are exact only at φ0), the curvature terms of the equations
 * and the variation of β with latitude. The analysis reports say so.
 */
export interface TangentPlaneSpec {
  /** Radius of the sphere (m), and what it is (e.g. "Earth's mean radius"). */
  radius: number;
  label: string;
  /** Central latitude and longitude (degrees); default the grid's centre. */
  lat0?: number;
  lon0?: number;
}

export interface FieldSourceOptions {
  tangentPlane?: TangentPlaneSpec;
  meter?: AllocationMeter;
  /**
   * Read every K-th point along x and y (K a whole number ≥ 1, default 1): the grid becomes
   * ⌈nx/K⌉ × ⌈ny/K⌉ points K spacings apart, read one file row at a time, so a field too large for
   * memory can still be analysed. Periodic only when K divides the number of points.
   */
  subsample?: number;
}

export interface UserFieldSource extends UserRecordSource {
  /** Masked values per field, by reason, over the records read so far. */
  readonly masks: Readonly<Partial<Record<UserRole, MaskCounts>>>;
  /** The tangent plane used (degrees), or null. */
  readonly plane: { lat0: number; lon0: number; radius: number; label: string } | null;
}

/** Tolerance for "the axis spans exactly one period": n·spacing within 1e-3 spacings of it. */
const PERIOD_TOLERANCE = 1e-3;

export function userFieldSource(
  reader: DatasetReader,
  d: Discovery,
  options: FieldSourceOptions = {},
): UserFieldSource {
  const notes: string[] = [];
  const K = options.subsample ?? 1;
  if (!(Number.isInteger(K) && K >= 1)) throw new RangeError(`subsample ${K} must be a whole number ≥ 1`);
  const thin = (a: CoordinateAxis): CoordinateAxis => ({ ...a, n: Math.ceil(a.n / K), spacing: a.spacing * K });
  const sampled: Discovery = K === 1 ? d : { ...d, x: d.x ? thin(d.x) : null, y: thin(d.y) };
  if (K > 1)
    notes.push(
      `read every ${ordinal(K)} point in x and y: a ${sampled.x?.n ?? 1} × ${sampled.y.n} subsample of the ${d.x?.n ?? 1} × ${d.y.n} grid, ${K} spacings apart`,
    );
  const { grid, plane } = buildGrid(sampled, options.tangentPlane, notes);
  const roles = Object.keys(d.fields) as UserRole[];
  const lead = d.dimensions.slice(0, d.dimensions.length - (d.layout === 'gridded' ? 2 : 1));
  const recordDim = d.records.dimension;
  if (recordDim !== null && lead.indexOf(recordDim) > 0)
    throw new RangeError(
      `the record dimension "${recordDim}" must come first in the fields' dimensions (${d.dimensions.join(', ')})`,
    );
  const perRecord = lead.length > 0;
  const nFile = (d.x?.n ?? 1) * d.y.n;
  const level = d.level;
  const rules = new Map<UserRole, ValueRule>();
  const masks: Partial<Record<UserRole, MaskCounts>> = {};
  for (const r of roles) {
    const f = d.fields[r] as { variable: string; factor: number };
    const v = reader.variable(f.variable);
    // The values a record holds must be the points its axes give (a damaged file may say otherwise).
    const held = v.shape.slice(lead.length).reduce((a, b) => a * b, 1);
    if (held !== nFile)
      throw new RangeError(
        `"${f.variable}" holds ${held} values a record, but its axes give ${nFile} points (${d.x ? `${d.x.n} × ` : ''}${d.y.n}): the file's dimensions do not agree`,
      );
    rules.set(r, valueRule(v, f.factor));
    masks[r] = newMaskCounts();
  }
  const needsReorder = K === 1 && (d.order === 'xy' || d.y.reversed || !!d.x?.reversed);
  const f64 = (n: number) => (options.meter ? options.meter.f64(n, 'read buffer') : new Float64Array(n));
  // Fields in the file's order are read straight into the analysis buffers; others through one
  // buffer; a subsample through one row of the file. With a layer dimension, each layer's slab is
  // read on its own (slabReader), and the depth-weighted mean gathered in one more buffer.
  const raw = needsReorder ? f64(nFile) : new Float64Array(0);
  const slab = level ? slabReader(reader, d, K, f64) : null;
  const layerSum =
    level && level.index === null ? f64(K > 1 ? Math.ceil((d.x?.n ?? 1) / K) * Math.ceil(d.y.n / K) : nFile) : null;
  const rows = K > 1 && !level ? rowReader(reader, d, K, perRecord, f64) : null;
  const times = d.records.variable ? reader.readAll(d.records.variable) : null;
  const read = (
    r: number,
    into: Partial<Record<UserRole, Float64Array>>,
    onProgress?: (done: number, total: number) => void,
  ): UserRecordInfo => {
    if (!(Number.isInteger(r) && r >= 0 && r < d.records.count))
      throw new RangeError(`record ${r} does not exist (the file has ${d.records.count})`);
    let k = 0;
    for (const role of roles) {
      const out = into[role];
      if (!out) continue;
      const name = (d.fields[role] as { variable: string }).variable;
      const target = needsReorder ? raw : out;
      // Progress in bytes of the float64 values produced, over all the record's fields.
      const report = (p: { done: number; total: number }) =>
        onProgress?.((k + p.done / Math.max(p.total, 1)) * 8 * nFile, roles.length * 8 * nFile);
      const rule = rules.get(role) as ValueRule;
      const mask = masks[role] as MaskCounts;
      const dest = K > 1 ? out : target;
      if (slab && level && level.index !== null) {
        slab(name, r, level.index, dest, report);
        applyValueRule(rule, dest, dest, mask);
      } else if (slab && level && layerSum) {
        // The depth-weighted mean Σ w_l f_l, each layer masked as read (a masked point stays NaN).
        dest.fill(0);
        for (let l = 0; l < level.count; l++) {
          slab(name, r, l, layerSum, report);
          applyValueRule(rule, layerSum, layerSum, mask);
          const w = level.weights[l];
          for (let i = 0; i < dest.length; i++) dest[i] += w * layerSum[i];
        }
      } else {
        if (rows) rows(name, r, out, report);
        else if (perRecord) reader.readRecord(name, r, { out: target, onProgress: report });
        else reader.readAll(name, { out: target, onProgress: report });
        applyValueRule(rule, target, target, mask);
      }
      if (needsReorder) reorder(raw, out, d);
      k++;
    }
    return { time: times ? times[r] : null };
  };
  return {
    grid: { ...grid, notes: [...grid.notes, ...notes] },
    roles,
    recordCount: d.records.count,
    timeUnits: d.records.units,
    read,
    masks,
    plane,
  };
}

/**
 * Reads every K-th point of a record into Stria's order, one file row at a time: the rows of the
 * file's slower horizontal dimension at every K-th position, counted from the first point of
 * Stria's ascending order (the last of a reversed axis), each row read whole (the only buffer of the
 * file's size in one dimension) and sampled at every K-th position along it.
 */
function rowReader(
  reader: DatasetReader,
  d: Discovery,
  K: number,
  perRecord: boolean,
  f64: (n: number) => Float64Array,
): (name: string, r: number, out: Float64Array, report: (p: { done: number; total: number }) => void) => void {
  const nx = d.x?.n ?? 1;
  const ny = d.y.n;
  const sx = Math.ceil(nx / K);
  // The file's order: rows along its slower horizontal dimension, values along the faster one.
  const xy = d.order === 'xy' && !!d.x;
  const slow = d.layout === 'gridded' ? (xy ? { n: nx, rev: !!d.x?.reversed } : { n: ny, rev: d.y.reversed }) : null;
  const fast =
    d.layout === 'gridded'
      ? xy
        ? { n: ny, rev: d.y.reversed }
        : { n: nx, rev: !!d.x?.reversed }
      : { n: ny, rev: d.y.reversed };
  const row = f64(fast.n);
  const at = (k: number, axis: { n: number; rev: boolean }) => (axis.rev ? axis.n - 1 - k * K : k * K);
  const nSlow = slow ? Math.ceil(slow.n / K) : 1;
  const nFast = Math.ceil(fast.n / K);
  return (name, r, out, report) => {
    for (let a = 0; a < nSlow; a++) {
      const fileRow = slow ? at(a, slow) : 0;
      if (!perRecord && slow) reader.readRecord(name, fileRow, { out: row });
      else if (!perRecord) reader.readAll(name, { out: row });
      else reader.readRecord(name, r, { out: row, range: { start: fileRow * fast.n, count: fast.n } });
      for (let b = 0; b < nFast; b++) {
        // Stria's indices (i east, j north) of sample (a, b).
        const [i, j] = !slow ? [0, b] : xy ? [a, b] : [b, a];
        out[j * sx + i] = row[at(b, fast)];
      }
      report({ done: a + 1, total: nSlow });
    }
  };
}

/**
 * Reads the slab of one layer l of record r of a field with a layer dimension (fieldAxes.ts
 * levelAxis) into `out`: nx·ny values in the file's order, or with a subsample (K > 1) every K-th
 * point in Stria's order, one file row at a time. The slab starts at the flat offset r·(values after
 * the record dimension) + l·(values after the layer dimension), read as that range of the right
 * record of the variable's first dimension (whichever of the two comes first, or a dimension of
 * length 1), so no more than a slab, or a row, is read.
 */
function slabReader(
  reader: DatasetReader,
  d: Discovery,
  K: number,
  f64: (n: number) => Float64Array,
): (
  name: string,
  r: number,
  l: number,
  out: Float64Array,
  report: (p: { done: number; total: number }) => void,
) => void {
  const level = d.level as NonNullable<Discovery['level']>;
  const nFile = (d.x?.n ?? 1) * d.y.n;
  const strideAfter = (v: { dimensions: string[]; shape: number[] }, dim: string | null) => {
    if (dim === null) return 0;
    const k = v.dimensions.indexOf(dim);
    return v.shape.slice(k + 1).reduce((a, b) => a * b, 1);
  };
  const read = (
    name: string,
    flat: number,
    count: number,
    out: Float64Array,
    report?: (p: { done: number; total: number }) => void,
  ) => {
    const v = reader.variable(name);
    const recLen = v.shape.slice(1).reduce((a, b) => a * b, 1);
    const idx = Math.floor(flat / recLen);
    reader.readRecord(name, idx, { out, range: { start: flat - idx * recLen, count }, onProgress: report });
  };
  if (K === 1)
    return (name, r, l, out, report) => {
      const v = reader.variable(name);
      read(name, r * strideAfter(v, d.records.dimension) + l * strideAfter(v, level.dimension), nFile, out, report);
    };
  const nx = d.x?.n ?? 1;
  const ny = d.y.n;
  const sx = Math.ceil(nx / K);
  const xy = d.order === 'xy' && !!d.x;
  const gridded = d.layout === 'gridded';
  const slow = gridded ? (xy ? { n: nx, rev: !!d.x?.reversed } : { n: ny, rev: d.y.reversed }) : null;
  const fast = gridded
    ? xy
      ? { n: ny, rev: d.y.reversed }
      : { n: nx, rev: !!d.x?.reversed }
    : { n: ny, rev: d.y.reversed };
  const row = f64(fast.n);
  const at = (k: number, axis: { n: number; rev: boolean }) => (axis.rev ? axis.n - 1 - k * K : k * K);
  const nSlow = slow ? Math.ceil(slow.n / K) : 1;
  const nFast = Math.ceil(fast.n / K);
  return (name, r, l, out, report) => {
    const v = reader.variable(name);
    const base = r * strideAfter(v, d.records.dimension) + l * strideAfter(v, level.dimension);
    for (let a = 0; a < nSlow; a++) {
      const fileRow = slow ? at(a, slow) : 0;
      read(name, base + fileRow * fast.n, fast.n, row);
      for (let b = 0; b < nFast; b++) {
        const [i, j] = !slow ? [0, b] : xy ? [a, b] : [b, a];
        out[j * sx + i] = row[at(b, fast)];
      }
      report({ done: a + 1, total: nSlow });
    }
  };
}

/** 2nd, 3rd, 4th, …, 21st, 22nd. */
export function ordinal(k: number): string {
  const tens = k % 100;
  const suffix =
    tens >= 11 && tens <= 13 ? 'th' : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[k % 10] ?? 'th');
  return `${k}${suffix}`;
}

/** Stria's order from the file's: target (i east, j north) from the file's (possibly transposed, reversed) index. */
function reorder(src: Float64Array, out: Float64Array, d: Discovery): void {
  const nx = d.x?.n ?? 1;
  const ny = d.y.n;
  const rx = !!d.x?.reversed;
  const ry = d.y.reversed;
  for (let j = 0; j < ny; j++) {
    const jf = ry ? ny - 1 - j : j;
    for (let i = 0; i < nx; i++) {
      const ifl = rx ? nx - 1 - i : i;
      out[j * nx + i] = d.order === 'yx' ? src[jf * nx + ifl] : src[ifl * ny + jf];
    }
  }
}

function buildGrid(
  d: Discovery,
  tp: TangentPlaneSpec | undefined,
  notes: string[],
): { grid: UserGrid; plane: UserFieldSource['plane'] } {
  const { x, y } = d;
  const lonlat = y.kind === 'latitude' || x?.kind === 'longitude';
  if (lonlat && !(y.kind === 'latitude' && (!x || x.kind === 'longitude')))
    throw new RangeError(
      'the grid mixes degrees with lengths on its two axes; Stria reads a longitude/latitude grid or an x/y grid',
    );
  const periodicX = x ? axisPeriodic(x, notes) : false;
  const periodicY = y.kind === 'latitude' ? false : axisPeriodic(y, notes);
  if (y.kind === 'latitude') notes.push('y: latitude is not periodic');
  if (lonlat && tp) {
    const deg = Math.PI / 180;
    const lat0 = tp.lat0 ?? y.start + ((y.n - 1) * y.spacing) / 2;
    const lon0 = tp.lon0 ?? (x ? x.start + ((x.n - 1) * x.spacing) / 2 : 0);
    if (!(Math.abs(lat0) < 90))
      throw new RangeError(`the central latitude ${lat0}° must lie strictly between −90° and 90°`);
    const c = Math.cos(lat0 * deg);
    notes.push(
      `geometry: longitude/latitude mapped onto the plane tangent to a sphere of radius R = ${tp.radius} m (${tp.label}) at φ0 = ${round(lat0)}°, λ0 = ${round(lon0)}°: ` +
        'x = R cos φ0 (λ − λ0), y = R (φ − φ0). This approximates the spherical geometry: x-distances are exact only at φ0, and curvature terms and the variation of β with latitude are neglected',
    );
    const grid: UserGrid = {
      nx: x?.n ?? 1,
      ny: y.n,
      lengthUnit: 'm',
      periodicX,
      periodicY,
      notes: [],
      x0: x ? tp.radius * c * (x.start - lon0) * deg : 0,
      dx: x ? tp.radius * c * x.spacing * deg : 1,
      y0: tp.radius * (y.start - lat0) * deg,
      dy: tp.radius * y.spacing * deg,
    };
    return { grid, plane: { lat0, lon0, radius: tp.radius, label: tp.label } };
  }
  if (lonlat)
    notes.push(
      'geometry: longitude/latitude in degrees, not mapped onto a plane (give a planet to map it): diagnostics that need lengths are skipped',
    );
  const sx = x ? x.scale : y.scale;
  if (!lonlat && x && (x.scale === 'model') !== (y.scale === 'model'))
    throw new RangeError(
      `the axes are in different unit systems: "${x.dimension}" in "${printable(x.units)}", "${y.dimension}" in "${printable(y.units)}"`,
    );
  const f = (a: CoordinateAxis) => (typeof a.scale === 'number' ? a.scale : 1);
  const grid: UserGrid = {
    nx: x?.n ?? 1,
    ny: y.n,
    lengthUnit: lonlat ? 'degrees' : sx === 'model' ? 'model' : 'm',
    periodicX,
    periodicY,
    notes: [],
    x0: x ? x.start * f(x) : 0,
    dx: x ? x.spacing * f(x) : 1,
    y0: y.start * f(y),
    dy: y.spacing * f(y),
  };
  return { grid, plane: null };
}

/** true/false when the axis has a known period (it spans exactly one, or not); null when unknown. */
function axisPeriodic(a: CoordinateAxis, notes: string[]): boolean | null {
  if (a.period === null) return null;
  const span = a.n * a.spacing;
  const ok = Math.abs(span - a.period) <= PERIOD_TOLERANCE * a.spacing;
  notes.push(
    `${a.kind === 'longitude' || a.kind === 'x' ? 'x' : 'y'}: ${ok ? 'periodic' : 'not periodic'} — ${a.n} points × spacing ${round(a.spacing)} = ${round(span)} ${ok ? 'equals' : 'differs from'} the period ${round(a.period)} (${a.periodSource})`,
  );
  return ok;
}

function round(x: number): string {
  return Number(x.toPrecision(6)).toString();
}
