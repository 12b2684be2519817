import { describe, expect, it } from 'vitest';
import { File } from 'jsfive';
import { AllocationMeter } from '../../lib/io/allocationMeter';
import { memorySource } from '../../lib/io/byteSource';
import { openDataset } from '../../lib/io/openDataset';
import { cdl, type CdlFile, type CdlVariable } from '../support/cdl';
import { ncgen, runNcgen } from './ncgenTool';

/**
 * netCDF-4 files written by the NetCDF reference library (ncgen -k nc4), read by jsfive plus
 * Stria's additions, checked value for value against the NetCDF-3 file ncgen writes from the same
 * CDL (read by the independent netcdfjs-based reader). Storage variants per the HDF5 File Format
 * Specification: contiguous, compact, chunked with edge chunks, deflate + shuffle, fletcher32,
 * big-endian, dense attribute storage.
 */
function file(
  nt: number,
  ny: number,
  nx: number,
  storage: Record<string, string | number | number[]>,
  extra: CdlVariable[] = [],
): CdlFile {
  return {
    dims: [
      { name: 'time', size: nt },
      { name: 'y', size: ny },
      { name: 'x', size: nx },
    ],
    vars: [
      {
        name: 'time',
        type: 'double',
        dims: ['time'],
        attrs: { units: 'days since 2000-01-01' },
        data: Array.from({ length: nt }, (_, t) => t / 4),
      },
      {
        name: 'y',
        type: 'double',
        dims: ['y'],
        attrs: { units: 'degrees_north' },
        data: Array.from({ length: ny }, (_, j) => -30 + 2.5 * j),
      },
      {
        name: 'x',
        type: 'float',
        dims: ['x'],
        attrs: { units: 'degrees_east' },
        data: Array.from({ length: nx }, (_, i) => 5 * i),
      },
      {
        name: 'u',
        type: 'float',
        dims: ['time', 'y', 'x'],
        attrs: { units: 'm s-1', _FillValue: -999, ...storage },
        data: Array.from({ length: nt * ny * nx }, (_, k) => Math.sin(k) * 30),
      },
      {
        name: 'w',
        type: 'double',
        dims: ['y', 'x'],
        attrs: { long_name: 'a fixed field' },
        data: Array.from({ length: ny * nx }, (_, k) => k / 7),
      },
      ...extra,
    ],
    globals: { title: 'netCDF-4 test', history: 'made by the test' },
  };
}

const STORAGE: Record<string, Record<string, string | number | number[]>> = {
  contiguous: { _Storage: 'contiguous' },
  'chunked, edge chunks': { _ChunkSizes: [2, 3, 4] },
  'deflate + shuffle': { _ChunkSizes: [1, 7, 9], _DeflateLevel: 1, _Shuffle: 'true' },
  'deflate, chunks spanning records': { _ChunkSizes: [3, 4, 5], _DeflateLevel: 5 },
  fletcher32: { _ChunkSizes: [1, 7, 9], _Fletcher32: 'true' },
  'big-endian': { _Endianness: 'big' },
};

