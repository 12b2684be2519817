import type { AttributeValue, DatasetType, DatasetVariable } from '../io/datasetReader';
import { NC_DEFAULT_FILL } from '../io/netcdf3Types';

/**
 * From stored numbers to values, following the CF Conventions (1.8, sections 2.5.1 and 8.1) and the
 * NetCDF Users Guide: a stored number is missing when it is not finite (NaN, ±Inf), equals
 * _FillValue, equals one of missing_value, or lies outside valid_min/valid_max/valid_range; all
 * compared in the stored (packed) type. Without _FillValue, the format's default fill value of the
 * type counts as missing (not for 8-bit types, whose whole range is data). The others are unpacked,
 * value = stored·scale_factor + add_offset, then multiplied by `factor` (unit conversion). Missing
 * values become NaN, and every analysis skips NaN: they are masked, never averaged in.
 */
export interface ValueRule {
  fills: number[];
  validMin: number;
  validMax: number;
  scale: number;
  offset: number;
  factor: number;
}

/** Why values were masked, counted over everything read through one rule. */
export interface MaskCounts {
  total: number;
  nonFinite: number;
  fill: number;
  outOfRange: number;
}

export function newMaskCounts(): MaskCounts {
  return { total: 0, nonFinite: 0, fill: 0, outOfRange: 0 };
}

const DEFAULT_FILL: Partial<Record<DatasetType, number>> = {
  int16: NC_DEFAULT_FILL.short,
  int32: NC_DEFAULT_FILL.int,
  float32: Math.fround(NC_DEFAULT_FILL.float),
  float64: NC_DEFAULT_FILL.double,
};

/** The rule of a variable's attributes; `factor` converts the unpacked values (e.g. cm/s → m/s). */
export function valueRule(v: DatasetVariable, factor = 1): ValueRule {
  const a = v.attributes;
  const nums = (x: AttributeValue | undefined): number[] => (typeof x === 'number' ? [x] : Array.isArray(x) ? x : []);
  // Stored-type comparisons: a float32 attribute read as a double is the same double as the data.
  const asStored = (x: number) => (v.type === 'float32' ? Math.fround(x) : x);
  const fills = [...nums(a._FillValue), ...nums(a.missing_value)].map(asStored);
  if (a._FillValue === undefined && DEFAULT_FILL[v.type] !== undefined) fills.push(DEFAULT_FILL[v.type] as number);
  let validMin = -Infinity;
  let validMax = Infinity;
  const range = nums(a.valid_range);
  if (range.length === 2) [validMin, validMax] = [asStored(range[0]), asStored(range[1])];
  if (nums(a.valid_min).length) validMin = asStored(nums(a.valid_min)[0]);
  if (nums(a.valid_max).length) validMax = asStored(nums(a.valid_max)[0]);
  const scale = nums(a.scale_factor)[0] ?? 1;
  const offset = nums(a.add_offset)[0] ?? 0;
  return { fills, validMin, validMax, scale, offset, factor };
}

/**
 * Applies the rule to `raw` (stored numbers) into out (may be raw itself): values or NaN. Counts
 * into `counts`; returns how many were masked.
 */
export function applyValueRule(rule: ValueRule, raw: Float64Array, out: Float64Array, counts: MaskCounts): number {
  const { fills, validMin, validMax } = rule;
  const s = rule.scale * rule.factor;
  const o = rule.offset * rule.factor;
  const nf = fills.length;
  let masked = 0;
  for (let i = 0; i < raw.length; i++) {
    const x = raw[i];
    if (!Number.isFinite(x)) {
      counts.nonFinite++;
    } else if (nf > 0 && (x === fills[0] || (nf > 1 && fills.includes(x)))) {
      counts.fill++;
    } else if (x < validMin || x > validMax) {
      counts.outOfRange++;
    } else {
      out[i] = x * s + o;
      continue;
    }
    out[i] = NaN;
    masked++;
  }
  counts.total += raw.length;
  return masked;
}
