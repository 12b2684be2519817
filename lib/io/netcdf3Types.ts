/**
 * The in-memory description of a NetCDF-3 file (classic CDF-1 or 64-bit offset CDF-2), as the writer
 * takes it. Terms and codes follow the NetCDF Classic Format Specification (Unidata, "The NetCDF
 * Classic Format Specification", an open standard): dimensions, global and variable attributes,
 * variables whose first dimension may be the single unlimited ("record") dimension.
 *
 * Dimensions are referred to by name. Arrays are row-major (last dimension fastest), as the format
 * stores them, so a Stria field with index j·nx + i goes out as dimensions (y, x) unchanged.
 */

/** The six external types of the classic data model. */
export type NcType = 'byte' | 'char' | 'short' | 'int' | 'float' | 'double';

export interface NcDimension {
  name: string;
  /** Length of a fixed dimension, a positive integer. Omit for the unlimited dimension. */
  size?: number;
  /** The record dimension; at most one per file. Its length is the number of records. */
  unlimited?: boolean;
}

/** Numeric attribute: one value or a non-empty list. Text attribute: a string (stored UTF-8). */
export type NcAttribute =
  | { name: string; type: 'char'; value: string }
  | { name: string; type: Exclude<NcType, 'char'>; value: number | ArrayLike<number> };

/**
 * Values of a variable, row-major: numbers for numeric types, bytes (or a string, stored UTF-8)
 * for char. A record variable holds all its records back to back (record index slowest).
 */
export type NcData = ArrayLike<number> | Uint8Array | string;

export interface NcVariable {
  name: string;
  type: NcType;
  /** Dimension names, slowest first; the unlimited dimension may only come first. */
  dimensions: readonly string[];
  attributes?: readonly NcAttribute[];
  /** Required for fixed variables; for record variables the record count follows from its length. */
  data?: NcData;
}

/** 'cdf2' (64-bit offsets, magic 'CDF\x02') is the default; 'cdf1' is the classic format. */
export type NcFormat = 'cdf1' | 'cdf2';

export interface NcFile {
  format?: NcFormat;
  dimensions: readonly NcDimension[];
  attributes?: readonly NcAttribute[];
  variables: readonly NcVariable[];
}

/** nc_type codes of the specification (NC_BYTE = 1 … NC_DOUBLE = 6). */
export const NC_TYPE_CODE: Readonly<Record<NcType, number>> = {
  byte: 1,
  char: 2,
  short: 3,
  int: 4,
  float: 5,
  double: 6,
};

/** External size in bytes of one value. */
export const NC_TYPE_SIZE: Readonly<Record<NcType, number>> = {
  byte: 1,
  char: 1,
  short: 2,
  int: 4,
  float: 4,
  double: 8,
};

/** The specification's default fill values, used for data padding when no _FillValue is given. */
export const NC_DEFAULT_FILL: Readonly<Record<NcType, number>> = {
  byte: -127,
  char: 0,
  short: -32767,
  int: -2147483647,
  float: 9.969209968386869e36,
  double: 9.969209968386869e36,
};

/** Header tags of the specification. */
export const NC_DIMENSION_TAG = 0x0a;
export const NC_VARIABLE_TAG = 0x0b;
export const NC_ATTRIBUTE_TAG = 0x0c;

/** Byte offset of the numrecs field (right after the 4-byte magic) in both CDF-1 and CDF-2. */
export const NUMRECS_OFFSET = 4;

/** numrecs value reserved for an indeterminate record count. */
export const NC_STREAMING = 0xffffffff;

/** Largest value of the format's NON_NEG fields (a non-negative 32-bit signed INT). */
export const NC_MAX_NON_NEG = 0x7fffffff;

/** Largest vsize that fits the 32-bit field (the spec stores 2³²−1 for larger, which we refuse). */
export const NC_MAX_VSIZE = 0xffffffff - 3;

/** Rounds a byte count up to the next multiple of four (the format's padding rule). */
export function pad4(n: number): number {
  return n + ((4 - (n % 4)) % 4);
}

/** Attribute builders, so that descriptions read as a list of name/value pairs. */
export const ncText = (name: string, value: string): NcAttribute => ({ name, type: 'char', value });
export const ncDouble = (name: string, value: number | ArrayLike<number>): NcAttribute => ({
  name,
  type: 'double',
  value,
});
export const ncFloat = (name: string, value: number | ArrayLike<number>): NcAttribute => ({
  name,
  type: 'float',
  value,
});
export const ncInt = (name: string, value: number | ArrayLike<number>): NcAttribute => ({ name, type: 'int', value });