describe.runIf(runNcgen)('netCDF-4 (HDF5) through the dataset interface (files written by ncgen)', () => {
  for (const [name, storage] of Object.entries(STORAGE)) {
    it(`reads the same values as the NetCDF-3 file: ${name}`, () => {
      const text = cdl(file(5, 7, 9, storage));
      const h5 = openDataset(memorySource(ncgen(text, 'nc4')));
      const nc3 = openDataset(
        memorySource(
          ncgen(
            text.replace(/^\s+u:_(Storage|ChunkSizes|DeflateLevel|Shuffle|Fletcher32|Endianness) = .*$/gm, ''),
            'nc3',
          ),
        ),
      );
      expect(h5.format).toBe('netcdf4');
      expect(h5.dimensions).toEqual(nc3.dimensions);
      expect(h5.variables.map((v) => v.name)).toEqual(nc3.variables.map((v) => v.name));
      expect(h5.attributes).toEqual(nc3.attributes);
      for (const v of nc3.variables) {
        expect(h5.variable(v.name)).toMatchObject({ type: v.type, dimensions: v.dimensions, shape: v.shape });
        expect(h5.variable(v.name).attributes).toEqual(v.attributes);
        expect(Array.from(h5.readAll(v.name))).toEqual(Array.from(nc3.readAll(v.name)));
      }
      for (const t of [0, 3, 4]) expect(Array.from(h5.readRecord('u', t))).toEqual(Array.from(nc3.readRecord('u', t)));
      // A range of a record (one row, a run across rows, a piece of a row) is that slice of it, in both readers.
      const whole = Array.from(nc3.readRecord('u', 3));
      for (const [start, count] of [
        [9, 9],
        [5, 20],
        [60, 3],
        [0, 63],
      ]) {
        const slice = whole.slice(start, start + count);
        expect(Array.from(h5.readRecord('u', 3, { range: { start, count } })), `${start}+${count}`).toEqual(slice);
        expect(Array.from(nc3.readRecord('u', 3, { range: { start, count } }))).toEqual(slice);
      }
      expect(() => h5.readRecord('u', 3, { range: { start: 60, count: 4 } })).toThrow(/not within a record of 63/);
    });
  }

  it('reads compact storage and an unlimited dimension', () => {
    const f = file(2, 3, 4, {}, [
      { name: 'c', type: 'int', dims: ['x'], attrs: { _Storage: 'compact' }, data: [7, -8, 9, 10] },
    ]);
    f.dims[0].size = 'unlimited';
    const r = openDataset(memorySource(ncgen(cdl(f), 'nc4')));
    expect(r.dimensions[0]).toEqual({ name: 'time', size: 2, unlimited: true });
    expect(Array.from(r.readAll('c'))).toEqual([7, -8, 9, 10]);
  });

  it('reads attributes in dense storage, which jsfive alone drops, in creation order', () => {
    const attrs: Record<string, string | number> = { units: 'm s-1', standard_name: 'eastward_wind' };
    for (let k = 0; k < 70; k++)
      attrs[`note${String(k).padStart(2, '0')}`] = k % 2 ? k + 0.25 : 'text '.repeat((k % 9) + 1) + k;
    const f = file(1, 3, 4, {}, [
      { name: 'rich', type: 'float', dims: ['y', 'x'], attrs, data: Array.from({ length: 12 }, (_, k) => k) },
    ]);
    const bytes = ncgen(cdl(f), 'nc4');
    // jsfive's own view of the variable: no attributes at all (HDF5 keeps more than 8 in a heap).
    const h = new File(bytes.slice().buffer);
    expect(Object.keys((h.get('rich') as unknown as { attrs: object }).attrs)).toEqual([]);
    const r = openDataset(memorySource(bytes));
    const got = r.variable('rich').attributes;
    expect(Object.keys(got)).toEqual(Object.keys(attrs));
    expect(got).toEqual(attrs);
    expect(r.variable('rich').dimensions).toEqual(['y', 'x']);
  });

  it('decodes only the chunks of the record read, dropping them after use', () => {
    const [nt, ny, nx] = [6, 16, 20];
    const meter = new AllocationMeter();
    const r = openDataset(
      memorySource(
        ncgen(cdl(file(nt, ny, nx, { _ChunkSizes: [1, 8, 10], _DeflateLevel: 1, _Shuffle: 'true' })), 'nc4'),
      ),
      { meter },
    );
    r.readRecord('u', 4);
    meter.endRecord();
    // Four chunks of 8·10 floats: per chunk the stored bytes, the inflated and the unshuffled
    // copies, each at most one chunk (deflate of sine values does not expand them).
    const chunk = 8 * 10 * 4;
    expect(meter.peakTransient).toBeGreaterThan(4 * 2 * chunk);
    expect(meter.peakTransient).toBeLessThanOrEqual(4 * 3 * chunk);
  });

  it('lists subgroups it does not read', () => {
    const text = cdl(file(1, 2, 2, {})).replace(
      /}\n$/,
      'group: extra {\n  variables:\n    int k ;\n  data:\n    k = 1 ;\n}\n}\n',
    );
    const r = openDataset(memorySource(ncgen(text, 'nc4')));
    expect(r.notes).toContain('the group "extra" was not read: only the root group of a netCDF-4 file is');
  });

  it('names each attribute it cannot decode with its variable, and a named type as a type', () => {
    const text = `netcdf t {
types:
  compound pair { int a ; double b ; } ;
dimensions:
  y = 2 ;
variables:
  double u(y) ; pair u:meta = {1, 2.5} ;
  double v(y) ; pair v:meta = {1, 2.5} ;
data:
  u = 1, 2 ;
  v = 3, 4 ;
}
`;
    const r = openDataset(memorySource(ncgen(text, 'nc4')));
    const about = (name: string) =>
      `the attribute "meta" of "${name}" has a type the HDF5 reader cannot decode (such as a compound type): left out`;
    expect(r.notes).toEqual(
      expect.arrayContaining([
        about('u'),
        about('v'),
        '"pair" is a named data type (a netCDF-4 user-defined type), not a variable: not read',
      ]),
    );
    expect(r.notes.some((n) => n.includes('group'))).toBe(false);
    expect(Array.from(r.readAll('v'))).toEqual([3, 4]);
  });

  it('refuses a truncated file with the size its superblock states', () => {
    const bytes = ncgen(cdl(file(2, 3, 4, {})), 'nc4');
    expect(() => openDataset(memorySource(bytes.subarray(0, bytes.length - 100)))).toThrow(
      new RegExp(
        `truncated HDF5 file: its superblock says the file is ${bytes.length} bytes long, but it has ${bytes.length - 100}`,
      ),
    );
    expect(() => openDataset(memorySource(bytes.subarray(0, 20)))).toThrow(/truncated HDF5 file/);
  });

  it('refuses a filter jsfive cannot decode, naming it', () => {
    const bytes = ncgen(cdl(file(2, 7, 9, STORAGE['deflate + shuffle'])), 'nc4');
    // Rewrite the deflate filter's id (1) in u's filter pipeline message (type 0x000B, version 2:
    // per filter a 2-byte id, then flags and client data) to 32015, a registered plug-in's id.
    const u = new File(bytes.slice().buffer).get('u') as unknown as {
      _dataobjects: { find_msg_type(t: number): Map<string, number>[] };
    };
    let p = (u._dataobjects.find_msg_type(0x000b)[0].get('offset_to_message') as number) + 2;
    const view = new DataView(bytes.buffer, bytes.byteOffset);
    for (let f = 0; f < 2; f++) {
      if (view.getUint16(p, true) === 1) view.setUint16(p, 32015, true);
      p += 6 + 4 * view.getUint16(p + 4, true);
    }
    const r = openDataset(memorySource(bytes));
    expect(() => r.readRecord('u', 0)).toThrow(
      '"u" is compressed with filter id 32015 (a registered plug-in filter), which the HDF5 reader (jsfive) cannot decode; it decodes deflate, shuffle and fletcher32 only',
    );
  });
});
