import { isNumericType, type DatasetReader, type DatasetVariable } from '../io/datasetReader';
import { timeUnits } from './unitsText';

/**
 * The dimensions of a user's fields: which are horizontal (x east, y north), which holds the
 * records, and the domain lengths a Stria-written file states. A dimension is marked by its
 * coordinate variable (CF: axis = X/Y/T, standard_name longitude/latitude/projection_x_coordinate/
 * …/time, units degrees_east/degrees_north or "… since …"), failing that by its name [practice].
 */
export interface RecordAxis {
  /** The record dimension (null: the fields have none, one record). */
  dimension: string | null;
  variable: string | null;
  count: number;
  units: string | null;
  /** Seconds per unit when the units are a time unit, else null. */
  secondsPer: number | null;
}

type Hint = 'x' | 'y' | 't' | 'z' | null;

/** 'grid' when the last two dimensions are horizontal, 'profile' when only the last is (a y axis). */
export function horizontal(reader: DatasetReader, v: DatasetVariable): 'grid' | 'profile' | null {
  const h = v.dimensions.map((d) => hintOf(reader, d));
  const n = h.length;
  const last2 = n >= 2 ? [h[n - 2], h[n - 1]] : [];
  if (last2.length === 2 && last2.every((k) => k === 'x' || k === 'y') && last2[0] !== last2[1]) return 'grid';
  if (n >= 1 && h[n - 1] === 'y' && !h.includes('x')) return 'profile';
  // Unmarked dimensions: two trailing dimensions of length > 1 are taken as a grid.
  if (n >= 2 && h.every((k) => k !== 'x' && k !== 'y') && v.shape[n - 1] > 1 && v.shape[n - 2] > 1) return 'grid';
  return null;
}

/** What a dimension's coordinate variable (or, failing that, its name) says it is. */
export function hintOf(reader: DatasetReader, dim: string): Hint {
  const c = reader.has(dim) ? reader.variable(dim) : null;
  if (c) {
    const a = c.attributes;
    const axis = typeof a.axis === 'string' ? a.axis.toUpperCase() : '';
    const sn = typeof a.standard_name === 'string' ? a.standard_name : '';
    const units = typeof a.units === 'string' ? a.units.toLowerCase() : '';
    if (
      axis === 'X' ||
      /^(longitude|grid_longitude|projection_x_coordinate)$/.test(sn) ||
      /^degrees?_?e(ast)?$/.test(units)
    )
      return 'x';
    if (
      axis === 'Y' ||
      /^(latitude|grid_latitude|projection_y_coordinate)$/.test(sn) ||
      /^degrees?_?n(orth)?$/.test(units)
    )
      return 'y';
    if (axis === 'T' || sn === 'time' || / since /.test(units)) return 't';
    if (axis === 'Z' || typeof a.positive === 'string' || VERTICAL_STANDARD_NAMES.test(sn)) return 'z';
  }
  if (VERTICAL_NAMES.test(dim)) return 'z';
  if (/^(x|xc|xh|xt|xu|xq|lon|long|longitude|nav_lon|x_.*|lon_.*)$/i.test(dim)) return 'x';
  if (/^(y|yc|yh|yt|yu|yq|lat|latitude|nav_lat|y_.*|lat_.*)$/i.test(dim)) return 'y';
  if (/^(t|time|times|ocean_time|record|rec)$/i.test(dim) || reader.dimensions.find((d) => d.name === dim)?.unlimited)
    return 't';
  return null;
}

/**
 * Vertical coordinates by CF standard name (CF 1.8 section 4.3 and appendix D; recalled): model
 * levels, depth and height, pressure, and the dimensionless vertical coordinates.
 */
const VERTICAL_STANDARD_NAMES =
  /^(model_level_number|depth|height|altitude|air_pressure|sea_water_pressure|atmosphere_.*_coordinate|ocean_.*_coordinate)$/;
/** Vertical dimensions by name [practice]. */
const VERTICAL_NAMES = /^(layer|layers|lay|lev|level|levels|z|zc|zl|zt|zi|depth|deptht|plev|pres|sigma|nlay|nz)$/i;

/**
 * A vertical (layer or level) dimension of the fields and which of its levels the analysis takes:
 * one (`index`, 0-based) or the depth-weighted mean of all (`index` null) with `weights` summing to 1.
 */
export interface LevelAxis {
  dimension: string;
  count: number;
  index: number | null;
  weights: Float64Array;
  /** Where the weights come from, in words. */
  weightsSource: string;
}

/** Which level to analyse: a layer number from 1 (counted along the dimension), or 'mean'. */
export type LevelChoice = number | 'mean';

/**
 * The vertical dimension among the leading ones (before the horizontal dimensions), if one longer
 * than 1 is marked so (hintOf: axis Z, a `positive` attribute, a vertical standard name, or a name
 * such as layer, lev, z, depth), with the level chosen. The weights of the depth-weighted mean: a
 * variable `layer_fraction` on that dimension (Stria's files), else the thickness of the levels from
 * the coordinate's CF `bounds`, else equal weights (said so). Null when there is none.
 */
