import { NC_TYPE_SIZE, type NcType } from './netcdf3Types';

/** The typed array each NetCDF external type decodes into (byte is signed, as the specification's default). */
export type NcArray = Float64Array | Float32Array | Int32Array | Int16Array | Int8Array | Uint8Array;

/** Decodes big-endian values of `type` from `bytes` (a whole slab) into `out` or a new array. */
export function decodeSlab(type: NcType, bytes: Uint8Array, out?: NcArray): NcArray {
  const size = NC_TYPE_SIZE[type];
  const n = Math.floor(bytes.length / size);
  const a = out ?? newArray(type, n);
  if (a.length !== n || a.constructor !== ARRAY_OF[type])
    throw new RangeError(`decodeSlab: out must be a ${ARRAY_OF[type].name} of length ${n} for ${type} values`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (type === 'double') for (let k = 0; k < n; k++) a[k] = view.getFloat64(8 * k);
  else if (type === 'float') for (let k = 0; k < n; k++) a[k] = view.getFloat32(4 * k);
  else if (type === 'int') for (let k = 0; k < n; k++) a[k] = view.getInt32(4 * k);
  else if (type === 'short') for (let k = 0; k < n; k++) a[k] = view.getInt16(2 * k);
  else a.set(type === 'byte' ? new Int8Array(bytes.buffer, bytes.byteOffset, n) : bytes.subarray(0, n));
  return a;
}

/** The typed array each external type decodes into. */
const ARRAY_OF = {
  double: Float64Array,
  float: Float32Array,
  int: Int32Array,
  short: Int16Array,
  byte: Int8Array,
  char: Uint8Array,
} as const;

export function newArray(type: NcType, n: number): NcArray {
  return new ARRAY_OF[type](n);
}
