import { describe, expect, it } from 'vitest';
import type { FitReport } from '../../../lib/sweep/sweepFits';
import { scalingData } from '../../../src/sweep/scalingChart';

const fit: FitReport = {
  law: '',
  x: 'rhines_length',
  y: 'jet_spacing',
  n: 3,
  skipped: 0,
  exponent: 1,
  exponent_ci: [0.9, 1.1],
  prefactor: 2,
  prefactor_ci: [1.5, 2.5],
  prefactor_at_exponent_1: 2,
  prefactor_at_exponent_1_ci: [1.8, 2.2],
  log_residual_rms: 0,
  level: 0.95,
  resamples: 10,
  degenerate_resamples: 0,
  error: null,
};

describe('scalingData', () => {
  it('sorts the finished runs by x, leaves out what the fit leaves out, and draws the laws', () => {
    const rows = [
      { status: 'done', rhines_length: 3, jet_spacing: 6 },
      { status: 'done', rhines_length: 1, jet_spacing: 2 },
      { status: 'blew-up', rhines_length: 2, jet_spacing: 4 },
      { status: 'done', rhines_length: 2, jet_spacing: null },
    ];
    const [x, y, law, fixed, lo, hi] = scalingData(rows, fit);
    expect(Array.from(x)).toEqual([1, 3]);
    expect(Array.from(y)).toEqual([2, 6]);
    expect(Array.from(law)).toEqual([2, 6]);
    expect(Array.from(fixed)).toEqual([2, 6]);
    expect(Array.from(lo)).toEqual([1.8, 1.8 * 3]);
    expect(Array.from(hi)).toEqual([2.2, 2.2 * 3]);
  });
});