export function levelAxis(
  reader: DatasetReader,
  v: DatasetVariable,
  lead: string[],
  choice: LevelChoice | undefined,
  notes: string[],
): LevelAxis | null {
  const k = lead.findIndex((d, i) => v.shape[i] > 1 && hintOf(reader, d) === 'z');
  if (k < 0) {
    if (choice !== undefined)
      throw new RangeError(
        `--layer ${choice}: "${v.name}" has no layer or vertical dimension (its dimensions: ${v.dimensions.join(', ')})`,
      );
    return null;
  }
  const dimension = lead[k];
  const count = v.shape[k];
  if (choice !== undefined && choice !== 'mean' && !(Number.isInteger(choice) && choice >= 1 && choice <= count))
    throw new RangeError(`--layer ${choice}: "${dimension}" has layers 1 to ${count}; give one of them or "mean"`);
  const { weights, source } = levelWeights(reader, dimension, count);
  const index = choice === undefined || choice === 'mean' ? null : choice - 1;
  notes.push(
    index === null
      ? `layers: the depth-weighted mean of the ${count} levels of "${dimension}" (weights ${Array.from(weights, (w) => Number(w.toPrecision(4))).join(', ')}, ${source})${choice === undefined ? '; pick one with --layer N' : ''}`
      : `layers: level ${index + 1} of the ${count} of "${dimension}"`,
  );
  return { dimension, count, index, weights, weightsSource: source };
}

function levelWeights(reader: DatasetReader, dim: string, n: number): { weights: Float64Array; source: string } {
  const norm = (w: ArrayLike<number>) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += w[i];
    return Float64Array.from({ length: n }, (_, i) => w[i] / s);
  };
  const valid = (w: ArrayLike<number>) => w.length === n && Array.from(w).every((x) => Number.isFinite(x) && x > 0);
  if (reader.has('layer_fraction')) {
    const f = reader.variable('layer_fraction');
    if (f.dimensions.length === 1 && f.dimensions[0] === dim && isNumericType(f.type)) {
      const w = reader.readAll('layer_fraction');
      if (valid(w)) return { weights: norm(w), source: 'the variable layer_fraction' };
    }
  }
  const c = reader.has(dim) ? reader.variable(dim) : null;
  const bounds = c && typeof c.attributes.bounds === 'string' ? c.attributes.bounds : null;
  if (bounds && reader.has(bounds)) {
    const b = reader.variable(bounds);
    if (b.shape.length === 2 && b.shape[0] === n && b.shape[1] === 2 && isNumericType(b.type)) {
      const v = reader.readAll(bounds);
      const w = Float64Array.from({ length: n }, (_, i) => Math.abs(v[2 * i + 1] - v[2 * i]));
      if (valid(w)) return { weights: norm(w), source: `the thickness of the levels from "${bounds}"` };
    }
  }
  return { weights: new Float64Array(n).fill(1 / n), source: 'equal: the file gives no thickness of its levels' };
}

/** The record dimension among the leading ones: at most one longer than 1. */
export function recordAxis(reader: DatasetReader, v: DatasetVariable, lead: string[], level?: string): RecordAxis {
  const long = lead.map((d, k) => ({ d, n: v.shape[k] })).filter((e) => e.n !== 1 && e.d !== level);
  if (long.length > 1) {
    throw new RangeError(
      `"${v.name}" has ${long.length} dimensions besides its horizontal ones longer than 1 (${long.map((e) => `${e.d} = ${e.n}`).join(', ')}): Stria analyses a 2D field over records; extract one level first`,
    );
  }
  const first = lead.length && lead[0] !== level ? lead[0] : null;
  const dimension = long[0]?.d ?? first;
  const count = long[0]?.n ?? (first !== null ? v.shape[0] : 1);
  if (count === 0) throw new RangeError(`"${v.name}" has no records (its ${dimension} dimension is empty)`);
  const c =
    dimension &&
    reader.has(dimension) &&
    reader.variable(dimension).shape.length === 1 &&
    isNumericType(reader.variable(dimension).type)
      ? reader.variable(dimension)
      : null;
  const units = c && typeof c.attributes.units === 'string' ? c.attributes.units : null;
  return { dimension, variable: c ? c.name : null, count, units, secondsPer: timeUnits(units ?? undefined).secondsPer };
}

/** Domain lengths of a Stria-written file (its stria_Lx, stria_Ly in model units, scaled to the file's). */
export function striaPeriods(reader: DatasetReader): {
  x?: { period: number; source: string };
  y?: { period: number; source: string };
} {
  const a = reader.attributes;
  if (typeof a.stria_file_kind !== 'string') return {};
  const unit = a.stria_units === 'physical' && typeof a.stria_length_unit_m === 'number' ? a.stria_length_unit_m : 1;
  const out: { x?: { period: number; source: string }; y?: { period: number; source: string } } = {};
  if (typeof a.stria_Lx === 'number') out.x = { period: a.stria_Lx * unit, source: 'the Stria attribute stria_Lx' };
  if (typeof a.stria_Ly === 'number') out.y = { period: a.stria_Ly * unit, source: 'the Stria attribute stria_Ly' };
  return out;
}
