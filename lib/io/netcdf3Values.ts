import type { NcType } from './netcdf3Types';

/** Doubles from here up round to an infinite float (half an ulp above the largest float, ties to even). */
const F32_OVERFLOW = 3.4028235677973366e38;

/**
 * Writes data[start .. start+count) as big-endian values of `type` at `offset` (NetCDF classic format
 * specification: SHORT, INT, FLOAT, DOUBLE are big-endian two's complement / IEEE 754; BYTE and CHAR
 * are single bytes). Integer types refuse values they cannot hold exactly, and float refuses finite
 * values that would overflow, naming `what` and the index; the check costs one compare per value.
 * Returns the offset just past the values (before any padding). Allocates nothing.
 */
export function writeValues(
  view: DataView,
  offset: number,
  type: NcType,
  data: ArrayLike<number>,
  start: number,
  count: number,
  what: string,
): number {
  const end = start + count;
  let o = offset;
  switch (type) {
    case 'double':
      for (let k = start; k < end; k++, o += 8) view.setFloat64(o, data[k]);
      return o;
    case 'float':
      for (let k = start; k < end; k++, o += 4) {
        const x = data[k];
        if ((x >= F32_OVERFLOW || x <= -F32_OVERFLOW) && x !== Infinity && x !== -Infinity)
          checkValue(x, type, `${what}[${k}]`);
        view.setFloat32(o, x);
      }
      return o;
    case 'int':
      for (let k = start; k < end; k++, o += 4) {
        const x = data[k];
        if ((x | 0) !== x) checkValue(x, type, `${what}[${k}]`);
        view.setInt32(o, x);
      }
      return o;
    case 'short':
      for (let k = start; k < end; k++, o += 2) {
        const x = data[k];
        if ((x << 16) >> 16 !== x) checkValue(x, type, `${what}[${k}]`);
        view.setInt16(o, x);
      }
      return o;
    case 'byte':
      for (let k = start; k < end; k++, o++) {
        const x = data[k];
        if ((x << 24) >> 24 !== x) checkValue(x, type, `${what}[${k}]`);
        view.setInt8(o, x);
      }
      return o;
    case 'char':
      // Already bytes (a Uint8Array or UTF-8 encoded string), 0..255 by construction.
      for (let k = start; k < end; k++, o++) view.setUint8(o, data[k]);
      return o;
  }
}

/**
 * Fills `nbytes` of data padding after a slab. The specification pads data with the variable's
 * fill value (header padding is zero bytes). Only byte, char and short slabs ever need padding:
 * every other type has a size that is a multiple of four.
 */
export function writeDataPadding(view: DataView, offset: number, type: NcType, nbytes: number, fill: number): void {
  if (type === 'short') {
    for (let k = 0; k + 2 <= nbytes; k += 2) view.setInt16(offset + k, fill);
  } else {
    for (let k = 0; k < nbytes; k++) view.setInt8(offset + k, fill);
  }
}

/** Integer ranges of the integer types; float and double take any number (float is checked for overflow). */
const INT_RANGE: Partial<Record<NcType, [number, number]>> = {
  byte: [-128, 127],
  short: [-32768, 32767],
  int: [-2147483648, 2147483647],
};

/** Refuses a value the type cannot hold exactly (integers) or at all (float overflow). */
export function checkValue(x: number, type: NcType, where: string): void {
  if (typeof x !== 'number') throw new RangeError(`NetCDF: ${where} is not a number (${typeof x})`);
  const range = INT_RANGE[type];
  if (range) {
    if (!Number.isInteger(x) || x < range[0] || x > range[1])
      throw new RangeError(
        `NetCDF: ${where} = ${x} does not fit type ${type} (an integer from ${range[0]} to ${range[1]})`,
      );
  } else if (type === 'float' && Number.isFinite(x) && !Number.isFinite(Math.fround(x))) {
    throw new RangeError(`NetCDF: ${where} = ${x} overflows a float (largest ≈ 3.4028235e38)`);
  }
}
