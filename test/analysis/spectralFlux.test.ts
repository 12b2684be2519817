import { describe, expect, it } from 'vitest';
import { SnapshotPlan, type GridFields } from '../../lib/analysis/snapshot';
import { SpectraPlan } from '../../lib/analysis/spectra';
import { SpectralFluxPlan } from '../../lib/analysis/spectralFlux';
import { Model } from '../../lib/model/model';
import { QUIET, randomKeptState } from '../support/modelFixtures';
import { maxAbs } from '../support/random';
import { naiveDFT1 } from '../support/naiveDFT';

/**
 * The eddy-to-mean conversion in grid space, (1/Ly)∫ ū · (−∂y \overline{u′v′}) dy: zonal means are row
 * means, primes departures from them, ∂y a spectral derivative of the row profile (slow DFT).
 */
function eddyToMeanInGridSpace(f: GridFields): number {
  const { nx, ny, Ly } = f;
  const uBar = new Float64Array(ny);
  const uv = new Float64Array(2 * ny); // complex interleaved, for the DFT
  for (let j = 0; j < ny; j++) {
    let su = 0,
      sv = 0;
    for (let i = 0; i < nx; i++) {
      su += f.u[j * nx + i];
      sv += f.v[j * nx + i];
    }
    uBar[j] = su / nx;
    const vBar = sv / nx;
    let s = 0;
    for (let i = 0; i < nx; i++) s += (f.u[j * nx + i] - uBar[j]) * (f.v[j * nx + i] - vBar);
    uv[2 * j] = s / nx;
  }
  const c = naiveDFT1(uv, -1);
  // −∂y: multiply by −i ky; the Nyquist coefficient has no odd derivative and is dropped.
  const d = new Float64Array(2 * ny);
  for (let m = 0; m < ny; m++) {
    if (2 * m === ny) continue;
    const ky = (2 * Math.PI * (m <= ny / 2 ? m : m - ny)) / Ly;
    d[2 * m] = (ky * c[2 * m + 1]) / ny;
    d[2 * m + 1] = (-ky * c[2 * m]) / ny;
  }
  const minusDy = naiveDFT1(d, 1);
  let total = 0;
  for (let j = 0; j < ny; j++) total += uBar[j] * minusDy[2 * j];
  return total / ny;
}

