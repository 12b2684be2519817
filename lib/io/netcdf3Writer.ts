import { writeHeader } from './netcdf3Header';
import { fileSize, planLayout, type Netcdf3Layout } from './netcdf3Layout';
import { netcdfTextBytes } from './netcdf3Names';
import { NC_MAX_NON_NEG, NUMRECS_OFFSET, type NcData, type NcFile } from './netcdf3Types';
import { validateNetcdf3, type ValidFile, type ValidVariable } from './netcdf3Validate';
import { writeDataPadding, writeValues } from './netcdf3Values';

/**
 * NetCDF-3 writing, to the NetCDF classic format specification: CDF-2 (64-bit offsets) by default,
 * CDF-1 (classic) with `format: 'cdf1'`. Two ways in:
 *
 * - `encodeNetcdf3(file)`: the whole file as one Uint8Array, sized up front and written in place.
 * - `Netcdf3RecordWriter`: the header and fixed data first, then one record at a time, for time
 *   series too large to hold: the caller appends each record's bytes to the file and rewrites the
 *   four numrecs bytes at NUMRECS_OFFSET, so the file on disk is complete after every record.
 */
export function encodeNetcdf3(file: NcFile): Uint8Array {
  const valid = validateNetcdf3(file, 'whole');
  const layout = planLayout(valid);
  const bytes = allocate(fileSize(layout, valid.numrecs));
  const view = new DataView(bytes.buffer);
  writeHeader(view, valid, layout, valid.numrecs);
  const packed = valid.recordVariables.length === 1;
  valid.variables.forEach((v, k) => {
    if (!v.isRecord) {
      writeSlab(view, layout.begins[k], v, v.data!, 0, true);
      return;
    }
    for (let r = 0; r < valid.numrecs; r++)
      writeSlab(view, layout.begins[k] + r * layout.recsize, v, v.data!, r * v.slabCount, !packed);
  });
  return bytes;
}

/** Incremental writer: header sized up front, records appended. */
export class Netcdf3RecordWriter {
  readonly layout: Netcdf3Layout;
  private readonly file: ValidFile;
  private readonly record: Uint8Array;
  private readonly recordView: DataView;
  private count = 0;

  /** `file` gives fixed variables with data and record variables without. */
  constructor(file: NcFile) {
    this.file = validateNetcdf3(file, 'records');
    this.layout = planLayout(this.file);
    this.record = new Uint8Array(this.layout.recsize);
    this.recordView = new DataView(this.record.buffer);
  }

  /** The first bytes of the file: header (numrecs 0) and fixed variables, layout.recordStart long. */
  head(): Uint8Array {
    const bytes = allocate(this.layout.recordStart);
    const view = new DataView(bytes.buffer);
    writeHeader(view, this.file, this.layout, 0);
    this.file.variables.forEach((v, k) => {
      if (!v.isRecord) writeSlab(view, this.layout.begins[k], v, v.data!, 0, true);
    });
    return bytes;
  }

  /**
   * Encodes the next record from one slab per record variable (by name, row-major). Returns a view
   * of a buffer reused by the next call; write it at `recordOffset(numrecs − 1)` (the end of the file).
   */
  appendRecord(values: Readonly<Record<string, NcData>>): Uint8Array {
    if (this.count >= NC_MAX_NON_NEG)
      throw new RangeError(`NetCDF: the format allows at most ${NC_MAX_NON_NEG} records`);
    for (const name of Object.keys(values)) {
      if (!this.file.recordVariables.some((v) => v.name === name))
        throw new RangeError(`NetCDF: record ${this.count}: "${name}" is not a record variable of this file`);
    }
    const packed = this.file.recordVariables.length === 1;
    let offset = 0;
    for (const v of this.file.recordVariables) {
      const given = values[v.name];
      const what = `record ${this.count} of variable "${v.name}"`;
      if (given === undefined) throw new RangeError(`NetCDF: ${what} is missing`);
      const data = typeof given === 'string' ? (v.type === 'char' ? netcdfTextBytes(given) : null) : given;
      if (data === null) throw new RangeError(`NetCDF: ${what}: a ${v.type} variable takes numbers, not a string`);
      if (data.length !== v.slabCount)
        throw new RangeError(`NetCDF: ${what} needs ${v.slabCount} values, got ${data.length}`);
      writeSlab(this.recordView, offset, v, data, 0, !packed);
      offset += packed ? v.slabBytes : v.vsize;
    }
    this.count++;
    return this.record;
  }

  /** Records appended so far. */
  get numrecs(): number {
    return this.count;
  }

  /** Byte offset of record r in the file. */
  recordOffset(r: number): number {
    return this.layout.recordStart + r * this.layout.recsize;
  }

  /** The big-endian numrecs field for the records appended so far, to write at NUMRECS_OFFSET. */
  numrecsField(): Uint8Array {
    const b = new Uint8Array(4);
    new DataView(b.buffer).setUint32(0, this.count);
    return b;
  }

  static readonly NUMRECS_OFFSET = NUMRECS_OFFSET;
}

/** One slab of a variable at `offset`, then its fill-value padding up to vsize when `pad`. */
function writeSlab(
  view: DataView,
  offset: number,
  v: ValidVariable,
  data: ArrayLike<number>,
  start: number,
  pad: boolean,
): void {
  const end = writeValues(view, offset, v.type, data, start, v.slabCount, `variable "${v.name}"`);
  if (pad && v.vsize > v.slabBytes) writeDataPadding(view, end, v.type, v.vsize - v.slabBytes, v.fill);
}

function allocate(size: number): Uint8Array {
  try {
    return new Uint8Array(size);
  } catch {
    throw new RangeError(
      `NetCDF: the file needs ${size} bytes, more than can be held in memory; write it record by record with Netcdf3RecordWriter`,
    );
  }
}
