import { describe, expect, it } from 'vitest';
import { decodeSlab } from '../../lib/io/netcdfDecode';

// Big-endian decoding of each external type of the NetCDF classic format specification.
describe('decodeSlab', () => {
  const b = (...x: number[]) => new Uint8Array(x);
  it('decodes each type from big-endian bytes', () => {
    expect(Array.from(decodeSlab('double', b(0x3f, 0xf0, 0, 0, 0, 0, 0, 0, 0xc0, 0, 0, 0, 0, 0, 0, 0)))).toEqual([
      1, -2,
    ]);
    expect(Array.from(decodeSlab('float', b(0x3f, 0x80, 0, 0)))).toEqual([1]);
    expect(Array.from(decodeSlab('int', b(0x80, 0, 0, 1, 0, 0, 0, 2)))).toEqual([-2147483647, 2]);
    expect(Array.from(decodeSlab('short', b(0x80, 0x01, 0x12, 0x34)))).toEqual([-32767, 0x1234]);
    expect(Array.from(decodeSlab('byte', b(0x81, 0x7f)))).toEqual([-127, 127]); // signed, the default reading
    expect(Array.from(decodeSlab('char', b(0x61, 0xce)))).toEqual([0x61, 0xce]);
  });

  it('decodes from a view at an odd offset of a larger buffer', () => {
    const whole = b(9, 0x3f, 0xf0, 0, 0, 0, 0, 0, 0, 9);
    expect(Array.from(decodeSlab('double', whole.subarray(1, 9)))).toEqual([1]);
  });

  it('refuses an output array of the wrong type or length', () => {
    expect(() => decodeSlab('int', b(0, 0, 0, 1), new Float64Array(1))).toThrow(/out must be a Int32Array of length 1/);
    expect(() => decodeSlab('int', b(0, 0, 0, 1), new Int32Array(2))).toThrow(/length 1/);
  });
});
