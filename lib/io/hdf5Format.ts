import type { DatasetType } from './datasetReader';

/**
 * Small pieces of the HDF5 File Format Specification (version 3.0, The HDF Group; an open standard)
 * that jsfive does not expose: the superblock's end-of-file address, dataspace maximum sizes, the
 * data layout message, and the element type behind jsfive's dtype strings. All HDF5 integers are
 * little-endian; Stria (like jsfive) reads only files with 8-byte offsets and lengths.
 */
export const UNDEFINED_ADDRESS = Number.MAX_SAFE_INTEGER; // what `u64` returns for 0xff…ff

/** Unsigned little-endian integer of `size` bytes at `offset`; all-ones (undefined address) → UNDEFINED_ADDRESS. */
export function uint(view: DataView, offset: number, size: number): number {
  let allOnes = true;
  let v = 0;
  for (let i = size - 1; i >= 0; i--) {
    const b = view.getUint8(offset + i);
    if (b !== 0xff) allOnes = false;
    v = v * 256 + b;
  }
  return allOnes && size === 8 ? UNDEFINED_ADDRESS : v;
}

export function u64(view: DataView, offset: number): number {
  return uint(view, offset, 8);
}

/**
 * The end-of-file address the superblock records (versions 0, 2 and 3 — those jsfive reads), so a
 * truncated file is refused with its expected size instead of failing somewhere inside the parse.
 */
export function superblockEnd(view: DataView): { version: number; end: number } {
  if (view.byteLength < 48)
    throw new RangeError(`truncated HDF5 file: ${view.byteLength} bytes is shorter than its superblock`);
  const version = view.getUint8(8);
  if (version === 0) return { version, end: u64(view, 40) };
  if (version === 2 || version === 3) return { version, end: u64(view, 28) };
  throw new RangeError(`HDF5 superblock version ${version} is not supported (jsfive reads versions 0, 2 and 3)`);
}

/** Sizes of offsets and lengths from the superblock (bytes 13–14 in v0, 9–10 in v2/v3). */
export function superblockSizes(view: DataView): { offsets: number; lengths: number } {
  const v = view.getUint8(8);
  return v === 0
    ? { offsets: view.getUint8(13), lengths: view.getUint8(14) }
    : { offsets: view.getUint8(9), lengths: view.getUint8(10) };
}

/** Dataspace message (type 0x0001): current and maximum sizes; a maximum of all-ones is unlimited. */
export function parseDataspace(view: DataView, offset: number): { dims: number[]; unlimited: boolean[] } {
  const version = view.getUint8(offset);
  const rank = view.getUint8(offset + 1);
  const flags = view.getUint8(offset + 2);
  let p = offset + (version === 1 ? 8 : 4);
  if (version !== 1 && version !== 2)
    throw new RangeError(`HDF5 dataspace message version ${version} is not supported`);
  const dims: number[] = [];
  for (let i = 0; i < rank; i++, p += 8) dims.push(u64(view, p));
  const unlimited = dims.map(() => false);
  if (flags & 1) for (let i = 0; i < rank; i++, p += 8) unlimited[i] = u64(view, p) === UNDEFINED_ADDRESS;
  return { dims, unlimited };
}

export type Layout =
  | { kind: 'compact'; offset: number; size: number }
  | { kind: 'contiguous'; address: number; size: number }
  | { kind: 'chunked'; btree: number; chunk: number[] };

/**
 * Data layout message (type 0x0008), versions 1–4. Chunked storage is read only with the version-1
 * B-tree chunk index (layout versions 1–3, what the netCDF library writes by default); the chunk
 * indexes of layout version 4 (single chunk, implicit, fixed array, extensible array, version-2
 * B-tree) are refused by name.
 */
