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

type Hint = 'x' | 'y' | 't' | null;

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
  }
  if (/^(x|xc|xh|xt|xu|xq|lon|long|longitude|nav_lon|x_.*|lon_.*)$/i.test(dim)) return 'x';
  if (/^(y|yc|yh|yt|yu|yq|lat|latitude|nav_lat|y_.*|lat_.*)$/i.test(dim)) return 'y';
  if (/^(t|time|times|ocean_time|record|rec)$/i.test(dim) || reader.dimensions.find((d) => d.name === dim)?.unlimited)
    return 't';
  return null;
}

/** The record dimension among the leading ones: at most one longer than 1. */
export function recordAxis(reader: DatasetReader, v: DatasetVariable, lead: string[]): RecordAxis {
  const long = lead.map((d, k) => ({ d, n: v.shape[k] })).filter((e) => e.n !== 1);
  if (long.length > 1) {
    throw new RangeError(
      `"${v.name}" has ${long.length} dimensions besides its horizontal ones longer than 1 (${long.map((e) => `${e.d} = ${e.n}`).join(', ')}): Stria analyses a 2D field over records; extract one level first`,
    );
  }
  const dimension = long[0]?.d ?? (lead.length ? lead[0] : null);
  const count = long[0]?.n ?? (lead.length ? v.shape[0] : 1);
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
