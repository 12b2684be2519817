import { describe, expect, it } from 'vitest';
import { sharedRanges } from '../../../src/compare/sharedRanges';
import type { ZonalPayload } from '../../../workers/diagnosticsApi';

const zonal = (ubar: number[], meanUbar: number[]) =>
  ({ ubar: Float64Array.from(ubar), meanUbar: Float64Array.from(meanUbar) }) as unknown as ZonalPayload;

describe('the axes the two panes of a comparison share', () => {
  it('spans both profiles, padded by 5 %, whatever pane holds the extreme', () => {
    const r = sharedRanges([zonal([-0.2, 0.1], [0, 0.05]), zonal([-0.5, 1.5], [0.2, 0.3])], []);
    expect(r.ubar![0]).toBeCloseTo(-0.5 - 0.1, 12);
    expect(r.ubar![1]).toBeCloseTo(1.5 + 0.1, 12);
  });

  it('spans both spectra on whole decades, leaving out gaps and non-positive values', () => {
    const a = [
      [1, 2, 3],
      [0.5, null, 0.02],
      [0, 0.01, 0.003],
    ];
    const b = [
      [1, 2, 3],
      [30, 0.2, 1e-4],
      [null, null, null],
    ];
    const r = sharedRanges([], [a, b]);
    expect(r.k).toEqual([1, 10]);
    expect(r.E).toEqual([1e-4, 100]);
    expect(sharedRanges([null], [null])).toEqual({ ubar: null, k: null, E: null });
  });
});
