import { describe, expect, it } from 'vitest';
import { TABLE_SIZE } from '../../../src/components/divergingTable';
import { logRange, paintLogMap, sequentialTable } from '../../../src/components/sequentialTable';

const lightness = (word: number) => {
  const [r, g, b] = new Uint8Array(new Uint32Array([word]).buffer);
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
};

describe('sequentialTable', () => {
  it('darkens steadily from near-white', () => {
    const t = sequentialTable();
    expect(lightness(t[0])).toBeGreaterThan(240);
    for (let i = 8; i < TABLE_SIZE; i += 8) expect(lightness(t[i])).toBeLessThan(lightness(t[i - 8]));
  });
});

describe('paintLogMap', () => {
  it('maps decades across the table, top row last, non-positive values to the first entry', () => {
    const t = sequentialTable();
    const values = Float64Array.from([1e-6, 0, 1e-3, 1]);
    const { lo, hi } = logRange(values, 6);
    expect([lo, hi]).toEqual([-6, 0]);
    const px = new Uint32Array(4);
    paintLogMap(values, 2, 2, lo, hi, t, px);
    // Top image row is data row 1: 1e-3 (halfway) and 1 (the top entry).
    expect(px[0]).toBe(t[TABLE_SIZE / 2]);
    expect(px[1]).toBe(t[TABLE_SIZE - 1]);
    expect(px[2]).toBe(t[0]);
    expect(px[3]).toBe(t[0]);
  });
});
