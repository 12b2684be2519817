import { netcdfTextBytes } from './netcdf3Names';
import { NC_TYPE_SIZE, pad4, type NcFormat } from './netcdf3Types';
import type { ValidAttribute, ValidFile } from './netcdf3Validate';

/**
 * Where everything goes in a NetCDF-3 file (NetCDF classic format specification, "Note on vsize",
 * "Note on padding" and "Notes on Computing File Offsets"):
 *
 *   header | fixed variables, each contiguous, in header order | records
 *
 * Each fixed variable starts where the previous one's vsize (its size padded to four bytes) ends.
 * A record holds the n-th slab of every record variable in header order, each slab vsize bytes, so
 * the record size is the sum of their vsizes. The one exception: when the file has exactly one record
 * variable, records are packed without padding (the record size is the unpadded slab), which only
 * matters for byte, char and short; vsize in the header stays padded, as the specification requires.
 */
export interface Netcdf3Layout {
  format: NcFormat;
  /** Header length in bytes (a multiple of four): also the begin of the first variable's data. */
  headerSize: number;
  /** begin of each variable, in header order. */
  begins: number[];
  /** Offset of the first record; the end of the fixed data. */
  recordStart: number;
  /** Bytes from one record to the next. */
  recsize: number;
}

/** Largest begin the classic format's 32-bit signed OFFSET can hold. */
const CDF1_MAX_OFFSET = 0x7fffffff;

export function planLayout(file: ValidFile): Netcdf3Layout {
  const offsetSize = file.format === 'cdf1' ? 4 : 8;
  let headerSize = 8; // magic, numrecs
  headerSize += listSize(file.dimensions.map((d) => nameSize(d.name) + 4));
  headerSize += attributeListSize(file.attributes);
  headerSize += listSize(
    file.variables.map(
      (v) => nameSize(v.name) + 4 + 4 * v.dimIds.length + attributeListSize(v.attributes) + 4 + 4 + offsetSize,
    ),
  );

  const begins: number[] = new Array(file.variables.length);
  let offset = headerSize;
  file.variables.forEach((v, k) => {
    if (!v.isRecord) {
      begins[k] = offset;
      offset += v.vsize;
    }
  });
  const recordStart = offset;
  file.variables.forEach((v, k) => {
    if (v.isRecord) {
      begins[k] = offset;
      offset += v.vsize;
    }
  });
  const recs = file.recordVariables;
  const recsize = recs.length === 1 ? recs[0].slabBytes : offset - recordStart;

  if (file.format === 'cdf1') {
    file.variables.forEach((v, k) => {
      if (begins[k] > CDF1_MAX_OFFSET) {
        throw new RangeError(
          `NetCDF: variable "${v.name}" would begin at byte ${begins[k]}, beyond the classic format's 2 GiB offsets; use the 64-bit offset format (cdf2)`,
        );
      }
    });
  }
  return { format: file.format, headerSize, begins, recordStart, recsize };
}

/** Total file length for a given number of records. */
export function fileSize(layout: Netcdf3Layout, numrecs: number): number {
  return layout.recordStart + numrecs * layout.recsize;
}

/** A name: nelems then the UTF-8 bytes padded to four. */
function nameSize(name: string): number {
  return 4 + pad4(netcdfTextBytes(name).length);
}

/** A tagged list: ABSENT (two zero words) when empty, else tag, nelems and the entries. */
function listSize(entrySizes: number[]): number {
  return 8 + entrySizes.reduce((a, b) => a + b, 0);
}

function attributeListSize(attrs: readonly ValidAttribute[]): number {
  return listSize(attrs.map((a) => nameSize(a.name) + 4 + 4 + pad4(a.values.length * NC_TYPE_SIZE[a.type])));
}
