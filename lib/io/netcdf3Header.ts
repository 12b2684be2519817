import type { Netcdf3Layout } from './netcdf3Layout';
import { netcdfTextBytes } from './netcdf3Names';
import { NC_ATTRIBUTE_TAG, NC_DIMENSION_TAG, NC_TYPE_CODE, NC_VARIABLE_TAG, pad4 } from './netcdf3Types';
import type { ValidAttribute, ValidFile } from './netcdf3Validate';
import { writeValues } from './netcdf3Values';

/**
 * Writes the header (NetCDF classic format specification, "The Format in Detail"):
 *
 *   magic numrecs dim_list gatt_list var_list
 *
 * into bytes [0, layout.headerSize) of `view`, which must be zero there: header padding is zero
 * bytes, and skipping over it keeps this writer free of fill loops. All integers are big-endian;
 * begin is 32 bits in the classic format and 64 bits in the 64-bit offset format.
 */
export function writeHeader(view: DataView, file: ValidFile, layout: Netcdf3Layout, numrecs: number): void {
  const w = new HeaderCursor(view);
  w.bytes([0x43, 0x44, 0x46, file.format === 'cdf1' ? 1 : 2]); // 'C' 'D' 'F' VERSION
  w.u32(numrecs);

  w.listTag(NC_DIMENSION_TAG, file.dimensions.length);
  for (const d of file.dimensions) {
    w.name(d.name);
    w.u32(d.size); // 0 marks the record dimension
  }

  w.attributes(file.attributes);

  w.listTag(NC_VARIABLE_TAG, file.variables.length);
  file.variables.forEach((v, k) => {
    w.name(v.name);
    w.u32(v.dimIds.length);
    for (const id of v.dimIds) w.u32(id);
    w.attributes(v.attributes);
    w.u32(NC_TYPE_CODE[v.type]);
    w.u32(v.vsize);
    if (file.format === 'cdf1') w.u32(layout.begins[k]);
    else w.u64(layout.begins[k]);
  });

  if (w.offset !== layout.headerSize)
    throw new Error(`NetCDF writer: header is ${w.offset} bytes, planned ${layout.headerSize}`);
}

/** Sequential big-endian writes into the header region. */
class HeaderCursor {
  offset = 0;
  constructor(private readonly view: DataView) {}

  u32(x: number): void {
    this.view.setUint32(this.offset, x);
    this.offset += 4;
  }

  /** A 64-bit big-endian offset; JS numbers are exact up to 2^53, far beyond any file we write. */
  u64(x: number): void {
    this.view.setUint32(this.offset, Math.floor(x / 0x100000000));
    this.view.setUint32(this.offset + 4, x >>> 0);
    this.offset += 8;
  }

  bytes(b: ArrayLike<number>): void {
    for (let k = 0; k < b.length; k++) this.view.setUint8(this.offset + k, b[k]);
    this.offset += pad4(b.length);
  }

  /** nelems, then the UTF-8 name padded with zero bytes. */
  name(s: string): void {
    const b = netcdfTextBytes(s);
    this.u32(b.length);
    this.bytes(b);
  }

  /** ABSENT (ZERO ZERO) for an empty list, else the tag and the element count. */
  listTag(tag: number, n: number): void {
    this.u32(n === 0 ? 0 : tag);
    this.u32(n);
  }

  attributes(list: readonly ValidAttribute[]): void {
    this.listTag(NC_ATTRIBUTE_TAG, list.length);
    for (const a of list) {
      this.name(a.name);
      this.u32(NC_TYPE_CODE[a.type]);
      this.u32(a.values.length);
      const end = writeValues(this.view, this.offset, a.type, a.values, 0, a.values.length, `attribute "${a.name}"`);
      this.offset = this.offset + pad4(end - this.offset);
    }
  }
}
