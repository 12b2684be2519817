import { describe, expect, it } from 'vitest';
import { regimeOf } from '../../lib/analysis/scales';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { REFERENCES } from '../../lib/plan/references';
import { THRESHOLDS } from '../../lib/plan/thresholds';

describe('references and thresholds', () => {
  it('mark every source as the check list does', () => {
    for (const [k, s] of Object.entries(REFERENCES)) expect(s, k).toMatch(/\[(published|derived|memory|practice)/);
  });

  // R_β thresholds 1.5 and 2.5 (Sukoriansky et al. 2007; Galperin et al. 2010 [memory for the thresholds]).
  it('use the regime thresholds of lib/analysis/scales and the model default CFL', () => {
    expect(regimeOf(THRESHOLDS.frictionDominated * (1 - 1e-12))).toBe('friction-dominated');
    expect(regimeOf(THRESHOLDS.frictionDominated)).toBe('transitional');
    expect(regimeOf(THRESHOLDS.zonostrophic)).toBe('zonostrophic');
    expect(THRESHOLDS.defaultCfl).toBe(DEFAULT_PARAMS.cfl);
  });

  // The ideal staircase jet peaks at u_max/U_rms = (βL²/12)/(βL²/√720) = √5 [derived] from Dritschel &
  // McIntyre (2008); the assumed peak/rms ratio must cover it.
  it('assume a peak/rms ratio above the staircase jet peak √5', () => {
    expect(Math.sqrt(720) / 12).toBeCloseTo(Math.sqrt(5), 14);
    expect(THRESHOLDS.peakToRms).toBeGreaterThan(Math.sqrt(5));
  });

  // From rest E(t) = E_s(1 − e^{−2μt}) [derived]: after steadyMultiple spin-up times the energy is
  // within 1 % of its steady value.
  it('reach steady state within 1 % of the energy after the steady multiple', () => {
    expect(Math.exp(-THRESHOLDS.steadyMultiple)).toBeLessThan(0.01);
  });
});