describe('SpectralFluxPlan', () => {
  // The truncated Jacobian conserves E and Z, so ΣT = 0 and Π vanishes at both ends of the range
  // [published] Kraichnan, Phys. Fluids 10, 1417 (1967); Galerkin truncation [practice].
  for (const kd of [0, 1.3]) {
    it(`transfers sum to zero and the fluxes vanish at both ends to round-off (k_d = ${kd})`, () => {
      const model = new Model({ ...QUIET, nx: 64, ny: 32, Lx: 4 * Math.PI, Ly: 2 * Math.PI, kd });
      model.setState(randomKeptState(model, 17, 4));
      const snap = new SnapshotPlan(model.params);
      const plan = new SpectralFluxPlan(snap);
      const out = plan.createOutput();
      const f = plan.compute(model.qHat, out);
      expect(f).toBe(out);
      expect(f.grossEnergyTransfer).toBeGreaterThan(0);
      expect(Math.abs(f.netEnergyTransfer)).toBeLessThan(1e-13 * f.grossEnergyTransfer);
      expect(Math.abs(f.netEnstrophyTransfer)).toBeLessThan(1e-13 * f.grossEnstrophyTransfer);
      const n = plan.spectra.nShells;
      // The flux is not small inside the range …
      expect(maxAbs(f.PiE)).toBeGreaterThan(1e-3 * f.grossEnergyTransfer);
      // … and is zero at the top: Π through the last edge is −ΣT, and shells without kept modes carry none.
      expect(Math.abs(f.PiE[n - 1])).toBeLessThan(1e-13 * f.grossEnergyTransfer);
      expect(Math.abs(f.PiZ[n - 1])).toBeLessThan(1e-13 * f.grossEnstrophyTransfer);
      for (let s = plan.spectra.keptShells; s < n; s++) expect(f.TE[s]).toBe(0);
      // The other form, Π(k) = Σ_{k' > k} T(k'), agrees at every edge and at the bottom (k below the
      // first shell, where it is the whole sum) vanishes.
      let above = 0;
      for (let s = n - 1; s >= 0; s--) {
        expect(Math.abs(f.PiE[s] - above)).toBeLessThan(1e-13 * f.grossEnergyTransfer);
        above += f.TE[s];
      }
      expect(Math.abs(above)).toBeLessThan(1e-13 * f.grossEnergyTransfer);
    });
  }

  // T_E(k) is the rate at which advection changes the energy in shell k: in an unforced, undamped run
  // (β on: the waves leave |q̂| alone) a centred difference of the shell energies over ±h matches T at
  // the middle state to O(h²) (observed 2.4e-7 of max|T_E| at h = 2e-4, falling 4× per halving of h).
  // This checks the sign and normalisation of T_E, T_Z and the zonal share.
  it('equals the rate of change of the shell energies and enstrophies in an inviscid run', () => {
    const h = 2e-4;
    const model = new Model({ ...QUIET, nx: 32, ny: 32, beta: 4, kd: 0.8, dt: h });
    model.setState(randomKeptState(model, 9, 3));
    const snap = new SnapshotPlan(model.params);
    const spectra = SpectraPlan.forSnapshots(snap);
    const plan = new SpectralFluxPlan(snap, spectra);
    const before = spectra.compute(model.qHat);
    model.step();
    const f = plan.compute(model.qHat);
    model.step();
    const after = spectra.compute(model.qHat);
    const scaleE = maxAbs(f.TE);
    const scaleZ = maxAbs(f.TZ);
    expect(scaleE).toBeGreaterThan(0);
    for (let s = 0; s < spectra.nShells; s++) {
      expect(Math.abs((after.E[s] - before.E[s]) / (2 * h) - f.TE[s])).toBeLessThan(1e-6 * scaleE);
      expect(Math.abs((after.Z[s] - before.Z[s]) / (2 * h) - f.TZ[s])).toBeLessThan(1e-6 * scaleZ);
      expect(Math.abs((after.EZonal[s] - before.EZonal[s]) / (2 * h) - f.TEZonal[s])).toBeLessThan(1e-6 * scaleE);
    }
    let zonalBefore = 0,
      zonalAfter = 0;
    for (let s = 0; s < spectra.nShells; s++) {
      zonalBefore += before.EZonal[s];
      zonalAfter += after.EZonal[s];
    }
    expect(Math.abs(f.zonalEnergyTransfer)).toBeGreaterThan(1e-3 * scaleE);
    expect(Math.abs((zonalAfter - zonalBefore) / (2 * h) - f.zonalEnergyTransfer)).toBeLessThan(1e-6 * scaleE);
  });

  // Eddy-to-mean conversion: Σ_{kx=0} T_E = ⟨ū · (−∂y u′v′)⟩ [derived] docs/spectra.md, from the Taylor
  // identity (CHECKS: Taylor 1915; Vallis 2017), with or without the k_d² term.
  for (const kd of [0, 1.3]) {
    it(`the transfer into the zonal modes equals the grid-space ⟨ū·(−∂y u′v′)⟩ (k_d = ${kd})`, () => {
      const model = new Model({ ...QUIET, nx: 64, ny: 32, Lx: 2 * Math.PI, Ly: Math.PI, kd });
      model.setState(randomKeptState(model, 23, 5));
      const snap = new SnapshotPlan(model.params);
      const f = new SpectralFluxPlan(snap).compute(model.qHat);
      const ref = eddyToMeanInGridSpace(snap.gridFields(model.qHat));
      expect(Math.abs(ref)).toBeGreaterThan(1e-3 * f.grossEnergyTransfer);
      expect(Math.abs(f.zonalEnergyTransfer - ref)).toBeLessThan(1e-12 * f.grossEnergyTransfer);
    });
  }

  // Forced run: inverse energy cascade (Π_E < 0 below k_f) and forward enstrophy cascade (Π_Z > 0
  // above) [published] Kraichnan, Phys. Fluids 10, 1417 (1967). 64², k_f = 10 (the kept range ends
  // at 21), β = 10 (k_β ≈ 4), hyperviscosity of order 4 damping at rate 4 at the grid scale; the
  // mean over 30 snapshots from t ≈ 3 to 9.5 (measured: Π_E ≈ −0.08 at k = 1.5 falling to −0.72 at
  // 8.5; Π_Z ≈ 50–84 from 10.5 to 20.5, with ε = 1, η ≈ 100; about 2–3 s).
  it('shows an inverse energy flux below k_f and a forward enstrophy flux above it in a forced run', () => {
    const [nx, kf, dkf] = [64, 10, 1];
    const model = new Model({
      nx,
      ny: nx,
      beta: 10,
      kd: 0,
      mu: 0.1,
      nu: 4 / Math.pow(21, 8),
      nu_order: 4,
      mu_ls: 0,
      forcing: 'stochastic',
      kf,
      dkf,
      eps: 1,
      cfl: 0.5,
      dt: 0.02,
      seed: 3,
      init_energy: 0,
    });
    const snap = new SnapshotPlan(model.params);
    const plan = new SpectralFluxPlan(snap);
    const out = plan.createOutput();
    const n = plan.spectra.nShells;
    const PiE = new Float64Array(n);
    const PiZ = new Float64Array(n);
    model.step(500);
    const count = 30;
    for (let i = 0; i < count; i++) {
      model.step(50);
      plan.compute(model.qHat, out);
      expect(Math.abs(out.netEnergyTransfer)).toBeLessThan(1e-13 * out.grossEnergyTransfer);
      for (let s = 0; s < n; s++) {
        PiE[s] += out.PiE[s] / count;
        PiZ[s] += out.PiZ[s] / count;
      }
    }
    const kMax = snap.grid.kMaxKept;
    let below = 0,
      above = 0;
    for (let s = 0; s < n; s++) {
      const k = out.kEdge[s];
      if (k < kf - dkf) {
        expect(PiE[s]).toBeLessThan(0);
        below++;
      } else if (k > kf + dkf && k < kMax) {
        expect(PiZ[s]).toBeGreaterThan(0);
        above++;
      }
    }
    expect(below).toBe(8);
    expect(above).toBe(10);
  });
});
