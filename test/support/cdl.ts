/**
 * CDL text (the NetCDF text notation that ncgen reads) for test files: dimensions, variables with
 * attributes, data. Numbers are written in the shortest form that reads back to the same double;
 * NaN as NaN; null as "_", CDL's mark for the fill value. ncgen's storage attributes for netCDF-4
 * (_ChunkSizes, _DeflateLevel, _Shuffle, _Fletcher32, _Endianness, _Storage) pass through.
 */
export type CdlType = 'double' | 'float' | 'int' | 'short' | 'byte';

export interface CdlVariable {
  name: string;
  type: CdlType;
  dims: string[];
  /** Text, or numbers: stored in the variable's type for _FillValue, missing_value, valid_*; double otherwise. */
  attrs?: Record<string, string | number | number[]>;
  data?: ArrayLike<number> | readonly (number | null)[];
}

export interface CdlFile {
  dims: { name: string; size: number | 'unlimited' }[];
  vars: CdlVariable[];
  globals?: Record<string, string | number>;
}

const SUFFIX: Record<CdlType, string> = { double: '', float: 'f', int: '', short: 's', byte: 'b' };
const TYPED = new Set(['_FillValue', 'missing_value', 'valid_min', 'valid_max', 'valid_range']);
/** ncgen's storage attributes that take integers (the others, _Shuffle, _Storage, ..., take text). */
const INT_SPECIAL = new Set(['_ChunkSizes', '_DeflateLevel']);

export function cdl(f: CdlFile): string {
  const lines = ['netcdf test {', 'dimensions:'];
  for (const d of f.dims) lines.push(`  ${d.name} = ${d.size === 'unlimited' ? 'UNLIMITED' : d.size} ;`);
  lines.push('variables:');
  for (const v of f.vars) {
    lines.push(`  ${v.type} ${v.name}${v.dims.length ? `(${v.dims.join(', ')})` : ''} ;`);
    for (const [k, a] of Object.entries(v.attrs ?? {}))
      lines.push(`    ${v.name}:${k} = ${attr(a, TYPED.has(k) ? v.type : INT_SPECIAL.has(k) ? 'int' : 'double')} ;`);
  }
  for (const [k, a] of Object.entries(f.globals ?? {})) lines.push(`  :${k} = ${attr(a, 'double')} ;`);
  const withData = f.vars.filter((v) => v.data && v.data.length);
  if (withData.length) {
    lines.push('data:');
    for (const v of withData)
      lines.push(`  ${v.name} = ${Array.from(v.data as ArrayLike<number | null>, value).join(', ')} ;`);
  }
  lines.push('}');
  return lines.join('\n') + '\n';
}

function attr(a: string | number | number[], type: CdlType): string {
  if (typeof a === 'string') return `"${a.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;
  const list = Array.isArray(a) ? a : [a];
  return list
    .map((x) => (type === 'double' ? double(x) : `${type === 'float' ? double(x) : String(x)}${SUFFIX[type]}`))
    .join(', ');
}

/** A double literal CDL reads as a double: always with a decimal point or exponent. */
function double(x: number): string {
  const s = String(x);
  return /[.eEN]/.test(s) ? s : `${s}.`;
}

function value(x: number | null): string {
  if (x === null) return '_';
  if (Number.isNaN(x)) return 'NaN';
  return String(x);
}
