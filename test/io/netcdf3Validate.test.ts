import { describe, expect, it } from 'vitest';
import type { NcFile } from '../../lib/io/netcdf3Types';
import { validateNetcdf3 } from '../../lib/io/netcdf3Validate';

// Structural rules of the NetCDF classic format specification: at most one record dimension, which
// may only be a variable's first; dimension lengths are positive NON_NEG values; _FillValue is a
// single value of the variable's type ("Note on fill values"). Each refusal names the problem.
const base: NcFile = {
  dimensions: [
    { name: 'time', unlimited: true },
    { name: 'x', size: 2 },
  ],
  variables: [{ name: 'q', type: 'double', dimensions: ['time', 'x'], data: [1, 2, 3, 4] }],
};
const refuse = (file: NcFile, why: RegExp, mode: 'whole' | 'records' = 'whole') =>
  expect(() => validateNetcdf3(file, mode)).toThrow(why);

describe('NetCDF-3 description checks', () => {
  it('accepts a good description and counts its records', () => {
    expect(validateNetcdf3(base, 'whole').numrecs).toBe(2);
    expect(
      validateNetcdf3({ ...base, variables: [{ ...base.variables[0], data: undefined }] }, 'records').numrecs,
    ).toBe(0);
  });

  it('refuses bad dimensions', () => {
    refuse(
      { ...base, dimensions: [...base.dimensions, { name: 't2', unlimited: true }] },
      /only one unlimited dimension is allowed \("time" is one\)/,
    );
    refuse({ ...base, dimensions: [{ name: 'x', size: 0 }] }, /dimension "x": size must be an integer from 1/);
    refuse({ ...base, dimensions: [{ name: 'x', size: 2.5 }] }, /size must be an integer/);
    refuse(
      {
        ...base,
        dimensions: [
          { name: 'x', size: 2 },
          { name: 'x', size: 3 },
        ],
      },
      /dimension "x" is defined twice/,
    );
    refuse({ ...base, dimensions: [{ name: 'time', unlimited: true, size: 4 }] }, /give no size/);
    refuse({ ...base, dimensions: [{ name: 'bad/name', size: 1 }] }, /a dimension has an invalid name "bad\/name"/);
  });

  it('refuses bad variables', () => {
    refuse(
      { ...base, variables: [{ name: 'q', type: 'double', dimensions: ['x', 'time'], data: [1, 2] }] },
      /unlimited dimension "time" may only be the first/,
    );
    refuse(
      { ...base, variables: [{ name: 'q', type: 'double', dimensions: ['z'], data: [1] }] },
      /variable "q": dimension "z" is not defined/,
    );
    refuse({ ...base, variables: [base.variables[0], base.variables[0]] }, /variable "q" is defined twice/);
    refuse(
      { ...base, variables: [{ name: 'q', type: 'int64' as never, dimensions: [], data: [1] }] },
      /type must be one of byte, char, short, int, float, double/,
    );
    refuse(
      { ...base, variables: [{ name: 'f', type: 'double', dimensions: ['x'] }] },
      /variable "f" is not a record variable and needs its data/,
    );
    refuse(
      { ...base, variables: [{ name: 'f', type: 'double', dimensions: ['x'], data: [1, 2, 3] }] },
      /needs 2 values \(its shape\), got 3/,
    );
    refuse(
      { ...base, variables: [{ name: 'q', type: 'double', dimensions: ['time', 'x'], data: [1, 2, 3] }] },
      /not a whole number of records of 2/,
    );
    refuse(
      { ...base, variables: [base.variables[0], { name: 'r', type: 'int', dimensions: ['time'], data: [1, 2, 3] }] },
      /variable "r" has 3 records but "q" has 2/,
    );
    refuse(base, /append its records one at a time/, 'records');
    refuse(
      { ...base, variables: [{ name: 'c', type: 'char', dimensions: ['x'], data: [65, 66] }] },
      /char: give its data as a string or a Uint8Array/,
    );
    refuse(
      { ...base, variables: [{ name: 'f', type: 'float', dimensions: ['x'], data: 'ab' }] },
      /give its data as an array of numbers/,
    );
    const huge = { length: 2 ** 30 } as ArrayLike<number>;
    refuse(
      {
        dimensions: [{ name: 'n', size: 2 ** 30 }],
        variables: [{ name: 'big', type: 'double', dimensions: ['n'], data: huge }],
      },
      /variable "big" needs 8589934592 bytes; the format's vsize allows at most 4294967292/,
    );
  });

  it('refuses bad attributes', () => {
    const withAttrs = (attributes: NcFile['attributes']) => ({ ...base, attributes });
    refuse(
      withAttrs([{ name: 'a', type: 'int', value: 1.5 }]),
      /global attribute "a"\[0\] = 1.5 does not fit type int/,
    );
    refuse(
      withAttrs([{ name: 'a', type: 'int', value: 2 ** 31 }]),
      /does not fit type int \(an integer from -2147483648 to 2147483647\)/,
    );
    refuse(withAttrs([{ name: 'a', type: 'short', value: [1, 40000] }]), /"a"\[1\] = 40000 does not fit type short/);
    refuse(withAttrs([{ name: 'a', type: 'byte', value: 128 }]), /does not fit type byte/);
    refuse(withAttrs([{ name: 'a', type: 'float', value: 1e39 }]), /overflows a float/);
    refuse(withAttrs([{ name: 'a', type: 'double', value: [] }]), /needs a number or a non-empty array/);
    refuse(withAttrs([{ name: 'a', type: 'char', value: 3 as never }]), /is text: its value must be a string/);
    refuse(
      withAttrs([
        { name: 'a', type: 'char', value: 'x' },
        { name: 'a', type: 'char', value: 'y' },
      ]),
      /global attribute "a" is given twice/,
    );
    const fill = (value: number, type: 'float' | 'double') => ({
      ...base,
      variables: [{ ...base.variables[0], attributes: [{ name: '_FillValue', type, value }] }],
    });
    refuse(fill(-1, 'float'), /_FillValue must be a single double value/);
    expect(() => validateNetcdf3(fill(-1, 'double'), 'whole')).not.toThrow();
  });
});