export function parseLayout(view: DataView, offset: number, rank: number, variable: string): Layout {
  const version = view.getUint8(offset);
  if (version === 1 || version === 2) {
    const dimensionality = view.getUint8(offset + 1);
    const cls = view.getUint8(offset + 2);
    let p = offset + 8;
    if (cls === 0) {
      p += 4 * dimensionality;
      return { kind: 'compact', offset: p + 4, size: view.getUint32(p, true) };
    }
    const address = u64(view, p);
    p += 8;
    const sizes: number[] = [];
    for (let i = 0; i < dimensionality; i++, p += 4) sizes.push(view.getUint32(p, true));
    if (cls === 1) return { kind: 'contiguous', address, size: sizes.reduce((a, b) => a * b, 1) };
    return { kind: 'chunked', btree: address, chunk: sizes.slice(0, rank) };
  }
  if (version === 3 || version === 4) {
    const cls = view.getUint8(offset + 1);
    const p = offset + 2;
    if (cls === 0) return { kind: 'compact', offset: p + 2, size: view.getUint16(p, true) };
    if (cls === 1) return { kind: 'contiguous', address: u64(view, p), size: u64(view, p + 8) };
    if (cls === 2 && version === 3) {
      const dimensionality = view.getUint8(p);
      const chunk: number[] = [];
      for (let i = 0; i < dimensionality - 1; i++) chunk.push(view.getUint32(p + 9 + 4 * i, true));
      return { kind: 'chunked', btree: u64(view, p + 1), chunk };
    }
    if (cls === 2) {
      const dimensionality = view.getUint8(p + 1);
      const enc = view.getUint8(p + 2);
      const index = view.getUint8(p + 3 + dimensionality * enc);
      const names: Record<number, string> = {
        1: 'single chunk',
        2: 'implicit',
        3: 'fixed array',
        4: 'extensible array',
        5: 'version-2 B-tree',
      };
      throw new RangeError(
        `"${variable}" is stored with the HDF5 1.10 chunk index "${names[index] ?? `type ${index}`}" (data layout message version 4), which this reader does not support; ` +
          "write the file with the netCDF library's default HDF5 format settings, or as NetCDF-3",
      );
    }
    throw new RangeError(`"${variable}": HDF5 layout class ${cls} (virtual datasets) is not supported`);
  }
  throw new RangeError(`"${variable}": HDF5 data layout message version ${version} is not supported`);
}

/** Element type of a jsfive dtype string: Stria's type name, its size in bytes, and its byte order. */
export function elementType(dtype: string | unknown[]): { type: DatasetType; size: number; littleEndian: boolean } {
  if (typeof dtype !== 'string') {
    const kind = String(dtype[0]);
    return { type: kind === 'VLEN_STRING' ? 'string' : 'other', size: 0, littleEndian: true };
  }
  const s = /^S(\d+)$/.exec(dtype);
  if (s) return { type: 'char', size: Number(s[1]), littleEndian: true };
  const m = /^([<>|=]?)([fiu])(\d+)$/.exec(dtype);
  if (!m) return { type: 'other', size: 0, littleEndian: true };
  const size = Number(m[3]);
  const name = `${m[2] === 'f' ? 'float' : m[2] === 'i' ? 'int' : 'uint'}${8 * size}`;
  const known: readonly string[] = [
    'int8',
    'uint8',
    'int16',
    'uint16',
    'int32',
    'uint32',
    'int64',
    'uint64',
    'float32',
    'float64',
  ];
  return { type: known.includes(name) ? (name as DatasetType) : 'other', size, littleEndian: m[1] !== '>' };
}

/** Reads one element of a numeric type at a byte offset of a view, as a double. */
export function elementReader(type: DatasetType, littleEndian: boolean): (view: DataView, offset: number) => number {
  switch (type) {
    case 'float64':
      return (v, o) => v.getFloat64(o, littleEndian);
    case 'float32':
      return (v, o) => v.getFloat32(o, littleEndian);
    case 'int32':
      return (v, o) => v.getInt32(o, littleEndian);
    case 'uint32':
      return (v, o) => v.getUint32(o, littleEndian);
    case 'int16':
      return (v, o) => v.getInt16(o, littleEndian);
    case 'uint16':
      return (v, o) => v.getUint16(o, littleEndian);
    case 'int8':
      return (v, o) => v.getInt8(o);
    case 'uint8':
      return (v, o) => v.getUint8(o);
    case 'int64':
      return (v, o) => Number(v.getBigInt64(o, littleEndian));
    case 'uint64':
      return (v, o) => Number(v.getBigUint64(o, littleEndian));
    default:
      throw new RangeError(`values of type ${type} cannot be read as numbers`);
  }
}

/** Names of the HDF5 filters the specification defines (ids 1–6); others are registered plug-ins. */
export const FILTER_NAMES: Readonly<Record<number, string>> = {
  1: 'deflate',
  2: 'shuffle',
  3: 'fletcher32',
  4: 'szip',
  5: 'nbit',
  6: 'scale-offset',
};
