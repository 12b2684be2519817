import { describe, expect, it } from 'vitest';
import { elementType, parseDataspace, parseLayout, superblockEnd } from '../../lib/io/hdf5Format';

/** Bytes laid out as the HDF5 File Format Specification 3.0 describes each message (little-endian). */
function bytes(...parts: [number, number][]): DataView {
  const size = parts.reduce((s, [, n]) => s + n, 0);
  const v = new DataView(new ArrayBuffer(size));
  let p = 0;
  for (const [x, n] of parts) {
    for (let i = 0; i < n; i++) v.setUint8(p + i, n === 8 && x === -1 ? 0xff : Math.floor(x / 256 ** i) % 256);
    p += n;
  }
  return v;
}

describe('HDF5 messages jsfive does not expose', () => {
  it('reads dataspace sizes and unlimited maxima (version 1 and 2)', () => {
    // v2: version, rank, flags (1: maxima present), type; sizes; maxima (all ones = unlimited).
    expect(parseDataspace(bytes([2, 1], [2, 1], [1, 1], [1, 1], [5, 8], [3, 8], [-1, 8], [3, 8]), 0)).toEqual({
      dims: [5, 3],
      unlimited: [true, false],
    });
    // v1: version, rank, flags, reserved (1 + 4); sizes; no maxima.
    expect(parseDataspace(bytes([1, 1], [1, 1], [0, 1], [0, 1], [0, 4], [7, 8]), 0)).toEqual({
      dims: [7],
      unlimited: [false],
    });
  });

  it('reads contiguous, compact and version-3 chunked layouts, and refuses the version-4 chunk indexes by name', () => {
    expect(parseLayout(bytes([3, 1], [1, 1], [4096, 8], [800, 8]), 0, 2, 'u')).toEqual({
      kind: 'contiguous',
      address: 4096,
      size: 800,
    });
    expect(parseLayout(bytes([3, 1], [0, 1], [16, 2]), 0, 1, 'u')).toEqual({ kind: 'compact', offset: 4, size: 16 });
    expect(parseLayout(bytes([3, 1], [2, 1], [4, 1], [777, 8], [1, 4], [8, 4], [10, 4], [4, 4]), 0, 3, 'u')).toEqual({
      kind: 'chunked',
      btree: 777,
      chunk: [1, 8, 10],
    });
    // v4 chunked: version, class, flags, dimensionality, size encoding length, sizes, index type 4.
    const v4 = bytes([4, 1], [2, 1], [0, 1], [3, 1], [1, 1], [1, 1], [8, 1], [4, 1], [4, 1]);
    expect(() => parseLayout(v4, 0, 2, 'u')).toThrow(
      '"u" is stored with the HDF5 1.10 chunk index "extensible array" (data layout message version 4), which this reader does not support',
    );
  });

  it("reads the superblock's end-of-file address and names unsupported versions", () => {
    const sb2 = new DataView(new ArrayBuffer(48));
    sb2.setUint8(8, 2);
    sb2.setUint32(28, 123456, true);
    expect(superblockEnd(sb2)).toEqual({ version: 2, end: 123456 });
    const sb1 = new DataView(new ArrayBuffer(48));
    sb1.setUint8(8, 1);
    expect(() => superblockEnd(sb1)).toThrow(
      'HDF5 superblock version 1 is not supported (jsfive reads versions 0, 2 and 3)',
    );
  });

  it('maps jsfive dtype strings to types, sizes and byte order', () => {
    expect(elementType('<f4')).toEqual({ type: 'float32', size: 4, littleEndian: true });
    expect(elementType('>i2')).toEqual({ type: 'int16', size: 2, littleEndian: false });
    expect(elementType('S1')).toMatchObject({ type: 'char', size: 1 });
    expect(elementType(['VLEN_STRING', 0, 1])).toMatchObject({ type: 'string' });
    expect(elementType(['COMPOUND'])).toMatchObject({ type: 'other' });
  });
});
