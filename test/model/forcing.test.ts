import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { mixSeed, RandomStream } from '../../lib/model/randomStream';
import { QUIET, energyEnstrophy } from '../support/modelFixtures';

const ring = { ...QUIET, nx: 32, ny: 32, forcing: 'stochastic' as const, kf: 6, dkf: 1.5, eps: 1 };

/** Mean and standard error of the mean. */
function meanSE(xs: number[]): { mean: number; se: number } {
  const n = xs.length;
  const mean = xs.reduce((a, b) => a + b, 0) / n;
  const v = xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1);
  return { mean, se: Math.sqrt(v / n) };
}

// White-in-time forcing with increments ∝ √dt injects exactly ε = ½Σ Q_k/|k|² and η = ½Σ Q_k in the
// ensemble mean, for any dt (Itô = Stratonovich for additive noise) [published] Novikov, Sov. Phys.
// JETP 20, 1290 (1965) [memory for page]; ring normalisation as in Srinivasan & Young, J. Atmos.
// Sci. 69, 1633 (2012) [memory]. CHECKS: ensemble tests within 3 standard errors.
describe('stochastic forcing', () => {
  for (const dt of [0.01, 0.04]) {
    it(`injects ε and η in the ensemble mean within 3 standard errors (dt = ${dt})`, () => {
      const T = 0.4;
      const energies: number[] = [];
      const enstrophies: number[] = [];
      let eta = 0;
      for (let member = 0; member < 200; member++) {
        const model = new Model({ ...ring, dt, seed: 1000 + member });
        model.step(Math.round(T / dt));
        const { energy, enstrophy } = energyEnstrophy(model);
        energies.push(energy / model.time);
        enstrophies.push(enstrophy / model.time);
        eta = model.report.enstrophy.injection;
        expect(model.report.energy.injection).toBeCloseTo(1, 12); // the stated mean rate is ε
      }
      const e = meanSE(energies);
      const z = meanSE(enstrophies);
      expect(e.se).toBeLessThan(0.05); // the test has the power to see a wrong normalisation
      expect(Math.abs(e.mean - 1)).toBeLessThan(3 * e.se);
      expect(Math.abs(z.mean - eta)).toBeLessThan(3 * z.se);
    });
  }

  // η = k_f² ε for a thin ring at k_f and k_d = 0 [published] (same sources).
  it('has η = k_f² ε on a thin ring', () => {
    const model = new Model({ ...ring, nx: 128, ny: 128, kf: 20, dkf: 0.5 });
    model.step(1);
    const eta = model.report.enstrophy.injection;
    // The ring holds |k| within ±0.5 of 20, so η/ε = ⟨1/k²⟩⁻¹ lies within (19.5², 20.5²).
    expect(eta).toBeGreaterThan(19.5 ** 2);
    expect(eta).toBeLessThan(20.5 ** 2);
    expect(Math.abs(eta / 400 - 1)).toBeLessThan(0.01);
  });

  it('forces only the annulus, and no purely zonal mode when force_zonal is false', () => {
    for (const force_zonal of [true, false]) {
      const model = new Model({ ...ring, force_zonal, dt: 0.01 });
      model.step(1);
      const g = model.grid;
      let zonal = 0;
      for (let jy = 0; jy < g.ny; jy++) {
        for (let ix = 0; ix < g.nkx; ix++) {
          const m = jy * g.nkx + ix;
          const a = Math.hypot(model.qHat[2 * m], model.qHat[2 * m + 1]);
          const k = Math.sqrt(g.k2[m]);
          if (Math.abs(k - 6) > 1.5) expect(a).toBe(0);
          if (ix === 0) zonal += a;
        }
      }
      if (force_zonal) expect(zonal).toBeGreaterThan(0);
      else expect(zonal).toBe(0);
    }
  });

  it('keeps the field real: the kx = 0 column stays Hermitian', () => {
    const model = new Model({ ...ring, dt: 0.01 });
    model.step(5);
    const g = model.grid;
    for (let jy = 1; jy < g.ny / 2; jy++) {
      const a = 2 * jy * g.nkx;
      const b = 2 * (g.ny - jy) * g.nkx;
      // === treats +0 and −0 alike, as the field does
      expect(model.qHat[a] === model.qHat[b]).toBe(true);
      expect(model.qHat[a + 1] === -model.qHat[b + 1]).toBe(true);
    }
  });
});

// Steady forcing: with β = 0 and a thin ring on one |k| shell, the response stays on the shell where
// J = 0 (Vallis 2017, steady flows), so the run is linear: q̂ → F̂/μ and, by the stated normalisation,
// the injection rate ⟨−ψF⟩ → ε and the energy → ε/(2μ) (CHECKS: dE/dt = ε − 2μE, [derived]).
describe('steady forcing', () => {
  it('reaches the linear drag balance E = ε/(2μ) on a single shell', () => {
    const mu = 0.5;
    const model = new Model({
      ...QUIET,
      nx: 32,
      ny: 32,
      forcing: 'steady',
      kf: 5,
      dkf: 0.01,
      eps: 0.2,
      mu,
      dt: 0.05,
      force_zonal: true,
    });
    expect(model.forcedModes).toBe(6); // (5,0), (0,5), (3,±4), (4,±3): the |k| = 5 modes of the half plane
    model.step(800); // t = 40 = 20/μ: transients below e^{−20}
    const r = model.step(1);
    expect(Math.abs(r.energy.value / (0.2 / (2 * mu)) - 1)).toBeLessThan(1e-8);
    expect(Math.abs(r.energy.injection / 0.2 - 1)).toBeLessThan(1e-8);
    expect(Math.abs(r.energy.tendency)).toBeLessThan(1e-9);
  });
});

describe('random stream', () => {
  it('gives unrelated first draws for consecutive seeds', () => {
    // Without seed mixing xoroshiro128+ starts 1000 and 1001 on draws equal to 4 digits.
    const firsts = Array.from({ length: 64 }, (_, i) => new RandomStream(1000 + i).uniform());
    const mean = firsts.reduce((a, b) => a + b, 0) / firsts.length;
    const sd = Math.sqrt(firsts.reduce((a, b) => a + (b - mean) ** 2, 0) / (firsts.length - 1));
    // Uniform on [0, 1): sd = 0.2887; a sample of 64 lies far above 0.15 (common practice).
    expect(sd).toBeGreaterThan(0.15);
    expect(mixSeed(1000)).not.toBe(mixSeed(1001));
  });
});
