import { describe, expect, it } from 'vitest';
import { emptyReport } from '../../lib/model/budget';
import { DEFAULT_PARAMS, type ModelParams } from '../../lib/model/params';
import { keptRadius } from '../../lib/model/validateParams';
import { rmsVelocity, scaleLadder, zonostrophyAt } from '../../src/runScales';

const P: ModelParams = { ...DEFAULT_PARAMS, beta: 10, eps: 1e-3, mu: 1e-3, kd: 0 };
const k = (rungs: { id: string; k: number }[], id: string) => rungs.find((r) => r.id === id)?.k;

describe('run scales', () => {
  it('U_rms is (2·KE)^½', () => {
    expect(rmsVelocity(0.5)).toBe(1);
    expect(rmsVelocity(0)).toBe(0);
    expect(rmsVelocity(-1e-30)).toBe(0);
  });

  it('the predicted ladder matches the worked example of docs/scales.md [derived]', () => {
    // β = 10, ε = μ = 1e-3 → U = 1, k_β = 15.8489, k_R = 2.23607, R_β = 7.08786.
    const l = scaleLadder(P, emptyReport(), 'kR');
    expect(l.predictedU).toBeCloseTo(1, 12);
    expect(k(l.predicted, 'rhines')).toBeCloseTo(2.23607, 5);
    expect(k(l.fixed, 'transitional')).toBeCloseTo(15.8489, 4);
    expect(l.predictedR).toBeCloseTo(7.08786, 5);
  });

  it('the measured row follows U_rms; with U_rms equal to the prediction the two agree', () => {
    const r = emptyReport();
    r.kinetic = 0.5;
    const l = scaleLadder(P, r, 'kR');
    expect(l.measuredU).toBe(1);
    expect(k(l.measured, 'rhines')).toBeCloseTo(k(l.predicted, 'rhines') ?? NaN, 12);
    expect(l.measuredR).toBeCloseTo(l.predictedR ?? NaN, 12);
    r.kinetic = 2;
    expect(k(scaleLadder(P, r, 'kR').measured, 'rhines')).toBeCloseTo(2.23607 / Math.SQRT2, 5);
  });

  it('sets the domain, forcing and grid rungs from the parameters, and leaves out undefined ones', () => {
    const l = scaleLadder({ ...P, Lx: 4 * Math.PI }, emptyReport(), 'kR');
    expect(k(l.fixed, 'domain')).toBeCloseTo(0.5, 12);
    expect(k(l.fixed, 'forcing')).toBe(P.kf);
    expect(k(l.fixed, 'grid')).toBe(keptRadius({ ...P, Lx: 4 * Math.PI }));
    expect(k(l.fixed, 'deformation')).toBeUndefined();
    // At rest nothing is measured, and there is no hyperviscous dissipation yet.
    expect(l.measured).toEqual([]);
    expect(l.measuredR).toBeNull();
    const noBeta = scaleLadder({ ...P, beta: 0 }, emptyReport(), 'kR');
    expect(k(noBeta.fixed, 'transitional')).toBeUndefined();
    expect(noBeta.predictedR).toBeNull();
  });

  it('places the Rhines rung by the chosen convention: length L_R at k = 2π/L_R', () => {
    const kR = k(scaleLadder(P, emptyReport(), 'kR').predicted, 'rhines') ?? NaN;
    // (U/β)^½ → 2π(β/U)^½ = 2π√2 k_R; π/k_R → 2k_R; 2π(U/β)^½ → √2 k_R.
    expect(k(scaleLadder(P, emptyReport(), 'sqrtUbeta').predicted, 'rhines')).toBeCloseTo(
      2 * Math.PI * Math.SQRT2 * kR,
      10,
    );
    expect(k(scaleLadder(P, emptyReport(), 'piOverKR').predicted, 'rhines')).toBeCloseTo(2 * kR, 10);
    expect(k(scaleLadder(P, emptyReport(), 'twoPiSqrtUbeta').predicted, 'rhines')).toBeCloseTo(Math.SQRT2 * kR, 10);
  });

  it('zonostrophyAt names the regime, and is undefined without β, forcing or motion', () => {
    expect(zonostrophyAt(P, 1)?.regime).toBe('zonostrophic');
    // A slow flow has a large k_R, close to k_β: R_β small.
    expect(zonostrophyAt(P, 1e-4)?.regime).toBe('friction-dominated');
    expect(zonostrophyAt({ ...P, beta: 0 }, 1)).toBeNull();
    expect(zonostrophyAt({ ...P, eps: 0 }, 1)).toBeNull();
    expect(zonostrophyAt(P, 0)).toBeNull();
  });
});
