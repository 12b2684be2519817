import { describe, expect, it } from 'vitest';
import { dissipationWavenumber, rhinesWavenumber } from '../../../lib/analysis/scales';
import { scenarioById } from '../../../lib/plan/demoScenarios';
import { validateParams } from '../../../lib/model/validateParams';
import { arrestWavenumber, fitBands } from '../../../src/views/fitBands';

const jets = validateParams(scenarioById('jets')!.params);

describe('default fit bands of the Spectra view', () => {
  // The default scenario: k_f = 24 ± 2 on a 128² grid of 2π (dk = 1); measured U_rms ≈ 0.85 (its notes).
  const inputs = { params: jets, dk: 1, kTop: 41, Urms: 0.85, eta: 0.5 };

  it('puts the inverse band between the arrest scale (k_R of the measured U) and the forcing annulus', () => {
    const b = fitBands(inputs).inverse;
    // k_R = (β/2U)^½ (Rhines 1975) [derived from its definition]
    const kR = rhinesWavenumber(jets.beta, 0.85);
    expect(b.band).not.toBeNull();
    expect(b.band![0]).toBe(kR);
    expect(b.band![1]).toBe(jets.kf - jets.dkf - 0.5);
    expect(b.text).toMatch(/Rhines wavenumber k_R/);
    expect(b.law).toMatch(/k⁻⁵ᐟ³.*m⁻⁵/);
  });

  it('puts the forward band between the annulus and the dissipation range or the 2/3-rule cut', () => {
    const b = fitBands(inputs).forward;
    const kNu = dissipationWavenumber(0.5, jets.nu, jets.nu_order);
    expect(b.band![0]).toBe(jets.kf + jets.dkf + 0.5);
    expect(b.band![1]).toBe(Math.min(kNu, 41));
    expect(b.law).toBe('E ∝ k⁻³');
    // A strong hyperviscosity moves k_ν toward the forcing: the band ends there, or is refused.
    const damped = fitBands({ ...inputs, params: { ...jets, nu: jets.nu * 1e6 } }).forward;
    expect(damped.band).toBeNull();
    expect(damped.missing).toMatch(/no forward range of three shells/);
  });

  it('says why there is no inverse range when the arrest scale reaches the forcing', () => {
    const slow = fitBands({ ...inputs, Urms: 0.02 }).inverse;
    expect(slow.band).toBeNull();
    expect(slow.missing).toMatch(/too close to the forcing/);
  });

  it('takes the friction wavenumber as the arrest scale without β, and no bands without forcing', () => {
    const iso = { ...inputs, params: { ...jets, beta: 0 } };
    expect(arrestWavenumber(iso).name).toMatch(/friction/);
    // k_fric = (μ³/ε)^½ (Smith et al. 2002) [derived from its definition] is below the second shell here.
    expect(fitBands(iso).inverse.band![0]).toBe(2);
    const unforced = fitBands({ ...inputs, params: { ...jets, forcing: 'none' } });
    expect(unforced.inverse.missing).toMatch(/no forcing/);
  });
});
