import { NetCDFReader } from 'netcdfjs';
import { NC_STREAMING, NC_TYPE_SIZE, pad4, type NcType } from './netcdf3Types';
import { decodeSlab, newArray, type NcArray } from './netcdfDecode';
import { attributesOf, utf8FromNetcdfjs, type NcAttributeValue, type RawAttribute } from './netcdfjsHeader';

export { decodeSlab, type NcArray, type NcAttributeValue };

/**
 * Reading NetCDF-3 (CDF-1 and CDF-2) bytes into a small typed view. The header is parsed by the
 * netcdfjs library; data are decoded here, straight from the big-endian bytes at the offsets the
 * header gives, one slab at a time, so a single time record is read without decoding the others
 * (netcdfjs 4 decodes only whole variables, into JS arrays). Record strides follow the NetCDF
 * classic format specification, including the packed single-record-variable case.
 *
 * For large files, open a prefix holding the header with `{ headerOnly: true }`, then read the
 * byte ranges that `slabRange` gives and decode them with `decodeSlab`.
 */
export interface NcReadDimension {
  name: string;
  /** Length; for the unlimited dimension, the number of records. */
  size: number;
  unlimited: boolean;
}

export interface NcReadVariable {
  name: string;
  type: NcType;
  dimensions: string[];
  /** Lengths of the dimensions, the record count first for a record variable. */
  shape: number[];
  attributes: Record<string, NcAttributeValue>;
  isRecord: boolean;
  /** Values in one record (record variable) or in all (fixed variable). */
  slabCount: number;
  /** Byte offset of the data (of record 0 for a record variable). */
  begin: number;
}

export interface NetcdfFile {
  format: 'cdf1' | 'cdf2';
  dimensions: NcReadDimension[];
  attributes: Record<string, NcAttributeValue>;
  /** In header order. */
  variables: NcReadVariable[];
  numRecords: number;
  /** Bytes from one record to the next. */
  recordSize: number;
  variable(name: string): NcReadVariable;
  /** Byte range of record `index` of a record variable, or of all of a fixed variable (index 0). */
  slabRange(name: string, index?: number): { offset: number; byteLength: number };
  /** One record of a record variable (or all of a fixed variable), into `out` when given. */
  readRecord(name: string, index: number, out?: NcArray): NcArray;
  /** All values of a variable, records back to back. */
  readVariable(name: string): NcArray;
}

const TYPE_NAMES: readonly NcType[] = ['byte', 'char', 'short', 'int', 'float', 'double'];

/** Parses the header of NetCDF-3 bytes; refuses other formats and truncated or corrupt files clearly. */
export function readNetcdf(input: ArrayBuffer | Uint8Array, options: { headerOnly?: boolean } = {}): NetcdfFile {
  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  checkMagic(bytes);
  let reader: NetCDFReader;
  try {
    reader = new NetCDFReader(bytes);
  } catch (e) {
    if (e instanceof RangeError)
      throw new RangeError(
        `truncated or corrupt NetCDF file: the header runs past the end of the ${bytes.length} bytes given`,
        { cause: e },
      );
    throw new RangeError(`cannot read this NetCDF file: ${(e as Error).message}`, { cause: e });
  }
  const h = reader.header;
  const recordId = h.recordDimension.id;
  const dims = h.dimensions ?? [];
  const variables: NcReadVariable[] = (h.variables ?? []).map((v) => {
    const type = v.type as NcType;
    if (!TYPE_NAMES.includes(type))
      throw new RangeError(`corrupt NetCDF file: variable ${JSON.stringify(v.name)} has an unknown type`);
    const isRecord = v.record;
    let slabCount = 1;
    v.dimensions.forEach((id, k) => {
      if (id >= dims.length)
        throw new RangeError(
          `corrupt NetCDF file: variable ${JSON.stringify(v.name)} refers to dimension ${id} of ${dims.length}`,
        );
      if (!(isRecord && k === 0)) slabCount *= dims[id].size;
    });
    return {
      name: utf8FromNetcdfjs(v.name),
      type,
      dimensions: v.dimensions.map((id) => utf8FromNetcdfjs(dims[id].name)),
      shape: [],
      attributes: attributesOf(v.attributes as unknown as RawAttribute[]),
      isRecord,
      slabCount,
      begin: v.offset,
    };
  });
  const recordVars = variables.filter((v) => v.isRecord);
  const recordSize =
    recordVars.length === 1
      ? recordVars[0].slabCount * NC_TYPE_SIZE[recordVars[0].type]
      : recordVars.reduce((s, v) => s + pad4(v.slabCount * NC_TYPE_SIZE[v.type]), 0);
  let numRecords = h.recordDimension.length;
  if (numRecords === NC_STREAMING) {
    // Indeterminate record count: the specification says to infer it from the file length.
    const start = recordVars.length ? Math.min(...recordVars.map((v) => v.begin)) : bytes.length;
    numRecords = recordSize > 0 ? Math.floor((bytes.length - start) / recordSize) : 0;
  }
  const dimensions = dims.map((d, id) => ({
    name: utf8FromNetcdfjs(d.name),
    size: id === recordId ? numRecords : d.size,
    unlimited: id === recordId,
  }));
  variables.forEach((v, k) => {
    v.shape = h.variables[k].dimensions.map((id) => dimensions[id].size);
  });

  const file = new View(
    bytes,
    reader.header.version === 1 ? 'cdf1' : 'cdf2',
    dimensions,
    attributesOf(h.globalAttributes as unknown as RawAttribute[]),
    variables,
    numRecords,
    recordSize,
  );
  if (!options.headerOnly) {
    for (const v of variables) {
      const last = v.isRecord ? numRecords - 1 : 0;
      if (last >= 0) file.checkInside(v, last);
    }
  }
  return file;
}

