import { describe, expect, it } from 'vitest';
import { ncDouble, ncText, NUMRECS_OFFSET, type NcFile } from '../../lib/io/netcdf3Types';
import { encodeNetcdf3 } from '../../lib/io/netcdf3Writer';
import { decodeSlab, readNetcdf } from '../../lib/io/netcdfRead';
import { randomArray } from '../support/random';

// The typed view over netcdfjs, and record-at-a-time reading by the offsets and record size of the
// NetCDF classic format specification (including the packed single-record-variable case).
const nt = 4;
const ny = 3;
const nx = 5;
const q = randomArray(nt * ny * nx, 11);
const file: NcFile = {
  dimensions: [
    { name: 'time', unlimited: true },
    { name: 'y', size: ny },
    { name: 'x', size: nx },
  ],
  attributes: [
    ncText('Conventions', 'CF-1.8'),
    ncText('équation', 'ζ = ∇²ψ'),
    { name: 'flags', type: 'byte', value: [-1, 5] },
    { name: 'one', type: 'short', value: -3 },
  ],
  variables: [
    {
      name: 'x',
      type: 'double',
      dimensions: ['x'],
      data: [0, 1, 2, 3, 4],
      attributes: [ncText('units', '1'), ncDouble('scale', [1, 2])],
    },
    { name: 'time', type: 'double', dimensions: ['time'], data: [0, 1, 2, 3] },
    { name: 'q', type: 'double', dimensions: ['time', 'y', 'x'], data: q },
    {
      name: 'n',
      type: 'short',
      dimensions: ['time', 'y'],
      data: Int16Array.from({ length: nt * ny }, (_, i) => i - 6),
    },
    { name: 'qf', type: 'float', dimensions: ['time', 'y', 'x'], data: Float32Array.from(q) },
  ],
};
const bytes = encodeNetcdf3(file);
/** Header length: the first variable's data begins right after it. */
const headerSize = readNetcdf(bytes).slabRange('x').offset;

describe('readNetcdf', () => {
  const f = readNetcdf(bytes);

  it('gives dimensions, attributes and variables with their shapes', () => {
    expect(f.format).toBe('cdf2');
    expect(f.numRecords).toBe(nt);
    expect(f.dimensions).toEqual([
      { name: 'time', size: nt, unlimited: true },
      { name: 'y', size: ny, unlimited: false },
      { name: 'x', size: nx, unlimited: false },
    ]);
    expect(f.attributes).toEqual({ Conventions: 'CF-1.8', équation: 'ζ = ∇²ψ', flags: [-1, 5], one: -3 });
    expect(f.variables.map((v) => [v.name, v.type, v.dimensions.join(','), v.shape.join('x'), v.isRecord])).toEqual([
      ['x', 'double', 'x', '5', false],
      ['time', 'double', 'time', '4', true],
      ['q', 'double', 'time,y,x', '4x3x5', true],
      ['n', 'short', 'time,y', '4x3', true],
      ['qf', 'float', 'time,y,x', '4x3x5', true],
    ]);
    expect(f.variable('x').attributes).toEqual({ units: '1', scale: [1, 2] });
  });

  it('reads one record at a time, bit for bit, into a reused buffer', () => {
    const out = new Float64Array(ny * nx);
    for (let r = 0; r < nt; r++) {
      expect(f.readRecord('q', r, out)).toBe(out);
      expect(Array.from(out)).toEqual(Array.from(q.subarray(r * ny * nx, (r + 1) * ny * nx)));
      expect(Array.from(f.readRecord('n', r))).toEqual([0, 1, 2].map((k) => r * ny + k - 6));
    }
    expect(f.readRecord('qf', 2)).toBeInstanceOf(Float32Array);
    expect(Array.from(f.readVariable('qf'))).toEqual(Array.from(Float32Array.from(q)));
    expect(Array.from(f.readVariable('x'))).toEqual([0, 1, 2, 3, 4]);
    expect(() => f.readRecord('q', 0, new Float32Array(ny * nx))).toThrow(/out must be a Float64Array of length 15/);
  });

  it('reads packed records of a single short or char record variable', () => {
    const s = Int16Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    const g = readNetcdf(
      encodeNetcdf3({
        dimensions: [
          { name: 't', unlimited: true },
          { name: 'n', size: 3 },
        ],
        variables: [{ name: 's', type: 'short', dimensions: ['t', 'n'], data: s }],
      }),
    );
    expect(g.recordSize).toBe(6);
    expect(Array.from(g.readRecord('s', 2))).toEqual([7, 8, 9]);
    const c = readNetcdf(
      encodeNetcdf3({
        dimensions: [
          { name: 't', unlimited: true },
          { name: 'n', size: 3 },
        ],
        variables: [{ name: 'c', type: 'char', dimensions: ['t', 'n'], data: 'abcdefghi' }],
      }),
    );
    expect(String.fromCharCode(...c.readRecord('c', 1))).toBe('def');
  });

  it('serves large files from a header prefix and byte ranges', () => {
    const head = readNetcdf(bytes.slice(0, headerSize), { headerOnly: true });
    const { offset, byteLength } = head.slabRange('q', 3);
    const rec = decodeSlab('double', bytes.slice(offset, offset + byteLength));
    expect(Array.from(rec)).toEqual(Array.from(q.subarray(3 * ny * nx)));
    expect(() => head.readRecord('q', 3)).toThrow(
      /truncated NetCDF file: record 3 of "q" ends at byte \d+ but the file has \d+ bytes/,
    );
  });

  it('infers the record count of a streaming file (numrecs = 2³²−1) from its length', () => {
    const streaming = bytes.slice();
    new DataView(streaming.buffer).setUint32(NUMRECS_OFFSET, 0xffffffff);
    expect(readNetcdf(streaming).numRecords).toBe(nt);
    expect(readNetcdf(streaming.slice(0, streaming.length - f.recordSize)).numRecords).toBe(nt - 1);
  });
});

