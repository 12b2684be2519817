import { describe, expect, it } from 'vitest';
import { StructureDetector } from '../../../lib/analysis/jetDetector';
import { noisySeries } from '../../support/meanSeries';
import { staircaseMark } from '../../../workers/zonalPayload';
import { staircaseProfile } from '../../../src/views/staircaseProfile';

describe('staircaseProfile', () => {
  it('reproduces a perfect staircase from its own fit, including the wrapped step below the first edge', () => {
    // Four equal steps of PV, edges at L/2 + iL: q_tot is flat on each and jumps by βL.
    const ny = 128;
    const Ly = 2 * Math.PI;
    const beta = 2;
    const L = Ly / 4;
    const y = Float64Array.from({ length: ny }, (_, j) => (j * Ly) / ny);
    const qtot = y.map((yj) => beta * L * Math.floor((yj - L / 2) / L + 1));
    const fit = new StructureDetector({ points: ny, y0: 0, dy: Ly / ny, periodic: true }, { beta }).staircase(
      noisySeries(qtot, 16),
    );
    expect(fit.edges.length).toBe(4);
    const profile = staircaseProfile(y, staircaseMark(fit)!, beta, Ly);
    for (let j = 0; j < ny; j++) expect(profile[j]).toBeCloseTo(qtot[j], 9);
  });

  it('gives one level everywhere without edges', () => {
    const p = staircaseProfile(
      [0, 1, 2],
      { edges: [], levels: [5], widths: [3], index: 0, indexStderr: null, rho: 1 },
      1,
      3,
    );
    expect(Array.from(p)).toEqual([5, 5, 5]);
  });
});
