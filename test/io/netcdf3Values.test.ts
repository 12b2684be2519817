import { describe, expect, it } from 'vitest';
import { writeDataPadding, writeValues } from '../../lib/io/netcdf3Values';

// Value encodings of the NetCDF classic format specification: big-endian two's complement integers
// and IEEE 754 floats; data padding with the fill value.
const bytesOf = (fn: (v: DataView) => number | void, n: number) => {
  const b = new Uint8Array(n);
  fn(new DataView(b.buffer));
  return Array.from(b);
};

describe('NetCDF-3 values', () => {
  it('writes big-endian values and returns the end offset', () => {
    expect(bytesOf((v) => writeValues(v, 0, 'double', [1], 0, 1, 'x'), 8)).toEqual([0x3f, 0xf0, 0, 0, 0, 0, 0, 0]);
    expect(bytesOf((v) => writeValues(v, 0, 'float', [-2], 0, 1, 'x'), 4)).toEqual([0xc0, 0, 0, 0]);
    expect(bytesOf((v) => writeValues(v, 0, 'int', [-2], 0, 1, 'x'), 4)).toEqual([0xff, 0xff, 0xff, 0xfe]);
    expect(bytesOf((v) => writeValues(v, 0, 'short', [0x1234, -1], 0, 2, 'x'), 4)).toEqual([0x12, 0x34, 0xff, 0xff]);
    expect(bytesOf((v) => writeValues(v, 1, 'byte', [-127, 5, 6], 1, 2, 'x'), 3)).toEqual([0, 5, 6]);
    const b = new Uint8Array(16);
    expect(writeValues(new DataView(b.buffer), 4, 'double', [1, 2, 3], 1, 1, 'x')).toBe(12);
  });

  it('rounds doubles to floats the IEEE way and keeps non-finite values', () => {
    const b = new Uint8Array(16);
    const v = new DataView(b.buffer);
    writeValues(v, 0, 'float', [0.1, NaN, Infinity, 3.4028234663852886e38], 0, 4, 'x');
    expect(v.getFloat32(0)).toBe(Math.fround(0.1));
    expect(v.getFloat32(4)).toBeNaN();
    expect(v.getFloat32(8)).toBe(Infinity);
    expect(v.getFloat32(12)).toBe(3.4028234663852886e38);
  });

  it('refuses values the type cannot hold, naming the index', () => {
    const v = new DataView(new ArrayBuffer(64));
    expect(() => writeValues(v, 0, 'int', [1, 2.5], 0, 2, 'variable "n"')).toThrow(
      /variable "n"\[1\] = 2.5 does not fit type int/,
    );
    expect(() => writeValues(v, 0, 'int', [NaN], 0, 1, 'n')).toThrow(/NaN does not fit type int/);
    expect(() => writeValues(v, 0, 'short', [32768], 0, 1, 'n')).toThrow(/does not fit type short/);
    expect(() => writeValues(v, 0, 'byte', [-129], 0, 1, 'n')).toThrow(/does not fit type byte/);
    expect(() => writeValues(v, 0, 'float', [3.5e38], 0, 1, 'n')).toThrow(/overflows a float/);
  });

  it('pads data with the fill value', () => {
    expect(bytesOf((v) => writeDataPadding(v, 0, 'short', 2, -32767), 2)).toEqual([0x80, 0x01]);
    expect(bytesOf((v) => writeDataPadding(v, 1, 'byte', 3, -127), 4)).toEqual([0, 0x81, 0x81, 0x81]);
    expect(bytesOf((v) => writeDataPadding(v, 0, 'char', 2, 0), 2)).toEqual([0, 0]);
  });
});
