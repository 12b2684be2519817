import { describe, expect, it } from 'vitest';
import { inverseCascadeSpectrum } from '../../../lib/analysis/powerLawFit';
import { validateParams } from '../../../lib/model/validateParams';
import { spectraFigure } from '../../../src/views/spectraCharts';
import type { SpectraPayload } from '../../../workers/diagnosticsApi';

const p = validateParams({ nx: 64, ny: 64, kf: 12, dkf: 2, beta: 10, eps: 0.01 });

/** A spectrum of shell sums following E(k) dk = k^slope dk, with an empty top shell. */
function payload(slope: number, dk = 0.5): SpectraPayload {
  const n = 30;
  const k = Float64Array.from({ length: n }, (_, s) => (s + 1) * dk);
  const E = k.map((x, s) => (s === n - 1 ? 0 : Math.pow(x, slope) * dk));
  return {
    k,
    E,
    EZonal: E.map((e) => e / 2),
    EResidual: E.map((e) => e / 2),
    dk,
    completeShells: n - 2,
    count: 1,
    tStart: 0,
    tEnd: 0,
    count2d: 0,
    kx2d: null,
    ky2d: null,
    E2d: null,
  };
}

describe('spectraFigure', () => {
  it('plots densities (shell sum / dk), leaves empty shells as gaps, and fits the slope of a power law exactly', () => {
    const f = spectraFigure(payload(-5 / 3), p, [1, 10], 1);
    const [k, E] = f.data as [number[], (number | null)[]];
    expect(E[3]).toBeCloseTo(Math.pow(k[3], -5 / 3), 12);
    expect(E[E.length - 1]).toBeNull();
    expect(f.fit?.slope).toBeCloseTo(-5 / 3, 12);
    expect(f.fit?.slopeStdErr).toBeLessThan(1e-10);
  });

  it('draws the −5/3 reference from ε below k_f only, and marks k_f, k_β and k_R', () => {
    const f = spectraFigure(payload(-3), p, [1, 10], 1);
    const [k, , , , inverse] = f.data as (number | null)[][];
    k.forEach((x, i) => expect(inverse[i]).toBe(x! <= p.kf ? inverseCascadeSpectrum(x!, p.eps) : null));
    expect(f.marks.filter((m) => m.label).map((m) => m.label)).toEqual(['k_f', 'k_β', 'k_R']);
  });

  it('says why there is no fit when the band holds too few shells', () => {
    const f = spectraFigure(payload(-3), p, [1, 1.2], 1);
    expect(f.fit).toBeNull();
    expect(f.fitError).toMatch(/need at least 3/);
  });
});
