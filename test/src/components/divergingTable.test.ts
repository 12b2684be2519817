import chroma from 'chroma-js';
import { describe, expect, it } from 'vitest';
import { divergingTable, TABLE_SIZE } from '../../../src/components/divergingTable';

/** The RGBA bytes of entry i, read back through the same byte view the canvas uses. */
function rgba(table: Uint32Array, i: number): number[] {
  return Array.from(new Uint8ClampedArray(table.buffer, 4 * i, 4));
}

describe('divergingTable', () => {
  const table = divergingTable();

  it('has 256 opaque entries', () => {
    expect(table.length).toBe(TABLE_SIZE);
    for (let i = 0; i < TABLE_SIZE; i++) expect(rgba(table, i)[3]).toBe(255);
  });

  it('runs from blue through near-white to red', () => {
    const [r0, , b0] = rgba(table, 0);
    const [r1, , b1] = rgba(table, TABLE_SIZE - 1);
    expect(b0).toBeGreaterThan(r0 + 80);
    expect(r1).toBeGreaterThan(b1 + 80);
    for (const i of [127, 128]) for (const c of rgba(table, i).slice(0, 3)) expect(c).toBeGreaterThan(235);
  });

  it('is symmetric in lightness about zero and monotone on each side', () => {
    // CIELAB L* of the stored 8-bit colours: rounding to bytes moves L* by well under 0.5.
    const lightness = (i: number) => {
      const [r, g, b] = rgba(table, i);
      return chroma(r, g, b).get('lab.l');
    };
    for (let i = 0; i < TABLE_SIZE / 2; i++)
      expect(Math.abs(lightness(i) - lightness(TABLE_SIZE - 1 - i))).toBeLessThan(0.5);
    for (let i = 1; i < TABLE_SIZE / 2; i++) expect(lightness(i)).toBeGreaterThan(lightness(i - 1));
    for (let i = TABLE_SIZE / 2 + 1; i < TABLE_SIZE; i++) expect(lightness(i)).toBeLessThan(lightness(i - 1));
  });
});
