import { NetCDFReader } from 'netcdfjs';
import { describe, expect, it } from 'vitest';
import { ncDouble, ncFloat, ncInt, ncText, NUMRECS_OFFSET, type NcFile } from '../../lib/io/netcdf3Types';
import { encodeNetcdf3, Netcdf3RecordWriter } from '../../lib/io/netcdf3Writer';
import { randomArray } from '../support/random';

// Files written by our writer, read back by netcdfjs (an independent reader from the npm registry),
// checked against the NetCDF classic format specification: dimensions, attributes, values bit for
// bit, record variables, both format variants, padding after odd-length text and bytes.
const SPECIALS = [0, -0, NaN, Infinity, -Infinity, 5e-324, -Number.MIN_VALUE, Number.MAX_VALUE, 1 / 3, -2.5e-310];

function sample(): NcFile {
  const nt = 3;
  const ny = 3;
  const nx = 4;
  const q = randomArray(nt * ny * nx, 7);
  q.set(SPECIALS);
  return {
    dimensions: [
      { name: 'time', unlimited: true },
      { name: 'y', size: ny },
      { name: 'x', size: nx },
      { name: 'len5', size: 5 },
    ],
    attributes: [
      ncText('Conventions', 'CF-1.8'),
      ncText('odd', 'abcde'),
      ncText('empty', ''),
      ncText('greek', 'βy + ζ'),
      ncDouble('pi', Math.PI),
      ncDouble('list', [1e-300, -0, 2 ** 53]),
      ncInt('ints', [-2147483648, 0, 2147483647]),
      ncFloat('f', 0.1),
    ],
    variables: [
      { name: 'label', type: 'char', dimensions: ['len5'], data: 'Stria' },
      { name: 'bytes', type: 'byte', dimensions: ['len5'], data: [-128, -1, 0, 1, 127] },
      {
        name: 'x',
        type: 'double',
        dimensions: ['x'],
        data: [0, 0.25, 0.5, 0.75],
        attributes: [ncText('units', '1'), ncText('axis', 'X')],
      },
      { name: 'y', type: 'float', dimensions: ['y'], data: [0, 1 / 3, 2 / 3] },
      { name: 'time', type: 'double', dimensions: ['time'], data: [0, 0.5, 1] },
      { name: 'step', type: 'int', dimensions: ['time'], data: [0, 100, 2147483647] },
      { name: 'q', type: 'double', dimensions: ['time', 'y', 'x'], data: q, attributes: [ncText('long_name', 'PV')] },
      { name: 'qf', type: 'float', dimensions: ['time', 'y', 'x'], data: Float32Array.from(q) },
    ],
  };
}

/** netcdfjs returns one record as a number or an array; flatten to one list. */
const flat = (v: unknown): number[] => (Array.isArray(v) ? v.flatMap(flat) : [v as number]);

function expectSameValues(actual: ArrayLike<number>, expected: ArrayLike<number>): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++)
    if (!Object.is(actual[i], expected[i])) expect.fail(`value ${i}: ${actual[i]} !== ${expected[i]}`);
}

