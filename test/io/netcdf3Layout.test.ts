import { describe, expect, it } from 'vitest';
import { fileSize, planLayout } from '../../lib/io/netcdf3Layout';
import type { NcFile, NcType } from '../../lib/io/netcdf3Types';
import { validateNetcdf3 } from '../../lib/io/netcdf3Validate';

// vsize, begin and record size rules of the NetCDF classic format specification ("Note on vsize",
// "Note on padding", "Notes on Computing File Offsets").
const plan = (file: NcFile) => {
  const valid = validateNetcdf3(file, 'records');
  return { valid, layout: planLayout(valid) };
};
const dims = [
  { name: 'time', unlimited: true },
  { name: 'n', size: 5 },
];
const recordVar = (name: string, type: NcType) => ({ name, type, dimensions: ['time', 'n'] });

describe('NetCDF-3 layout', () => {
  it('sums the padded vsizes of the record variables into the record size', () => {
    const { valid, layout } = plan({
      dimensions: dims,
      variables: [recordVar('a', 'short'), recordVar('b', 'byte'), recordVar('c', 'double')],
    });
    expect(valid.variables.map((v) => v.vsize)).toEqual([12, 8, 40]); // 10 → 12, 5 → 8, 40
    expect(layout.recsize).toBe(60);
    expect(layout.begins).toEqual([layout.recordStart, layout.recordStart + 12, layout.recordStart + 20]);
    expect(fileSize(layout, 3)).toBe(layout.recordStart + 180);
  });

  it('packs records without padding when there is exactly one record variable', () => {
    for (const [type, slab] of [
      ['short', 10],
      ['byte', 5],
      ['char', 5],
      ['int', 20],
    ] as const) {
      const { valid, layout } = plan({ dimensions: dims, variables: [recordVar('a', type)] });
      expect(layout.recsize, type).toBe(slab);
      expect(valid.variables[0].vsize, type).toBe(Math.ceil(slab / 4) * 4); // vsize stays padded
    }
  });

  it('places fixed variables contiguously after the header, in header order, before the records', () => {
    const { layout } = plan({
      dimensions: dims,
      variables: [
        { name: 'r', type: 'float', dimensions: ['time'] },
        { name: 'f1', type: 'short', dimensions: ['n'], data: [1, 2, 3, 4, 5] },
        { name: 'f2', type: 'double', dimensions: [], data: [1] },
      ],
    });
    const [r, f1, f2] = layout.begins;
    expect(f1).toBe(layout.headerSize);
    expect(f2).toBe(f1 + 12);
    expect(layout.recordStart).toBe(f2 + 8);
    expect(r).toBe(layout.recordStart);
    expect(layout.headerSize % 4).toBe(0);
  });

  it('refuses offsets beyond 2 GiB in the classic format and allows them in CDF-2', () => {
    // Only lengths are consulted here, so 2 GiB variables can be described without allocating them.
    const huge = { length: 2 ** 28 } as ArrayLike<number>;
    const file: NcFile = {
      format: 'cdf1',
      dimensions: [{ name: 'n', size: 2 ** 28 }],
      variables: [
        { name: 'a', type: 'double', dimensions: ['n'], data: huge },
        { name: 'b', type: 'double', dimensions: ['n'], data: huge },
      ],
    };
    expect(() => plan(file)).toThrow(/variable "b" would begin at byte \d+, beyond the classic format's 2 GiB offsets/);
    expect(plan({ ...file, format: 'cdf2' }).layout.begins[1]).toBeGreaterThan(2 ** 31);
  });
});
