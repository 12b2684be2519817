import { describe, expect, it } from 'vitest';
import { paintField, symmetricRange } from '../../../src/components/paintField';

// A table whose entries are their own indices makes the mapping visible.
const identity = Uint32Array.from({ length: 256 }, (_, i) => i);

describe('symmetricRange', () => {
  it('is 2.5 times the root-mean-square value, and 0 at rest', () => {
    // rms of (3, −4, 3, −4) = sqrt((9 + 16)/2)
    expect(symmetricRange(Float64Array.of(3, -4, 3, -4))).toBeCloseTo(2.5 * Math.sqrt(12.5), 14);
    expect(symmetricRange(Float64Array.of(-2, 2))).toBe(5);
    expect(symmetricRange(new Float64Array(4))).toBe(0);
  });
});

describe('paintField', () => {
  it('maps −range, 0, +range to the ends and the middle, and clamps beyond', () => {
    const field = Float64Array.of(-1, -1e-9, 0, 1e-9, 1, -5, 5, 0.5);
    const px = new Uint32Array(8);
    paintField(field, 8, 1, 1, identity, px);
    expect(Array.from(px)).toEqual([0, 127, 128, 128, 255, 0, 255, 192]);
  });

  it('puts north at the top: grid row jy lands on image row ny − 1 − jy', () => {
    const nx = 3;
    const ny = 2;
    const field = Float64Array.of(-1, -1, -1, 1, 1, 1); // jy = 0 negative, jy = 1 positive
    const px = new Uint32Array(nx * ny);
    paintField(field, nx, ny, 1, identity, px);
    expect(Array.from(px)).toEqual([255, 255, 255, 0, 0, 0]);
  });

  it('paints a field at rest (range 0) with the colour of zero', () => {
    const px = new Uint32Array(4);
    paintField(new Float64Array(4), 2, 2, 0, identity, px);
    expect(Array.from(px)).toEqual([128, 128, 128, 128]);
  });

  it('refuses buffers that do not match the grid', () => {
    expect(() => paintField(new Float64Array(5), 2, 2, 1, identity, new Uint32Array(4))).toThrow(RangeError);
  });
});