describe('readNetcdf refuses', () => {
  it('bytes that are not NetCDF-3', () => {
    expect(() => readNetcdf(new TextEncoder().encode('x,y\r\n1,2\r\n'))).toThrow(
      /not a NetCDF file: it does not start with "CDF"/,
    );
    expect(() => readNetcdf(new Uint8Array([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]))).toThrow(
      /HDF5 \(NetCDF-4\)/,
    );
    const cdf5 = bytes.slice();
    cdf5[3] = 5;
    expect(() => readNetcdf(cdf5)).toThrow(/CDF-5 .* not supported/);
    expect(() => readNetcdf(new Uint8Array(0))).toThrow(/not a NetCDF file/);
  });

  it('truncated files, in the header or in the data', () => {
    for (const cut of [10, 40, 200, headerSize - 1, headerSize]) {
      expect(() => readNetcdf(bytes.slice(0, cut)), `cut at ${cut}`).toThrow(/truncated/);
    }
    expect(() => readNetcdf(bytes.slice(0, bytes.length - 1))).toThrow(
      /truncated NetCDF file: record 3 of "qf" ends at byte \d+ but the file has \d+ bytes/,
    );
  });

  it('a missing variable or record, naming what there is', () => {
    const f = readNetcdf(bytes);
    expect(() => f.variable('zeta')).toThrow(/no variable "zeta" \(it has "x", "time", "q", "n", "qf"\)/);
    expect(() => f.readRecord('q', 4)).toThrow(/record 4 of "q" does not exist \(the file has 4 records\)/);
    expect(() => f.readRecord('x', 1)).toThrow(/"x" is not a record variable/);
  });
});

describe('readNetcdf on an empty file', () => {
  it('reads a file with no dimensions, attributes or variables', () => {
    const f = readNetcdf(encodeNetcdf3({ format: 'cdf1', dimensions: [], variables: [] }));
    expect([f.format, f.dimensions, f.attributes, f.variables, f.numRecords]).toEqual(['cdf1', [], {}, [], 0]);
  });
});
