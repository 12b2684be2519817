import type { AllocationMeter } from './allocationMeter';
import type { ByteSource } from './byteSource';
import type { DatasetReader, DatasetType, ReadOptions, ReaderOptions } from './datasetReader';
import { NamedVariables, readBuffer, recordRange } from './datasetReader';
import { readNetcdf, type NetcdfFile } from './netcdfRead';
import { NC_STREAMING, NC_TYPE_SIZE, type NcType } from './netcdf3Types';

/**
 * NetCDF-3 (CDF-1, CDF-2) behind the DatasetReader interface, reading from a ByteSource: only the
 * header is parsed up front (by lib/io/netcdfRead.ts, with its netcdfjs repairs), then each record is
 * read from its byte range and decoded straight into float64, so a file larger than memory is read
 * one record at a time. Reads go through one scratch buffer, grown to the largest slab read.
 */
const TYPES: Readonly<Record<NcType, DatasetType>> = {
  byte: 'int8',
  char: 'char',
  short: 'int16',
  int: 'int32',
  float: 'float32',
  double: 'float64',
};

/** First guess at the header size; doubled until the header parses. */
const HEADER_PREFIX = 64 * 1024;

/** Pieces of at most this many bytes per read, so progress is reported within a large record. */
const READ_PIECE = 8 * 1024 * 1024;

export function openNetcdf3(source: ByteSource, options: ReaderOptions = {}): DatasetReader {
  const nc = parseHeader(source);
  return new Netcdf3Dataset(source, nc, options.meter);
}

function parseHeader(source: ByteSource): NetcdfFile {
  // The record count may be the "streaming" marker, to be inferred from the file's length: then the
  // header must be parsed with the whole file, which readNetcdf uses for the inference.
  const head = source.read(0, Math.min(8, source.byteLength));
  const streaming = head.length >= 8 && new DataView(head.buffer, head.byteOffset, 8).getUint32(4) === NC_STREAMING;
  if (streaming) return readNetcdf(new Uint8Array(source.whole()));
  for (let n = Math.min(HEADER_PREFIX, source.byteLength); ; n = Math.min(2 * n, source.byteLength)) {
    try {
      return readNetcdf(source.read(0, n).slice(), { headerOnly: true });
    } catch (e) {
      const short = e instanceof RangeError && /header runs past the end|shorter than any header/.test(e.message);
      if (!short || n === source.byteLength) throw e;
    }
  }
}

class Netcdf3Dataset extends NamedVariables implements DatasetReader {
  readonly format;
  readonly dimensions;
  readonly attributes;
  readonly notes: string[] = [];
  private scratch: Uint8Array;

  constructor(
    private readonly source: ByteSource,
    private readonly nc: NetcdfFile,
    private readonly meter?: AllocationMeter,
  ) {
    super();
    this.format = nc.format === 'cdf1' ? ('netcdf3-classic' as const) : ('netcdf3-64bit-offset' as const);
    this.dimensions = nc.dimensions.map((d) => ({ ...d }));
    this.attributes = nc.attributes;
    for (const v of nc.variables)
      this.addVariable({
        name: v.name,
        type: TYPES[v.type],
        dimensions: v.dimensions.slice(),
        shape: v.shape.slice(),
        attributes: v.attributes,
      });
    this.scratch = new Uint8Array(0);
    // A truncated file is refused here, naming the first slab that does not fit.
    for (const v of nc.variables) {
      const last = v.isRecord ? nc.numRecords - 1 : 0;
      if (last < 0) continue;
      const { offset, byteLength } = nc.slabRange(v.name, last);
      if (offset + byteLength > source.byteLength) {
        const which = v.isRecord ? `record ${last} of "${v.name}"` : `"${v.name}"`;
        throw new RangeError(
          `truncated NetCDF file: ${which} ends at byte ${offset + byteLength} but the file has ${source.byteLength} bytes`,
        );
      }
    }
  }

  readRecord(name: string, index: number, options: ReadOptions = {}): Float64Array {
    const v = this.nc.variable(name);
    const records = this.recordCount(name);
    if (!(Number.isInteger(index) && index >= 0 && index < records))
      throw new RangeError(`record ${index} of "${name}" does not exist (it has ${records})`);
    if (v.type === 'char') throw new RangeError(`"${name}" holds text (char), not numbers`);
    const n = this.recordLength(name);
    const { start, count } = recordRange(name, n, options.range);
    const size = NC_TYPE_SIZE[v.type];
    // A record variable's record is one slab; a fixed variable is one slab, record `index` of its
    // first dimension a piece of it. Either way the range is a run of bytes within it.
    const base = v.isRecord ? this.nc.slabRange(name, index).offset : v.begin + index * n * size;
    return this.readSlab(v.name, v.type, base + start * size, count, index, options);
  }

  /** Reads go through the one scratch buffer, counted as kept (at most READ_PIECE bytes). */
  recordReadBytes(): number {
    return 0;
  }

  readAll(name: string, options: ReadOptions = {}): Float64Array {
    const v = this.nc.variable(name);
    if (v.type === 'char') throw new RangeError(`"${name}" holds text (char), not numbers`);
    const n = this.variable(name).shape.reduce((a, b) => a * b, 1);
    const out = options.out ?? readBuffer(name, n);
    if (out.length !== n) throw new RangeError(`readAll("${name}"): out has ${out.length} values, the variable ${n}`);
    if (!v.isRecord) return this.readSlab(name, v.type, v.begin, n, 0, { ...options, out });
    const per = v.slabCount;
    for (let r = 0; r < this.nc.numRecords; r++)
      this.readRecord(name, r, { out: out.subarray(r * per, (r + 1) * per), onProgress: options.onProgress });
    return out;
  }

  private readSlab(
    name: string,
    type: NcType,
    offset: number,
    n: number,
    record: number,
    options: ReadOptions,
  ): Float64Array {
    const out = options.out ?? readBuffer(name, n);
    if (out.length !== n) throw new RangeError(`readRecord("${name}"): out has ${out.length} values, a record ${n}`);
    const size = NC_TYPE_SIZE[type];
    const per = Math.max(1, Math.floor(READ_PIECE / size));
    for (let start = 0; start < n; start += per) {
      const m = Math.min(per, n - start);
      const bytes = this.read(offset + start * size, m * size);
      decodeBigEndian(type, bytes, out, start, m);
      options.onProgress?.({ variable: name, record, done: (start + m) * size, total: n * size });
    }
    return out;
  }

  private read(offset: number, length: number): Uint8Array {
    if (this.scratch.length < length) {
      this.meter?.external(length - this.scratch.length, 'read scratch');
      this.scratch = new Uint8Array(length);
    }
    return this.source.read(offset, length, this.scratch);
  }
}

/** m big-endian values of `type` from bytes into out[start..start + m) (the classic format is big-endian). */
function decodeBigEndian(type: NcType, bytes: Uint8Array, out: Float64Array, start: number, m: number): void {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (type === 'double') for (let k = 0; k < m; k++) out[start + k] = view.getFloat64(8 * k);
  else if (type === 'float') for (let k = 0; k < m; k++) out[start + k] = view.getFloat32(4 * k);
  else if (type === 'int') for (let k = 0; k < m; k++) out[start + k] = view.getInt32(4 * k);
  else if (type === 'short') for (let k = 0; k < m; k++) out[start + k] = view.getInt16(2 * k);
  else for (let k = 0; k < m; k++) out[start + k] = view.getInt8(k);
}
