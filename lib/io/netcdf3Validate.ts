import { checkNetcdfName, netcdfTextBytes } from './netcdf3Names';
import { checkValue } from './netcdf3Values';
import {
  NC_MAX_NON_NEG,
  NC_MAX_VSIZE,
  NC_DEFAULT_FILL,
  NC_TYPE_SIZE,
  pad4,
  type NcAttribute,
  type NcData,
  type NcFile,
  type NcFormat,
  type NcType,
  type NcVariable,
} from './netcdf3Types';

/** An attribute checked and reduced to what the header stores: nelems values or bytes. */
export interface ValidAttribute {
  name: string;
  type: NcType;
  /** UTF-8 bytes for char, numbers otherwise (range-checked for the type). */
  values: ArrayLike<number>;
}

export interface ValidVariable {
  name: string;
  type: NcType;
  dimIds: number[];
  attributes: ValidAttribute[];
  isRecord: boolean;
  /** Values per record (record variable) or in total (fixed variable): the product of fixed lengths. */
  slabCount: number;
  /** Bytes of one slab before and after padding to four (the latter is the header's vsize). */
  slabBytes: number;
  vsize: number;
  /** Value used for data padding: _FillValue when given, else the type's default fill. */
  fill: number;
  /** Data as numbers or bytes (char strings already UTF-8 encoded); undefined in streaming mode. */
  data: ArrayLike<number> | undefined;
}

export interface ValidFile {
  format: NcFormat;
  dimensions: { name: string; size: number; unlimited: boolean }[];
  recordDimId: number;
  attributes: ValidAttribute[];
  variables: ValidVariable[];
  recordVariables: ValidVariable[];
  /** Number of records: from the data ('whole'), or 0 when records are appended later ('records'). */
  numrecs: number;
}

const TYPES: readonly NcType[] = ['byte', 'char', 'short', 'int', 'float', 'double'];

const fail = (msg: string): never => {
  throw new RangeError(`NetCDF: ${msg}`);
};

/**
 * Checks a file description against the NetCDF classic format rules and resolves names to ids.
 * 'whole': every variable carries its data, and the record count follows from it.
 * 'records': fixed variables carry data, record variables none (records are appended later).
 */
export function validateNetcdf3(file: NcFile, mode: 'whole' | 'records'): ValidFile {
  const format = file.format ?? 'cdf2';
  if (format !== 'cdf1' && format !== 'cdf2') fail(`format must be 'cdf1' or 'cdf2', not ${JSON.stringify(format)}`);

  const dimensions: ValidFile['dimensions'] = [];
  const dimId = new Map<string, number>();
  let recordDimId = -1;
  for (const d of file.dimensions) {
    checkNetcdfName(d.name, 'a dimension');
    if (dimId.has(d.name)) fail(`dimension "${d.name}" is defined twice`);
    if (d.unlimited) {
      if (recordDimId >= 0)
        fail(
          `dimension "${d.name}": only one unlimited dimension is allowed ("${dimensions[recordDimId].name}" is one)`,
        );
      if (d.size !== undefined && d.size !== 0)
        fail(`unlimited dimension "${d.name}": its length is the record count, so give no size (got ${d.size})`);
      recordDimId = dimensions.length;
    } else if (!(Number.isInteger(d.size) && (d.size as number) >= 1 && (d.size as number) <= NC_MAX_NON_NEG)) {
      fail(`dimension "${d.name}": size must be an integer from 1 to ${NC_MAX_NON_NEG}, got ${d.size}`);
    }
    dimId.set(d.name, dimensions.length);
    dimensions.push({ name: d.name, size: d.unlimited ? 0 : (d.size as number), unlimited: !!d.unlimited });
  }

  const attributes = validateAttributes(file.attributes ?? [], 'global attribute');
  const variables: ValidVariable[] = [];
  const seen = new Set<string>();
  for (const v of file.variables) {
    checkNetcdfName(v.name, 'a variable');
    if (seen.has(v.name)) fail(`variable "${v.name}" is defined twice`);
    seen.add(v.name);
    variables.push(validateVariable(v, dimId, dimensions, recordDimId));
  }

  const recordVariables = variables.filter((v) => v.isRecord);
  let numrecs = 0;
  for (const v of variables) {
    const what = `variable "${v.name}"`;
    if (!v.isRecord) {
      if (v.data === undefined) fail(`${what} is not a record variable and needs its data`);
      if (v.data!.length !== v.slabCount)
        fail(`${what} needs ${v.slabCount} values (its shape), got ${v.data!.length}`);
    } else if (mode === 'records') {
      if (v.data !== undefined)
        fail(`${what} is a record variable: append its records one at a time instead of giving data`);
    } else {
      if (v.data === undefined)
        fail(`${what} is a record variable and needs its data (all records, record index slowest)`);
      const n = v.data!.length / v.slabCount;
      if (!Number.isInteger(n))
        fail(`${what} has ${v.data!.length} values, not a whole number of records of ${v.slabCount}`);
      if (v === recordVariables[0]) numrecs = n;
      else if (n !== numrecs) fail(`${what} has ${n} records but "${recordVariables[0].name}" has ${numrecs}`);
    }
  }
  if (numrecs > NC_MAX_NON_NEG) fail(`${numrecs} records is more than the format allows (${NC_MAX_NON_NEG})`);
  return { format, dimensions, recordDimId, attributes, variables, recordVariables, numrecs };
}

