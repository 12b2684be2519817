import type { DatasetReader, DatasetVariable } from '../io/datasetReader';
import { degreesOf, lengthUnits } from './unitsText';
import { printable } from '../io/fileErrors';

/**
 * A horizontal coordinate of a user's file, checked to be regular: positions x_i = start + i·spacing
 * (in the coordinate's own units, ascending; a descending file axis is flagged `reversed` and read
 * back to front). Kind: Cartesian x or y (m, km, cm, or the file's model units) or longitude/latitude
 * (degrees). An axis whose positions deviate from the regular sequence by more than `tolerance` of
 * the spacing is refused, naming the axis and its worst deviation.
 */
export type AxisKind = 'x' | 'y' | 'longitude' | 'latitude';

export interface CoordinateAxis {
  /** Dimension name, and the coordinate variable's name (null when the dimension has none). */
  dimension: string;
  variable: string | null;
  kind: AxisKind;
  n: number;
  /** First position and spacing in the axis units, ascending order. */
  start: number;
  spacing: number;
  reversed: boolean;
  units: string;
  /** Metres per axis unit (Cartesian SI axes), 'model' for the file's own units, 'degrees' for lon/lat. */
  scale: number | 'model' | 'degrees';
  /** Largest |x_i − (start + i·spacing)| over the spacing. */
  irregularity: number;
  /** Period in axis units when the file states one (see `knownPeriod`), and where it was found. */
  period: number | null;
  periodSource: string | null;
}

/** Default tolerance of the regular-spacing check: 1e-3 of the spacing (single-precision coordinates pass). */
export const SPACING_TOLERANCE = 1e-3;

/** Checks that values are regular (within tolerance·spacing); returns start, spacing, direction. */
export function regularSpacing(
  name: string,
  values: Float64Array,
  tolerance = SPACING_TOLERANCE,
): { start: number; spacing: number; reversed: boolean; irregularity: number } {
  const n = values.length;
  if (n < 2) throw new RangeError(`axis "${name}" has ${n} point${n === 1 ? '' : 's'}; at least 2 are needed`);
  for (let i = 0; i < n; i++)
    if (!Number.isFinite(values[i]))
      throw new RangeError(`axis "${name}" has a missing or non-finite position at index ${i}`);
  const spacing = (values[n - 1] - values[0]) / (n - 1);
  if (spacing === 0) throw new RangeError(`axis "${name}" has equal first and last positions`);
  let worst = 0;
  let at = 0;
  for (let i = 0; i < n; i++) {
    const dev = Math.abs(values[i] - (values[0] + i * spacing));
    if (dev > worst) {
      worst = dev;
      at = i;
    }
  }
  const irregularity = worst / Math.abs(spacing);
  if (irregularity > tolerance) {
    throw new RangeError(
      `irregular grid: axis "${name}" is not regularly spaced — its worst deviation from a regular spacing of ${fmt(Math.abs(spacing))} is ${fmt(worst)} at index ${at} ` +
        `(${fmt(100 * irregularity)}% of the spacing; the tolerance is ${fmt(100 * tolerance)}%). Stria's diagnostics need a regular grid: interpolate onto one first`,
    );
  }
  const reversed = spacing < 0;
  return { start: reversed ? values[n - 1] : values[0], spacing: Math.abs(spacing), reversed, irregularity };
}

/**
 * The axis of dimension `dim`, whose role in the field (x: eastward, y: northward) is `role`. The
 * coordinate variable of the same name gives positions; without one, `length` (the domain length in
 * model units, if the user gave it) places points at i·length/n, else the axis is refused.
 */
export function coordinateAxis(
  reader: DatasetReader,
  dim: string,
  role: 'x' | 'y',
  options: { tolerance?: number; length?: number; filePeriod?: { period: number; source: string } } = {},
): CoordinateAxis {
  const n = reader.dimensions.find((d) => d.name === dim)?.size ?? 0;
  const coord = reader.has(dim) ? reader.variable(dim) : null;
  if (!coord || coord.shape.length !== 1) {
    if (options.length === undefined)
      throw new RangeError(
        `dimension "${dim}" has no coordinate variable, so its positions are unknown: give the domain length (--domain) to place its ${n} points at i·L/${n}`,
      );
    return {
      dimension: dim,
      variable: null,
      kind: role,
      n,
      start: 0,
      spacing: options.length / n,
      reversed: false,
      units: '1',
      scale: 'model',
      irregularity: 0,
      period: options.length,
      periodSource: 'the domain length given',
    };
  }
  const values = reader.readAll(dim);
  const { start, spacing, reversed, irregularity } = regularSpacing(dim, values, options.tolerance);
  const units = typeof coord.attributes.units === 'string' ? coord.attributes.units : undefined;
  const deg = degreesOf(units) ?? standardDegrees(coord);
  let kind: AxisKind = role;
  let scale: CoordinateAxis['scale'];
  if (deg) {
    if ((deg === 'east') !== (role === 'x'))
      throw new RangeError(
        `axis "${dim}" is in degrees_${deg} but is the ${role === 'x' ? 'second' : 'first'} of the field's horizontal dimensions, where ${role === 'x' ? 'longitude' : 'latitude'} was expected`,
      );
    kind = deg === 'east' ? 'longitude' : 'latitude';
    scale = 'degrees';
  } else {
    const u = lengthUnits(units);
    if (u.kind === 'unknown')
      throw new RangeError(
        `axis "${dim}" has units "${printable(u.text)}", which Stria does not read as a length (m, km, cm, degrees_east/degrees_north, or "1" for model units)`,
      );
    scale = u.kind === 'si' ? u.factor : 'model';
  }
  const { period, source } =
    options.filePeriod && options.length === undefined
      ? { period: options.filePeriod.period, source: options.filePeriod.source }
      : knownPeriod(coord, kind, options.length);
  return {
    dimension: dim,
    variable: dim,
    kind,
    n,
    start,
    spacing,
    reversed,
    units: units ?? '1',
    scale,
    irregularity,
    period,
    periodSource: source,
  };
}

function standardDegrees(v: DatasetVariable): 'east' | 'north' | null {
  const sn = v.attributes.standard_name;
  if (sn === 'longitude') return 'east';
  if (sn === 'latitude') return 'north';
  return null;
}

/**
 * A period the file or the user states for an axis: 360 for longitude; a numeric `modulo` attribute
 * on the coordinate (a practice some datasets follow for cyclic axes) [practice]; the domain length
 * the user gave. Latitude has none.
 */
function knownPeriod(
  v: DatasetVariable,
  kind: AxisKind,
  length?: number,
): { period: number | null; source: string | null } {
  if (kind === 'latitude') return { period: null, source: null };
  if (length !== undefined) return { period: length, source: 'the domain length given' };
  if (kind === 'longitude') return { period: 360, source: 'longitude (360°)' };
  const m = v.attributes.modulo;
  if (typeof m === 'number' && m > 0) return { period: m, source: `the "modulo" attribute of "${v.name}"` };
  return { period: null, source: null };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
