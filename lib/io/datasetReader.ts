import type { AllocationMeter } from './allocationMeter';

/**
 * One view of a NetCDF file, whichever format holds it: NetCDF-3 (classic CDF-1, 64-bit offset
 * CDF-2) or netCDF-4 (HDF5). Dimensions, variables and attributes as the NetCDF data model names
 * them; values read one record (one index of the first dimension) at a time, decoded to float64
 * as stored: no fill value masking, no scale_factor/add_offset (lib/userfile/fieldValues.ts does those).
 * Arrays are row-major, last dimension fastest, as both formats define them.
 */
export type DatasetFormat = 'netcdf3-classic' | 'netcdf3-64bit-offset' | 'netcdf4';

/** Storage types: the numeric ones can be read as values; char, string and other only as metadata. */
export type DatasetType =
  | 'int8'
  | 'uint8'
  | 'int16'
  | 'uint16'
  | 'int32'
  | 'uint32'
  | 'int64'
  | 'uint64'
  | 'float32'
  | 'float64'
  | 'char'
  | 'string'
  | 'other';

/** A text attribute is a string; a numeric one a number, or an array when it has several values. */
export type AttributeValue = string | number | number[];

export interface DatasetDimension {
  name: string;
  /** Length; for an unlimited dimension the current number of records. */
  size: number;
  unlimited: boolean;
}

export interface DatasetVariable {
  name: string;
  type: DatasetType;
  /** Dimension names, slowest first. */
  dimensions: string[];
  shape: number[];
  attributes: Record<string, AttributeValue>;
}

/** Progress of one read, in bytes of the values produced (done ≤ total). */
export interface ReadProgress {
  variable: string;
  record: number;
  done: number;
  total: number;
}

export interface ReadOptions {
  /** Output of exactly the right length (see `recordLength`, or `range.count`); a new array when absent. */
  out?: Float64Array;
  onProgress?: (p: ReadProgress) => void;
  /**
   * readRecord only: values [start, start + count) of the record (row-major, last dimension fastest)
   * instead of all of it, e.g. one row of a grid, so that a subsample of a large field is read without
   * holding a whole record.
   */
  range?: { start: number; count: number };
}

/**
 * The most values a reader allocates for one read of its own (a coordinate, the record of a caller
 * that gives no buffer): 2²⁷ doubles, 1 GiB. Larger reads take the caller's buffer, sized by a
 * memory estimate; a coordinate longer than this is a damaged dimension, not a grid.
 */
export const MAX_OWN_READ_VALUES = 2 ** 27;

/** A new buffer of n values for a read of `name`, refused past MAX_OWN_READ_VALUES. */
export function readBuffer(name: string, n: number): Float64Array {
  if (n > MAX_OWN_READ_VALUES)
    throw new RangeError(
      `"${name}" would be read as ${n} values at once, more than the ${MAX_OWN_READ_VALUES} a reader takes on its own: its dimensions are damaged, or far larger than Stria analyses`,
    );
  return new Float64Array(n);
}

/** The range a read covers within a record of n values, checked; the whole record by default. */
export function recordRange(name: string, n: number, range: ReadOptions['range']): { start: number; count: number } {
  if (!range) return { start: 0, count: n };
  const { start, count } = range;
  if (!(Number.isInteger(start) && Number.isInteger(count) && start >= 0 && count >= 0 && start + count <= n))
    throw new RangeError(`readRecord("${name}"): values ${start} to ${start + count} are not within a record of ${n}`);
  return range;
}

export interface DatasetReader {
  readonly format: DatasetFormat;
  readonly dimensions: readonly DatasetDimension[];
  readonly variables: readonly DatasetVariable[];
  /** Global attributes. */
  readonly attributes: Readonly<Record<string, AttributeValue>>;
  /** What the reader noticed and worked around or left out (shown in reports). */
  readonly notes: readonly string[];
  /** The variable of that name; a RangeError naming the variables the file has otherwise. */
  variable(name: string): DatasetVariable;
  has(name: string): boolean;
  /** Number of records: the length of the first dimension, 1 for a scalar. */
  recordCount(name: string): number;
  /** Values in one record: the product of the lengths after the first (all values of a 1-D variable: 1). */
  recordLength(name: string): number;
  /** Record `index` (index of the first dimension) of a numeric variable, or a range of it, as float64. */
  readRecord(name: string, index: number, options?: ReadOptions): Float64Array;
  /**
   * Bytes that reading one record of `name` allocates and drops again (decoded chunks and their
   * stored copies), for memory estimates before anything is read.
   */
  recordReadBytes(name: string): number;
  /** All values of a numeric variable (coordinates), as float64. */
  readAll(name: string, options?: ReadOptions): Float64Array;
}

/**
 * The lookups every reader shares, from its list of variables: by name (with the message naming what
 * the file has), and record count and length from the shape. Readers add their variables in file order.
 */
export abstract class NamedVariables {
  readonly variables: DatasetVariable[] = [];
  private readonly byName = new Map<string, DatasetVariable>();

  protected addVariable(v: DatasetVariable): void {
    this.variables.push(v);
    this.byName.set(v.name, v);
  }

  variable(name: string): DatasetVariable {
    const v = this.byName.get(name);
    if (!v)
      throw new RangeError(
        `the file has no variable "${name}" (it has ${this.variables.map((x) => `"${x.name}"`).join(', ') || 'none'})`,
      );
    return v;
  }

  has(name: string): boolean {
    return this.byName.has(name);
  }

  recordCount(name: string): number {
    const v = this.variable(name);
    return v.shape.length ? v.shape[0] : 1;
  }

  recordLength(name: string): number {
    return this.variable(name)
      .shape.slice(1)
      .reduce((a, b) => a * b, 1);
  }
}

/** What a reader may allocate through (for the memory bound; see allocationMeter.ts). */
export interface ReaderOptions {
  meter?: AllocationMeter;
}

export function isNumericType(t: DatasetType): boolean {
  return t !== 'char' && t !== 'string' && t !== 'other';
}

/** The HDF5 signature, at offset 0 of a netCDF-4 file. */
export const HDF5_SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a] as const;

export type FileKind = 'netcdf3' | 'hdf5';

/**
 * Which format the first bytes announce, or a RangeError that says what the file is not: not NetCDF
 * at all, NetCDF CDF-5 (64-bit data, not read), an HDF5 file with a user block (signature further in).
 */
export function sniffFormat(head: Uint8Array, byteLength: number): FileKind {
  if (byteLength === 0) throw new RangeError('not a NetCDF file: the file is empty');
  if (byteLength < 4) throw new RangeError(`not a NetCDF file: it is only ${byteLength} bytes long`);
  if (HDF5_SIGNATURE.every((b, i) => head[i] === b)) return 'hdf5';
  if (head[0] === 0x43 && head[1] === 0x44 && head[2] === 0x46) {
    if (head[3] === 1 || head[3] === 2) return 'netcdf3';
    if (head[3] === 5)
      throw new RangeError(
        'NetCDF CDF-5 (64-bit data) is not supported: Stria reads NetCDF-3 classic and 64-bit offset files and netCDF-4 (HDF5) files',
      );
    throw new RangeError(`not a NetCDF file: unknown version byte ${head[3]} after "CDF"`);
  }
  const shown = Array.from(head.subarray(0, 4), (b) => b.toString(16).padStart(2, '0')).join(' ');
  throw new RangeError(
    `not a NetCDF file: it starts with bytes ${shown}, neither "CDF" (NetCDF-3) nor the HDF5 signature (netCDF-4)`,
  );
}
