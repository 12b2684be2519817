import { describe, expect, it } from 'vitest';
import { AllocationMeter } from '../../lib/io/allocationMeter';
import { SnapshotPlan } from '../../lib/analysis/snapshot';
import { SpectraPlan } from '../../lib/analysis/spectra';
import { SpectralFluxPlan } from '../../lib/analysis/spectralFlux';
import { UserSpectralPlan } from '../../lib/userfile/spectral';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { maxAbs, maxAbsDiff } from '../support/random';
import { randomGridFields } from '../support/randomFields';
import { spectrumOf } from '../support/modelFixtures';

const spec = { nx: 64, ny: 32, Lx: 3, Ly: 2, kd: 1.5, maxIx: 20, maxM: 10, seed: 11 };

describe("spectral operations on a user's doubly periodic field", () => {
  const f = randomGridFields(spec);
  const plan = new UserSpectralPlan(spec, spec.kd, new AllocationMeter());
  const n = spec.nx * spec.ny;

  it('differentiate and invert exactly: u = −ψ_y, v = ψ_x, ζ = ∇²ψ, ψ = ∇⁻²ζ', () => {
    const out = new Float64Array(n);
    expect(maxAbsDiff(plan.ddx(f.psi, out), f.v)).toBeLessThan(1e-12 * maxAbs(f.v));
    expect(
      maxAbsDiff(
        plan.ddy(f.psi, out).map((x) => -x),
        f.u,
      ),
    ).toBeLessThan(1e-12 * maxAbs(f.u));
    expect(maxAbsDiff(plan.laplacian(f.psi, out), f.zeta)).toBeLessThan(1e-12 * maxAbs(f.zeta));
    const mean = f.psi.reduce((a, b) => a + b, 0) / n;
    expect(
      maxAbsDiff(
        plan.invertLaplacian(f.zeta, out),
        f.psi.map((p) => p - mean),
      ),
    ).toBeLessThan(1e-12 * maxAbs(f.psi));
  });

  it('give the spectra of spectra.ts, which sum to the domain-mean energy (Parseval)', () => {
    const sp = plan.pvSpectra(f.q, plan.spectra.createOutput());
    const ref = new SpectraPlan(plan.grid, spec.kd, { extent: 'stored' }).compute(spectrumOf(spec, f.q));
    expect(maxAbsDiff(sp.E, ref.E)).toBe(0);
    // E = ½⟨u² + v² + k_d²ψ′²⟩ [practice: Parseval's identity in the normalisation of grid.ts].
    const mean = f.psi.reduce((a, b) => a + b, 0) / n;
    let e = 0;
    for (let k = 0; k < n; k++) e += 0.5 * (f.u[k] ** 2 + f.v[k] ** 2 + spec.kd ** 2 * (f.psi[k] - mean) ** 2);
    expect(Math.abs(sp.energy / (e / n) - 1)).toBeLessThan(1e-12);
    const ke = plan.kineticSpectrum(
      f.u,
      f.v,
      new Float64Array(plan.spectra.nShells),
      new Float64Array(plan.spectra.nShells),
    );
    let k2 = 0;
    for (let k = 0; k < n; k++) k2 += 0.5 * (f.u[k] ** 2 + f.v[k] ** 2);
    expect(Math.abs(ke.reduce((a, b) => a + b, 0) / (k2 / n) - 1)).toBeLessThan(1e-12);
  });

  it("give the model's own spectral flux, whose transfers sum to zero", () => {
    const { flux, keptEnergyFraction } = plan.pvFlux(f.q);
    const snap = new SnapshotPlan({
      ...DEFAULT_PARAMS,
      nx: spec.nx,
      ny: spec.ny,
      Lx: spec.Lx,
      Ly: spec.Ly,
      kd: spec.kd,
    });
    const ref = new SpectralFluxPlan(snap).compute(spectrumOf(spec, f.q));
    expect(maxAbsDiff(flux.PiE, ref.PiE)).toBe(0);
    // The truncated Jacobian conserves energy and enstrophy [published] Kraichnan, Phys. Fluids 10,
    // 1417 (1967); [practice] for Galerkin-truncated models: the transfers sum to round-off.
    expect(Math.abs(flux.netEnergyTransfer)).toBeLessThan(1e-12 * flux.grossEnergyTransfer);
    expect(keptEnergyFraction).toBe(1); // the field lies inside the 2/3-rule band
    // A mode a·cos(k x) outside the band (index 28 > ⌊64/3⌋) holds energy a²/(4(k² + k_d²)) [derived:
    // its two coefficients a/2 at ±k, each ½|q̂|²/K²], so the kept fraction is E0/(E0 + a²/(4K²)).
    const [a, ix] = [0.7, 28];
    const k = (2 * Math.PI * ix) / spec.Lx;
    const wide = f.q.map((q, c) => q + a * Math.cos(k * (c % spec.nx) * (spec.Lx / spec.nx)));
    const E0 = plan.pvSpectra(f.q, plan.spectra.createOutput()).energy;
    const want = E0 / (E0 + (a * a) / (4 * (k * k + spec.kd ** 2)));
    expect(Math.abs(plan.pvFlux(wide).keptEnergyFraction / want - 1)).toBeLessThan(1e-12);
  });
});
