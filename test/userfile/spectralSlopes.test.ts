import { describe, expect, it } from 'vitest';
import type { SpectraMean } from '../../lib/userfile/spectraAccumulator';
import { spectralSlopes } from '../../lib/userfile/spectralSlopes';
import { diffusivityText, timeUnitText } from '../../lib/userfile/report';

/** Shells k = 1..n with E ∝ k^{−5/3} below k_f and ∝ k^{−3} above, continuous at k_f. */
function cascade(n: number, kf: number, withFlux: boolean): SpectraMean {
  const k = Array.from({ length: n }, (_, i) => i + 1);
  const E = k.map((x) => (x <= kf ? Math.pow(x / kf, -5 / 3) : Math.pow(x / kf, -3)));
  return {
    kind: 'pv',
    k,
    kEdge: k.map((x) => x + 0.5),
    E,
    EZonal: null,
    EResidual: null,
    Z: null,
    // Energy flows to large scales below the forcing: Π_E most negative just below k_f.
    PiE: withFlux ? k.map((x) => (x < kf ? -x / kf : 0)) : null,
    PiZ: null,
    zonalEnergyTransfer: null,
    keptEnergyFraction: null,
    records: 1,
    refused: 0,
  };
}

describe('spectral slopes of a file', () => {
  it('recovers −5/3 and −3 from exact power laws, in bands either side of the forcing', () => {
    // An exact power law has zero residual: the fitted slope is the exponent to round-off [derived].
    const [inverse, forward] = spectralSlopes(cascade(200, 30, false), 30, 3);
    expect(inverse.slope).toBeCloseTo(-5 / 3, 10);
    expect(forward.slope).toBeCloseTo(-3, 10);
    expect([inverse.kLo, inverse.kHi]).toEqual([3, 20]);
    expect([forward.kLo, forward.kHi]).toEqual([45, 100]);
  });

  it('finds the forcing where the energy flux is most negative when the file does not record it', () => {
    const [inverse] = spectralSlopes(cascade(200, 30, true), null, null);
    expect(inverse.kHi).toBeCloseTo(29.5 / 1.5, 12);
    expect(inverse.slope).toBeCloseTo(-5 / 3, 10);
    const none = spectralSlopes(cascade(200, 30, false), null, null);
    expect(none.every((s) => s.slope === null && /no forcing wavenumber/.test(s.reason ?? ''))).toBe(true);
  });

  it('says when a band has no room on the grid', () => {
    const [, forward] = spectralSlopes(cascade(40, 16, false), 16, 2);
    expect(forward.slope).toBeNull();
    expect(forward.reason).toMatch(/no room between the forcing and the dissipation range/);
  });
});

describe('the analysis text', () => {
  it('flags an up-gradient eddy diffusivity instead of printing it bare', () => {
    expect(diffusivityText(-2e-5, '-5e-5')).toMatch(/D_fit = -2e-5: UP-GRADIENT \(negative\)/);
    expect(diffusivityText(-2e-5, '-5e-5')).not.toMatch(/mixing length -5e-5/);
    expect(diffusivityText(3e-3, '0.2')).toBe('eddy diffusivity of PV D_fit = 0.003, mixing length 0.2');
  });

  it('gives the time unit as the file states it', () => {
    expect(timeUnitText('days since 2000-01-01')).toBe('(units "days since 2000-01-01" as the file states them)');
    expect(timeUnitText('1')).toBe('(units "1" as the file states them)');
    expect(timeUnitText(null)).toBe('(the file states no time units)');
  });
});
