import { describe, expect, it } from 'vitest';
import { memorySource, type ByteSource } from '../../lib/io/byteSource';
import { openDataset } from '../../lib/io/openDataset';
import { sniffFormat } from '../../lib/io/datasetReader';
import { cdl, type CdlFile } from '../support/cdl';
import { ncgen, runNcgen } from './ncgenTool';

/** A file of two records of a (time, y, x) float field and its coordinates, values k + 0.5. */
function sample(nt: number, ny: number, nx: number): { file: CdlFile; values: number[] } {
  const values = Array.from({ length: nt * ny * nx }, (_, k) => k + 0.5);
  return {
    values,
    file: {
      dims: [
        { name: 'time', size: 'unlimited' },
        { name: 'y', size: ny },
        { name: 'x', size: nx },
      ],
      vars: [
        {
          name: 'time',
          type: 'double',
          dims: ['time'],
          attrs: { units: 's' },
          data: Array.from({ length: nt }, (_, t) => 10 * t),
        },
        {
          name: 'y',
          type: 'double',
          dims: ['y'],
          attrs: { units: 'km' },
          data: Array.from({ length: ny }, (_, j) => j),
        },
        {
          name: 'x',
          type: 'double',
          dims: ['x'],
          attrs: { units: 'km' },
          data: Array.from({ length: nx }, (_, i) => 2 * i),
        },
        {
          name: 'u',
          type: 'float',
          dims: ['time', 'y', 'x'],
          attrs: { units: 'm s-1', _FillValue: -999, long_name: 'zonal "wind"' },
          data: values,
        },
        {
          name: 'h',
          type: 'short',
          dims: ['y', 'x'],
          attrs: { scale_factor: 0.5 },
          data: Array.from({ length: ny * nx }, (_, k) => k - 3),
        },
      ],
      globals: { title: 'test file', answer: 42.5 },
    },
  };
}

/** A source that counts the bytes it hands out, to show that reading a record reads only that record. */
function countingSource(bytes: Uint8Array): ByteSource & { bytesRead: number } {
  const inner = memorySource(bytes);
  const s = {
    bytesRead: 0,
    byteLength: inner.byteLength,
    read(offset: number, length: number, into?: Uint8Array) {
      s.bytesRead += length;
      return inner.read(offset, length, into);
    },
    whole() {
      s.bytesRead += inner.byteLength;
      return inner.whole();
    },
  };
  return s;
}

describe.runIf(runNcgen)('NetCDF-3 through the dataset interface (files written by ncgen)', () => {
  for (const kind of ['nc3', 'nc6'] as const) {
    it(`reads dimensions, attributes and records of a ${kind === 'nc3' ? 'classic' : '64-bit offset'} file`, () => {
      const { file, values } = sample(3, 4, 5);
      const r = openDataset(memorySource(ncgen(cdl(file), kind)));
      expect(r.format).toBe(kind === 'nc3' ? 'netcdf3-classic' : 'netcdf3-64bit-offset');
      expect(r.dimensions).toEqual([
        { name: 'time', size: 3, unlimited: true },
        { name: 'y', size: 4, unlimited: false },
        { name: 'x', size: 5, unlimited: false },
      ]);
      expect(r.attributes).toMatchObject({ title: 'test file', answer: 42.5 });
      const u = r.variable('u');
      expect(u).toMatchObject({ type: 'float32', dimensions: ['time', 'y', 'x'], shape: [3, 4, 5] });
      expect(u.attributes).toMatchObject({ units: 'm s-1', _FillValue: -999, long_name: 'zonal "wind"' });
      expect(r.recordCount('u')).toBe(3);
      expect(r.recordLength('u')).toBe(20);
      for (let t = 0; t < 3; t++) expect(Array.from(r.readRecord('u', t))).toEqual(values.slice(20 * t, 20 * (t + 1)));
      expect(Array.from(r.readAll('x'))).toEqual([0, 2, 4, 6, 8]);
      expect(Array.from(r.readAll('time'))).toEqual([0, 10, 20]);
      // Stored numbers, not unpacked: scale_factor is applied by fieldValues.ts.
      expect(Array.from(r.readAll('h')).slice(0, 3)).toEqual([-3, -2, -1]);
    });
  }

  it('reads one record without reading the others', () => {
    const { file } = sample(40, 64, 64);
    const bytes = ncgen(cdl(file), 'nc6');
    const src = countingSource(bytes);
    const r = openDataset(src);
    const afterHeader = src.bytesRead;
    // The header is parsed from a 64 KiB prefix (plus the 8-byte format sniffs), not the 655 kB file.
    expect(bytes.length).toBeGreaterThan(600_000);
    expect(afterHeader).toBeLessThanOrEqual(65536 + 16);
    r.readRecord('u', 37);
    // One record of u is 64·64 floats; the coordinates are not touched either.
    expect(src.bytesRead - afterHeader).toBe(64 * 64 * 4);
  });

  it('reports progress of a record read in bytes', () => {
    const { file } = sample(2, 8, 8);
    const r = openDataset(memorySource(ncgen(cdl(file), 'nc3')));
    const seen: number[] = [];
    r.readRecord('u', 1, { onProgress: (p) => seen.push(p.done / p.total) });
    expect(seen[seen.length - 1]).toBe(1);
  });

  it('refuses a truncated file, naming the record that does not fit', () => {
    const { file } = sample(3, 4, 5);
    const bytes = ncgen(cdl(file), 'nc3');
    expect(() => openDataset(memorySource(bytes.subarray(0, bytes.length - 10)))).toThrow(
      /truncated NetCDF file: record 2 of "(u|time)" ends at byte \d+ but the file has \d+ bytes/,
    );
    expect(() => openDataset(memorySource(bytes.subarray(0, 40)))).toThrow(/truncated or corrupt NetCDF file/);
  });

  it('names the variables the file has when asked for one it lacks', () => {
    const { file } = sample(1, 2, 2);
    const r = openDataset(memorySource(ncgen(cdl(file), 'nc3')));
    expect(() => r.variable('v')).toThrow('the file has no variable "v" (it has "time", "y", "x", "u", "h")');
  });
});

describe('format sniffing', () => {
  it('refuses what is not NetCDF, saying what it starts with', () => {
    const text = new TextEncoder().encode('hello, world');
    expect(() => sniffFormat(text, text.length)).toThrow(
      'not a NetCDF file: it starts with bytes 68 65 6c 6c, neither "CDF" (NetCDF-3) nor the HDF5 signature (netCDF-4)',
    );
    expect(() => sniffFormat(new Uint8Array(0), 0)).toThrow('not a NetCDF file: the file is empty');
    expect(() => sniffFormat(new Uint8Array([0x43, 0x44, 0x46, 5]), 4)).toThrow(/CDF-5/);
    expect(sniffFormat(new Uint8Array([0x43, 0x44, 0x46, 2]), 4)).toBe('netcdf3');
    expect(sniffFormat(new Uint8Array([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]), 8)).toBe('hdf5');
  });
});