describe('NetCDF-3 writer, read back by netcdfjs', () => {
  for (const format of ['cdf1', 'cdf2'] as const) {
    it(`${format}: dimensions, attributes and values round-trip`, () => {
      const file = { ...sample(), format };
      const r = new NetCDFReader(encodeNetcdf3(file));
      expect(r.version).toBe(format === 'cdf1' ? 'classic format' : '64-bit offset format');
      expect(r.dimensions).toEqual([
        { name: 'time', size: 0 },
        { name: 'y', size: 3 },
        { name: 'x', size: 4 },
        { name: 'len5', size: 5 },
      ]);
      expect(r.recordDimension.length).toBe(3);
      expect(r.recordDimension.name).toBe('time');

      const g = Object.fromEntries(r.globalAttributes.map((a) => [a.name, a]));
      expect(g.Conventions).toEqual({ name: 'Conventions', type: 'char', value: 'CF-1.8' });
      expect(g.odd.value).toBe('abcde');
      expect(g.empty.value).toBe('');
      expect(g.pi).toEqual({ name: 'pi', type: 'double', value: Math.PI });
      expectSameValues(g.list.value as unknown as number[], [1e-300, -0, 2 ** 53]);
      expect(g.ints.value).toEqual([-2147483648, 0, 2147483647]);
      expect(g.f).toEqual({ name: 'f', type: 'float', value: Math.fround(0.1) });

      const x = r.variables.find((v) => v.name === 'x')!;
      expect((x.attributes as { name: string; value: unknown }[]).map((a) => [a.name, a.value])).toEqual([
        ['units', '1'],
        ['axis', 'X'],
      ]);
      expect(r.variables.map((v) => [v.name, v.type, v.record])).toEqual([
        ['label', 'char', false],
        ['bytes', 'byte', false],
        ['x', 'double', false],
        ['y', 'float', false],
        ['time', 'double', true],
        ['step', 'int', true],
        ['q', 'double', true],
        ['qf', 'float', true],
      ]);

      const data = Object.fromEntries(file.variables.map((v) => [v.name, v.data]));
      expect(r.getDataVariableAsString('label')).toBe('Stria');
      // netcdfjs reads bytes unsigned and reads the whole vsize, so the padding shows: the byte fill
      // value −127, as the specification asks of data padding.
      expect(flat(r.getDataVariable('bytes')).map((b) => (b << 24) >> 24)).toEqual([
        -128, -1, 0, 1, 127, -127, -127, -127,
      ]);
      expectSameValues(flat(r.getDataVariable('x')), data.x as number[]);
      expectSameValues(flat(r.getDataVariable('y')), Float32Array.from(data.y as number[]));
      expectSameValues(flat(r.getDataVariable('time')), data.time as number[]);
      expectSameValues(flat(r.getDataVariable('step')), data.step as number[]);
      expectSameValues(flat(r.getDataVariable('q')), data.q as Float64Array);
      expectSameValues(flat(r.getDataVariable('qf')), data.qf as Float32Array);
    });
  }

  it('writes a single record variable (packed records) that netcdfjs reads', () => {
    const v = randomArray(5 * 7, 3);
    const r = new NetCDFReader(
      encodeNetcdf3({
        dimensions: [
          { name: 't', unlimited: true },
          { name: 'n', size: 7 },
        ],
        variables: [{ name: 'v', type: 'double', dimensions: ['t', 'n'], data: v }],
      }),
    );
    expect(r.recordDimension.length).toBe(5);
    expectSameValues(flat(r.getDataVariable('v')), v);
  });

  it('writes a file with an unlimited dimension and no records', () => {
    const r = new NetCDFReader(
      encodeNetcdf3({
        dimensions: [{ name: 't', unlimited: true }],
        variables: [{ name: 'v', type: 'int', dimensions: ['t'], data: [] }],
      }),
    );
    expect(r.recordDimension.length).toBe(0);
    expect(r.variables[0].record).toBe(true);
  });
});

describe('Netcdf3RecordWriter', () => {
  const file = sample();
  const recordless: NcFile = {
    ...file,
    variables: file.variables.map((v) => (v.dimensions[0] === 'time' ? { ...v, data: undefined } : v)),
  };
  const slab = (name: string, r: number) => {
    const v = file.variables.find((x) => x.name === name)!;
    const n = name === 'time' || name === 'step' ? 1 : 12;
    return Array.from(v.data as ArrayLike<number>).slice(r * n, (r + 1) * n);
  };

  it('produces, record by record, the same bytes as the whole-file writer', () => {
    const w = new Netcdf3RecordWriter(recordless);
    const whole = encodeNetcdf3(file);
    const out = new Uint8Array(whole.length);
    const head = w.head();
    expect(head.length).toBe(w.layout.recordStart);
    out.set(head);
    for (let r = 0; r < 3; r++) {
      const bytes = w.appendRecord({
        time: slab('time', r),
        step: slab('step', r),
        q: slab('q', r),
        qf: slab('qf', r),
      });
      expect(bytes.length).toBe(w.layout.recsize);
      out.set(bytes, w.recordOffset(r));
      out.set(w.numrecsField(), NUMRECS_OFFSET);
      // After every record the bytes so far are a complete file.
      const partial = new NetCDFReader(out.subarray(0, w.recordOffset(r + 1)));
      expect(partial.recordDimension.length).toBe(r + 1);
    }
    expect(w.numrecs).toBe(3);
    expect(Array.from(out)).toEqual(Array.from(whole));
  });

  it('refuses a record with a missing, unknown or wrong-sized slab', () => {
    const w = new Netcdf3RecordWriter(recordless);
    const good = { time: [0], step: [0], q: slab('q', 0), qf: slab('qf', 0) };
    expect(() => w.appendRecord({ ...good, qf: undefined as never })).toThrow(/record 0 of variable "qf" is missing/);
    expect(() => w.appendRecord({ ...good, zeta: [1] })).toThrow(/"zeta" is not a record variable of this file/);
    expect(() => w.appendRecord({ ...good, q: [1, 2] })).toThrow(/record 0 of variable "q" needs 12 values, got 2/);
    expect(() => w.appendRecord({ ...good, step: [0.5] })).toThrow(/variable "step"\[0\] = 0.5 does not fit type int/);
    expect(() => new Netcdf3RecordWriter(file)).toThrow(/record variable: append its records one at a time/);
  });
});
