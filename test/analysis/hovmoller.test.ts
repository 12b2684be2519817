import { describe, expect, it } from 'vitest';
import { HovmollerAccumulator } from '../../lib/analysis/hovmoller';
import { seededSigned } from '../support/random';

const profile = (t: number, ny: number) => Float64Array.from({ length: ny }, (_, j) => Math.sin(t) + j * t);

describe('Hovmöller accumulator', () => {
  it('keeps one column per sample until full, column-major', () => {
    const h = new HovmollerAccumulator(3, 2, 8);
    for (let s = 0; s < 5; s++) h.add(s * 0.5, profile(s * 0.5, 3));
    const r = h.view();
    expect(r.columns).toBe(5);
    expect(Array.from(r.t)).toEqual([0, 0.5, 1, 1.5, 2]);
    expect(Array.from(r.data.subarray(3 * 2, 3 * 3))).toEqual(Array.from(profile(1, 3)));
    expect(Array.from(r.y)).toEqual([0, 2 / 3, 4 / 3]);
  });

  it('halves the time resolution when full: cap 4, ten samples → two columns of four, two pending', () => {
    const h = new HovmollerAccumulator(2, 1, 4);
    for (let t = 0; t < 10; t++) h.add(t, [t, 2 * t]);
    const r = h.view();
    expect(r.columns).toBe(2);
    expect(r.samplesPerColumn).toBe(4);
    expect(h.pending).toBe(2);
    expect(Array.from(r.t)).toEqual([1.5, 5.5]);
    expect(Array.from(r.data)).toEqual([1.5, 3, 5.5, 11]);
  });

  it('for random caps and lengths: every column is the mean of its block of consecutive samples', () => {
    const next = seededSigned(7);
    for (let trial = 0; trial < 30; trial++) {
      const cap = 2 * (1 + Math.floor(5 * (next() + 1)));
      const n = 1 + Math.floor(150 * (next() + 1));
      const ny = 5;
      const h = new HovmollerAccumulator(ny, 3, cap);
      const ts: number[] = [];
      for (let s = 0; s < n; s++) {
        const t = s * 0.1 + 0.01 * next(); // uneven but increasing
        ts.push(t);
        h.add(t, profile(t, ny));
      }
      const r = h.snapshot();
      const k = r.samplesPerColumn;
      expect(r.columns).toBeLessThanOrEqual(cap);
      expect(r.columns * k + h.pending).toBe(n);
      for (let c = 0; c < r.columns; c++) {
        const block = ts.slice(c * k, (c + 1) * k);
        const tMean = block.reduce((a, b) => a + b, 0) / k;
        expect(Math.abs(r.t[c] - tMean)).toBeLessThan(1e-13 * (1 + Math.abs(tMean)));
        for (let j = 0; j < ny; j++) {
          const v = block.reduce((a, t) => a + profile(t, ny)[j], 0) / k;
          expect(Math.abs(r.data[c * ny + j] - v)).toBeLessThan(1e-13 * (1 + Math.abs(v)));
        }
      }
    }
  });

  it('gives a snapshot that later samples do not change, and views that they do', () => {
    const h = new HovmollerAccumulator(2, 1, 2);
    h.add(0, [1, 1]);
    h.add(1, [2, 2]);
    const snap = h.snapshot();
    const view = h.view();
    h.add(2, [3, 3]);
    h.add(3, [4, 4]); // full: halves, then commits [3.5]
    expect(Array.from(snap.data)).toEqual([1, 1, 2, 2]);
    expect(view.data[0]).toBe(1.5);
    expect(h.view().columns).toBe(2);
  });

  it('refuses decreasing times, wrong lengths and odd caps', () => {
    const h = new HovmollerAccumulator(2, 1, 4);
    h.add(1, [0, 0]);
    expect(() => h.add(0, [0, 0])).toThrow(RangeError);
    expect(() => h.add(2, [0, 0, 0])).toThrow(RangeError);
    expect(() => new HovmollerAccumulator(2, 1, 3)).toThrow(RangeError);
  });
});
