import type { AttributeValue } from './datasetReader';

/**
 * Attribute values from jsfive made to look like the NetCDF-3 reader's: text without the NUL padding
 * of fixed-length HDF5 strings, one number as a number, several as an array (64-bit integers as
 * numbers). The netCDF-4 bookkeeping attributes (dimension scales, ids, provenance) are dropped: the
 * NetCDF data model does not show them.
 */
const HIDDEN = new Set([
  'CLASS',
  'NAME',
  'REFERENCE_LIST',
  'DIMENSION_LIST',
  '_Netcdf4Dimid',
  '_Netcdf4Coordinates',
  '_NCProperties',
  '_nc3_strict',
  '_IsNetcdf4',
  '_SuperblockVersion',
]);

export function cleanAttributes(raw: Record<string, unknown>): Record<string, AttributeValue> {
  const out: Record<string, AttributeValue> = {};
  for (const [name, value] of Object.entries(raw)) {
    if (HIDDEN.has(name)) continue;
    const v = cleanValue(value);
    if (v !== null)
      Object.defineProperty(out, name, { value: v, enumerable: true, writable: true, configurable: true });
  }
  return out;
}

function cleanValue(value: unknown): AttributeValue | null {
  if (typeof value === 'string') return value.replace(/\0+$/, '');
  if (typeof value === 'number' || typeof value === 'bigint') return Number(value);
  if (Array.isArray(value)) {
    if (value.every((x) => typeof x === 'string'))
      return (value as string[]).map((s) => s.replace(/\0+$/, '')).join('');
    if (value.every((x) => typeof x === 'number' || typeof x === 'bigint')) {
      const nums = value.map(Number);
      return nums.length === 1 ? nums[0] : nums;
    }
  }
  return null;
}

/** Object addresses of a DIMENSION_LIST attribute as jsfive decodes it: one [[address]] per dimension. */
export function dimensionAddresses(list: unknown): number[] | null {
  if (!Array.isArray(list)) return null;
  const out: number[] = [];
  for (const entry of list) {
    let x: unknown = entry;
    while (Array.isArray(x)) x = x[0];
    if (typeof x !== 'number' && typeof x !== 'bigint') return null;
    out.push(Number(x));
  }
  return out;
}

interface WarnConsole {
  warn: (...args: unknown[]) => void;
}

/**
 * Runs f with console.warn captured into `warnings`: jsfive reports attributes it cannot decode on
 * the console (e.g. the compound REFERENCE_LIST of every dimension scale), which would otherwise
 * print on every open.
 */
export function quietly<T>(warnings: string[], f: () => T): T {
  const c = (globalThis as unknown as { console?: WarnConsole }).console;
  if (!c) return f();
  const warn = c.warn;
  c.warn = (...args: unknown[]) => warnings.push(args.map(String).join(' '));
  try {
    return f();
  } finally {
    c.warn = warn;
  }
}
