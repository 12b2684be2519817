import { describe, expect, it } from 'vitest';
import { divergingTable, TABLE_SIZE } from '../../../src/components/divergingTable';
import { maxAbs, paintHovmoller, wrappedPieces } from '../../../src/components/paintHovmoller';

describe('paintHovmoller', () => {
  it('puts time across and north up, and clamps beyond the range', () => {
    const table = divergingTable();
    // Two columns of three rows: column 0 positive at the north row, column 1 negative at the south row.
    const data = Float64Array.from([0, 0, 1, -5, 0, 0]);
    const pixels = new Uint32Array(6);
    paintHovmoller(data, 2, 3, 1, table, pixels);
    // Image row 0 is the north row (j = 2): column 0 is the top of the table, column 1 zero.
    expect(pixels[0]).toBe(table[TABLE_SIZE - 1]);
    expect(pixels[1]).toBe(table[TABLE_SIZE / 2]);
    // Image row 2 is the south row (j = 0): column 1 saturates at the bottom of the table.
    expect(pixels[2 * 2 + 1]).toBe(table[0]);
    expect(maxAbs(data)).toBe(5);
  });

  it('refuses buffers of the wrong size', () => {
    expect(() => paintHovmoller(new Float64Array(4), 2, 3, 1, divergingTable(), new Uint32Array(6))).toThrow(
      /expected 6/,
    );
  });
});

describe('wrappedPieces', () => {
  it('cuts a drifting track where it crosses the seam, and wraps its positions', () => {
    const pieces = wrappedPieces([0, 1, 2, 3], [8, 9.5, 10.5, 11], 10);
    expect(pieces).toEqual([
      { t: [0, 1], y: [8, 9.5] },
      { t: [2, 3], y: [0.5, 1] },
    ]);
  });
});
