import { describe, expect, it } from 'vitest';
import { ncText } from '../../lib/io/netcdf3Types';
import { encodeNetcdf3 } from '../../lib/io/netcdf3Writer';

// Exact bytes of tiny files, assembled here by hand from the grammar of the NetCDF classic format
// specification ("The Format in Detail"), independently of the writer's code.
const u32 = (x: number) => [(x >>> 24) & 0xff, (x >>> 16) & 0xff, (x >>> 8) & 0xff, x & 0xff];
const u64 = (x: number) => [...u32(Math.floor(x / 2 ** 32)), ...u32(x >>> 0)];
const chars = (s: string) => [...s].map((c) => c.charCodeAt(0));
const padded = (b: number[], fill = 0) => [...b, ...new Array((4 - (b.length % 4)) % 4).fill(fill)];
const name = (s: string) => [...u32(s.length), ...padded(chars(s))];
const ABSENT = [...u32(0), ...u32(0)];
const NC_DIMENSION = u32(10);
const NC_VARIABLE = u32(11);
const NC_ATTRIBUTE = u32(12);
const [NC_CHAR, NC_SHORT, NC_INT] = [u32(2), u32(3), u32(4)];

describe('NetCDF-3 header and data layout, byte for byte', () => {
  // dims time (unlimited), x = 3; global title = "ab"; s(x) short; v(time) int with 2 records.
  const file = {
    dimensions: [
      { name: 'time', unlimited: true },
      { name: 'x', size: 3 },
    ],
    attributes: [ncText('title', 'ab')],
    variables: [
      { name: 's', type: 'short' as const, dimensions: ['x'], data: [1, 2, 3] },
      { name: 'v', type: 'int' as const, dimensions: ['time'], data: [7, -1] },
    ],
  };

  function expected(version: 1 | 2): number[] {
    const begin = version === 1 ? u32 : u64;
    const headerSize = 152 + (version === 2 ? 8 : 0);
    const sBegin = headerSize;
    const vBegin = headerSize + 8; // s: 3 shorts = 6 bytes, vsize 8
    return [
      ...chars('CDF'),
      version,
      ...u32(2), // numrecs
      ...NC_DIMENSION,
      ...u32(2),
      ...name('time'),
      ...u32(0),
      ...name('x'),
      ...u32(3),
      ...NC_ATTRIBUTE,
      ...u32(1),
      ...name('title'),
      ...NC_CHAR,
      ...u32(2),
      ...padded(chars('ab')),
      ...NC_VARIABLE,
      ...u32(2),
      ...name('s'),
      ...u32(1),
      ...u32(1),
      ...ABSENT,
      ...NC_SHORT,
      ...u32(8),
      ...begin(sBegin),
      ...name('v'),
      ...u32(1),
      ...u32(0),
      ...ABSENT,
      ...NC_INT,
      ...u32(4),
      ...begin(vBegin),
      // s, padded to four bytes with the short fill value −32767 (0x8001): data padding uses fill
      0,
      1,
      0,
      2,
      0,
      3,
      0x80,
      0x01,
      // the records: one int each
      ...u32(7),
      ...u32(0xffffffff),
    ];
  }

  it('classic format (CDF-1)', () => {
    expect(Array.from(encodeNetcdf3({ ...file, format: 'cdf1' }))).toEqual(expected(1));
  });

  it('64-bit offset format (CDF-2) is the default', () => {
    expect(Array.from(encodeNetcdf3(file))).toEqual(expected(2));
  });

  it('writes ABSENT lists for a file with nothing in it', () => {
    expect(Array.from(encodeNetcdf3({ dimensions: [], variables: [] }))).toEqual([
      ...chars('CDF'),
      2,
      ...u32(0),
      ...ABSENT,
      ...ABSENT,
      ...ABSENT,
    ]);
  });

  it('pads names and text with zero bytes and encodes them as UTF-8', () => {
    const b = encodeNetcdf3({ format: 'cdf1', dimensions: [], attributes: [ncText('é', 'ψ!')], variables: [] });
    expect(Array.from(b)).toEqual([
      ...chars('CDF'),
      1,
      ...u32(0),
      ...ABSENT,
      ...NC_ATTRIBUTE,
      ...u32(1),
      ...u32(2),
      0xc3,
      0xa9,
      0,
      0,
      ...NC_CHAR,
      ...u32(3),
      0xcf,
      0x88,
      0x21,
      0,
      ...ABSENT,
    ]);
  });
});