function validateVariable(
  v: NcVariable,
  dimId: Map<string, number>,
  dims: ValidFile['dimensions'],
  recordDimId: number,
): ValidVariable {
  const what = `variable "${v.name}"`;
  if (!TYPES.includes(v.type)) fail(`${what}: type must be one of ${TYPES.join(', ')}, got ${JSON.stringify(v.type)}`);
  const dimIds = v.dimensions.map((name, k) => {
    const id = dimId.get(name);
    if (id === undefined) return fail(`${what}: dimension "${name}" is not defined`);
    if (id === recordDimId && k > 0) fail(`${what}: the unlimited dimension "${name}" may only be the first dimension`);
    return id;
  });
  const isRecord = dimIds.length > 0 && dimIds[0] === recordDimId;
  let slabCount = 1;
  for (const id of dimIds) if (id !== recordDimId) slabCount *= dims[id].size;
  const slabBytes = slabCount * NC_TYPE_SIZE[v.type];
  const vsize = pad4(slabBytes);
  if (vsize > NC_MAX_VSIZE)
    fail(
      `${what} needs ${vsize} bytes${isRecord ? ' per record' : ''}; the format's vsize allows at most ${NC_MAX_VSIZE}`,
    );
  const attributes = validateAttributes(v.attributes ?? [], `attribute of ${what}`);
  const fillAttr = attributes.find((a) => a.name === '_FillValue');
  if (fillAttr && (fillAttr.type !== v.type || fillAttr.values.length !== 1)) {
    fail(`${what}: _FillValue must be a single ${v.type} value, like the variable`);
  }
  return {
    name: v.name,
    type: v.type,
    dimIds,
    attributes,
    isRecord,
    slabCount,
    slabBytes,
    vsize,
    fill: fillAttr ? fillAttr.values[0] : NC_DEFAULT_FILL[v.type],
    data: dataOf(v.data, v.type, what),
  };
}

function dataOf(data: NcData | undefined, type: NcType, what: string): ArrayLike<number> | undefined {
  if (data === undefined) return undefined;
  if (type === 'char') {
    if (typeof data === 'string') return netcdfTextBytes(data);
    if (data instanceof Uint8Array) return data;
    return fail(`${what} is of type char: give its data as a string or a Uint8Array`);
  }
  if (typeof data === 'string' || typeof (data as ArrayLike<number>).length !== 'number')
    return fail(`${what} is of type ${type}: give its data as an array of numbers`);
  return data;
}

function validateAttributes(list: readonly NcAttribute[], what: string): ValidAttribute[] {
  const seen = new Set<string>();
  return list.map((a) => {
    checkNetcdfName(a.name, `a ${what}`);
    const where = `${what} "${a.name}"`;
    if (seen.has(a.name)) fail(`${where} is given twice`);
    seen.add(a.name);
    if (a.type === 'char') {
      if (typeof a.value !== 'string') fail(`${where} is text: its value must be a string`);
      return { name: a.name, type: 'char', values: netcdfTextBytes(a.value as string) };
    }
    if (!TYPES.includes(a.type))
      fail(`${where}: type must be one of ${TYPES.join(', ')}, got ${JSON.stringify(a.type)}`);
    const values: ArrayLike<number> = typeof a.value === 'number' ? [a.value] : a.value;
    if (typeof values !== 'object' || values === null || typeof values.length !== 'number' || values.length === 0) {
      fail(`${where}: a ${a.type} attribute needs a number or a non-empty array of numbers`);
    }
    for (let k = 0; k < values.length; k++) checkValue(values[k], a.type, `${where}[${k}]`);
    return { name: a.name, type: a.type, values };
  });
}
