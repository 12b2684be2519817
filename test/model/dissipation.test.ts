import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { QUIET, energyEnstrophy, randomKeptState, sampleGrid, spectrumOf } from '../support/modelFixtures';

// With linear drag μ on vorticity and no forcing, dE/dt = −2μE (k_d = 0) [derived] from the energy
// equation (CHECKS: budgets); the nonlinear term conserves E, so a turbulent field decays as e^{−2μt}.
describe('dissipation', () => {
  it('energy of a turbulent field decays as exp(−2μt) under drag alone', () => {
    const mu = 0.3;
    const model = new Model({ ...QUIET, nx: 64, ny: 64, mu, dt: 0.005 });
    model.setState(randomKeptState(model, 11, 3));
    const e0 = energyEnstrophy(model).energy;
    model.step(500);
    const e1 = energyEnstrophy(model).energy;
    const expected = e0 * Math.exp(-2 * mu * model.time);
    // The only departure is the time-stepping error of the conservative transfer (RK4, dt⁴).
    expect(Math.abs(e1 / expected - 1)).toBeLessThan(1e-7);
    expect(e1 / e0).toBeLessThan(0.6); // it did decay
  });

  it('drag on ζ damps a mode at μk²/(k² + k_d²) when k_d > 0', () => {
    const [mu, kd] = [0.5, 3];
    const model = new Model({ ...QUIET, nx: 32, ny: 32, mu, kd, dt: 0.05 });
    const p = model.params;
    model.setState(
      spectrumOf(
        p,
        sampleGrid(p, (x) => Math.cos(2 * x)),
      ),
    );
    const a0 = Math.hypot(model.qHat[4], model.qHat[5]);
    model.step(40);
    const a1 = Math.hypot(model.qHat[4], model.qHat[5]);
    expect(Math.abs(a1 / a0 / Math.exp(((-mu * 4) / (4 + 9)) * model.time) - 1)).toBeLessThan(1e-13);
  });

  // Hyperviscosity ν(−∇²)^p damps a mode of wavenumber k at the rate ν k^{2p}, exactly in the
  // integrating factor (common practice).
  for (const order of [1, 2, 4, 8]) {
    it(`a mode decays at its hyperviscous rate ν k^{2p}, p = ${order}`, () => {
      const k = 6;
      const nu = 0.3 / Math.pow(k * k, order);
      const model = new Model({ ...QUIET, nx: 32, ny: 32, nu, nu_order: order, dt: 0.1 });
      const p = model.params;
      model.setState(
        spectrumOf(
          p,
          sampleGrid(p, (_x, y) => Math.sin(k * y)),
        ),
      );
      const idx = 2 * k * model.grid.nkx;
      const a0 = Math.hypot(model.qHat[idx], model.qHat[idx + 1]);
      model.step(30);
      const a1 = Math.hypot(model.qHat[idx], model.qHat[idx + 1]);
      expect(Math.abs(a1 / a0 / Math.exp(-0.3 * model.time) - 1)).toBeLessThan(1e-13);
    });
  }

  it('large-scale drag acts below its cutoff only', () => {
    const model = new Model({ ...QUIET, nx: 32, ny: 32, mu_ls: 0.7, k_ls: 2.5, dt: 0.1 });
    const p = model.params;
    model.setState(
      spectrumOf(
        p,
        sampleGrid(p, (x) => Math.cos(2 * x) + Math.cos(3 * x)),
      ),
    );
    model.step(10);
    const low = Math.hypot(model.qHat[4], model.qHat[5]);
    const high = Math.hypot(model.qHat[6], model.qHat[7]);
    // q̂ = ½ for each at t = 0 (cos = (e^{ikx} + e^{−ikx})/2); t = 1 after 10 steps.
    expect(low / 0.5).toBeCloseTo(Math.exp(-0.7 * model.time), 12);
    expect(high / 0.5).toBeCloseTo(1, 12);
  });
});

// The unforced inviscid run conserves E and Z up to the time-stepping error: RK4 is fourth order, so
// the drift over a fixed time falls by at least ~2⁴ when dt halves (observed: ~2⁵, RK4's damping of
// oscillatory modes). Tolerances at CFL ≈ 0.3 over t = 2 for a field filling every kept mode:
// relative drift below 1e-7 in E and 1e-5 in Z (observed 1e-8 and 2e-6), observed order above 3.5.
describe('conservation in the unforced inviscid run', () => {
  it('drifts at fourth order in dt, and very little', () => {
    const drift = (dt: number) => {
      const model = new Model({ ...QUIET, nx: 64, ny: 64, beta: 3, kd: 1, dt });
      model.setState(randomKeptState(model, 5, 3));
      const a = energyEnstrophy(model);
      model.step(Math.round(2 / dt));
      const b = energyEnstrophy(model);
      return {
        e: Math.abs(b.energy / a.energy - 1),
        z: Math.abs(b.enstrophy / a.enstrophy - 1),
        cfl: model.report.cfl,
      };
    };
    const coarse = drift(0.005);
    const fine = drift(0.0025);
    expect(coarse.cfl).toBeGreaterThan(0.2); // a step that actually tests the scheme
    expect(coarse.e).toBeLessThan(1e-7);
    expect(coarse.z).toBeLessThan(1e-5);
    expect(Math.log2(coarse.e / fine.e)).toBeGreaterThan(3.5);
    expect(Math.log2(coarse.z / fine.z)).toBeGreaterThan(3.5);
  });
});