class View implements NetcdfFile {
  private readonly byName = new Map<string, NcReadVariable>();
  constructor(
    private readonly bytes: Uint8Array,
    readonly format: 'cdf1' | 'cdf2',
    readonly dimensions: NcReadDimension[],
    readonly attributes: Record<string, NcAttributeValue>,
    readonly variables: NcReadVariable[],
    readonly numRecords: number,
    readonly recordSize: number,
  ) {
    for (const v of variables) this.byName.set(v.name, v);
  }

  variable(name: string): NcReadVariable {
    const v = this.byName.get(name);
    if (!v)
      throw new RangeError(
        `NetCDF file has no variable "${name}" (it has ${this.variables.map((x) => `"${x.name}"`).join(', ') || 'none'})`,
      );
    return v;
  }

  slabRange(name: string, index = 0): { offset: number; byteLength: number } {
    const v = this.variable(name);
    const limit = v.isRecord ? this.numRecords : 1;
    if (!(Number.isInteger(index) && index >= 0 && index < limit)) {
      throw new RangeError(
        v.isRecord
          ? `record ${index} of "${name}" does not exist (the file has ${this.numRecords} records)`
          : `"${name}" is not a record variable: its only slab is index 0`,
      );
    }
    return {
      offset: v.begin + (v.isRecord ? index * this.recordSize : 0),
      byteLength: v.slabCount * NC_TYPE_SIZE[v.type],
    };
  }

  checkInside(v: NcReadVariable, index: number): void {
    const { offset, byteLength } = this.slabRange(v.name, index);
    if (offset + byteLength > this.bytes.length) {
      const which = v.isRecord ? `record ${index} of "${v.name}"` : `"${v.name}"`;
      throw new RangeError(
        `truncated NetCDF file: ${which} ends at byte ${offset + byteLength} but the file has ${this.bytes.length} bytes`,
      );
    }
  }

  readRecord(name: string, index: number, out?: NcArray): NcArray {
    const v = this.variable(name);
    this.checkInside(v, index);
    const { offset, byteLength } = this.slabRange(name, index);
    return decodeSlab(v.type, this.bytes.subarray(offset, offset + byteLength), out);
  }

  readVariable(name: string): NcArray {
    const v = this.variable(name);
    const n = v.isRecord ? this.numRecords : 1;
    const all = newArray(v.type, v.slabCount * n);
    for (let r = 0; r < n; r++) this.readRecord(name, r, all.subarray(r * v.slabCount, (r + 1) * v.slabCount));
    return all;
  }
}

function checkMagic(b: Uint8Array): void {
  if (b.length >= 4 && b[0] === 0x89 && b[1] === 0x48 && b[2] === 0x44 && b[3] === 0x46) {
    throw new RangeError(
      'not a NetCDF-3 file: this is HDF5 (NetCDF-4); Stria reads the classic and 64-bit offset formats only',
    );
  }
  if (b.length < 4 || b[0] !== 0x43 || b[1] !== 0x44 || b[2] !== 0x46)
    throw new RangeError('not a NetCDF file: it does not start with "CDF"');
  if (b[3] === 5) throw new RangeError('NetCDF CDF-5 (64-bit data) is not supported: Stria reads CDF-1 and CDF-2');
  if (b[3] !== 1 && b[3] !== 2) throw new RangeError(`not a NetCDF file: unknown version byte ${b[3]} after "CDF"`);
  if (b.length < 32) throw new RangeError(`truncated NetCDF file: ${b.length} bytes is shorter than any header`);
}
