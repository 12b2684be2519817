import { describe, expect, it } from 'vitest';
import { SnapshotPlan } from '../../lib/analysis/snapshot';
import { SpectraPlan } from '../../lib/analysis/spectra';
import { Grid } from '../../lib/model/grid';
import { Model } from '../../lib/model/model';
import { QUIET, energyEnstrophy, randomKeptState, sampleGrid, spectrumOf } from '../support/modelFixtures';
import { randomArray, seededSigned } from '../support/random';

type Wave = { a: number; mx: number; my: number; phi: number };

/** Seeded waves ψ = Σ a cos(kx x + ky y + φ) with integer indices strictly below the Nyquist ones. */
function randomWaves(count: number, seed: number, nx: number, ny: number): Wave[] {
  const next = seededSigned(seed);
  const waves: Wave[] = [];
  for (let i = 0; i < count; i++) {
    const mx = Math.round(((nx / 2 - 1) * (next() + 1)) / 2);
    const my = Math.round((ny / 2 - 1) * next());
    if (mx === 0 && my === 0) continue;
    waves.push({ a: next(), mx, my, phi: Math.PI * next() });
  }
  return waves;
}

/** ψ, u = −ψ_y and v = ψ_x of the waves at (x, y), from the analytic derivatives. */
function evalWaves(waves: Wave[], Lx: number, Ly: number, x: number, y: number): [number, number, number] {
  let psi = 0,
    u = 0,
    v = 0;
  for (const w of waves) {
    const kx = (2 * Math.PI * w.mx) / Lx;
    const ky = (2 * Math.PI * w.my) / Ly;
    const ph = kx * x + ky * y + w.phi;
    psi += w.a * Math.cos(ph);
    u += w.a * ky * Math.sin(ph);
    v -= w.a * kx * Math.sin(ph);
  }
  return [psi, u, v];
}

/** q̂ = −K² ψ̂ over every stored mode. */
function pvOf(grid: Grid, psiHat: Float64Array, kd: number): Float64Array {
  const q = new Float64Array(psiHat.length);
  for (let m = 0; m < grid.spectralSize; m++) {
    const K2 = grid.k2[m] + kd * kd;
    q[2 * m] = -K2 * psiHat[2 * m];
    q[2 * m + 1] = -K2 * psiHat[2 * m + 1];
  }
  return q;
}

function sum(a: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i];
  return s;
}

describe('SpectraPlan', () => {
  it('puts a single wave in the shell round(|k|/dk) − 1 with energy a²K²/4', () => {
    const p = { nx: 32, ny: 32, Lx: 2 * Math.PI, Ly: 2 * Math.PI };
    const grid = new Grid(p);
    const kd = 0.5;
    const plan = new SpectraPlan(grid, kd);
    const a = 0.3;
    const psiHat = spectrumOf(
      p,
      sampleGrid(p, (x, y) => a * Math.cos(2 * x - 3 * y + 0.4)),
    );
    const s = plan.compute(pvOf(grid, psiHat, kd));
    // |k| = √13 ≈ 3.606 → shell 3 (k = 4); ½⟨|∇ψ|² + k_d²ψ²⟩ = a²(13 + k_d²)/4.
    const expected = (a * a * (13 + kd * kd)) / 4;
    expect(Math.abs(s.E[3] / expected - 1)).toBeLessThan(1e-14);
    expect(Math.abs(s.EResidual[3] / expected - 1)).toBeLessThan(1e-14);
    // Elsewhere only the transform's round-off: amplitudes ~1e-16 relative, energies ~1e-32.
    expect(sum(s.EZonal)).toBeLessThan(1e-28 * expected);
    expect(sum(s.E) - s.E[3]).toBeLessThan(1e-28 * expected);
    expect(Math.abs(s.Z[3] / (((13 + kd * kd) ** 2 * a * a) / 4) - 1)).toBeLessThan(1e-14);
    // The 2D map holds one full-plane mode's ½|q̂|²/K² at (kx, ky) = (2, −3): with its mirror (−2, 3)
    // it makes up the wave's energy.
    const col = 2;
    const row = s.ky2d.indexOf(-3);
    expect(row).toBeGreaterThanOrEqual(0);
    expect(Math.abs((2 * s.E2d[row * s.kx2d.length + col]) / expected - 1)).toBeLessThan(1e-14);
  });

  it('bins a zonal wave into the zonal part, by |ky|', () => {
    const p = { nx: 32, ny: 64, Lx: 2 * Math.PI, Ly: 4 * Math.PI };
    const grid = new Grid(p);
    const plan = new SpectraPlan(grid, 0);
    expect(plan.dk).toBe(0.5);
    const psiHat = spectrumOf(
      p,
      sampleGrid(p, (_x, y) => Math.cos(1.5 * y)),
    );
    const s = plan.compute(pvOf(grid, psiHat, 0));
    // ky = 1.5 = 3 dk → shell 2; energy ½⟨u²⟩ = 1.5²/4.
    expect(Math.abs(s.EZonal[2] / (2.25 / 4) - 1)).toBeLessThan(1e-14);
    expect(sum(s.EResidual)).toBeLessThan(1e-28);
    // The map is symmetric on the kx = 0 column: (0, ±1.5) both hold ½|q̂|²/K².
    const cols = s.kx2d.length;
    const up = s.E2d[s.ky2d.indexOf(1.5) * cols];
    const down = s.E2d[s.ky2d.indexOf(-1.5) * cols];
    expect(up).toBeGreaterThan(0);
    expect(up).toBe(down);
    expect(Math.abs((up + down) / (2.25 / 4) - 1)).toBeLessThan(1e-14);
  });

  it('assigns every mode to its shell by the stated rule and counts modes per shell', () => {
    const p = { nx: 16, ny: 32, Lx: 3, Ly: 5 };
    const grid = new Grid(p);
    const plan = new SpectraPlan(grid, 0);
    expect(plan.dk).toBe((2 * Math.PI) / 5);
    const counts = new Array(plan.nShells).fill(0);
    // Slow reference: every full-plane mode of the nx × ny transform except the mean.
    for (let mx = -p.nx / 2 + 1; mx <= p.nx / 2; mx++) {
      for (let my = -p.ny / 2 + 1; my <= p.ny / 2; my++) {
        if (mx === 0 && my === 0) continue;
        const k = Math.hypot((2 * Math.PI * mx) / p.Lx, (2 * Math.PI * my) / p.Ly);
        counts[Math.round(k / plan.dk) - 1] += 1;
      }
    }
    expect(Array.from(plan.modeCount)).toEqual(counts);
    expect(sum(plan.modeCount)).toBe(p.nx * p.ny - 1);
  });

  // Parseval (grid.ts normalisation): Σ_k E(k) = ½⟨|∇ψ|² + k_d²ψ²⟩ and the zonal part = ½⟨ū² + k_d²ψ̄²⟩,
  // against grid-space means of the analytic velocities, on a non-square grid and domain.
  for (const kd of [0, 2.3]) {
    it(`sums to the grid-space energy, total and zonal, to round-off (k_d = ${kd})`, () => {
      const p = { nx: 32, ny: 64, Lx: 2 * Math.PI, Ly: 3 * Math.PI };
      const grid = new Grid(p);
      const plan = new SpectraPlan(grid, kd);
      const waves = randomWaves(60, 7, p.nx, p.ny);
      waves.push({ a: 0.8, mx: 0, my: 2, phi: 0.2 }, { a: -0.5, mx: 0, my: 5, phi: 1.3 });
      const psi = new Float64Array(grid.size);
      let eGrid = 0;
      let eZonalGrid = 0;
      for (let j = 0; j < p.ny; j++) {
        let uBar = 0,
          psiBar = 0;
        for (let i = 0; i < p.nx; i++) {
          const [ps, u, v] = evalWaves(waves, p.Lx, p.Ly, (i * p.Lx) / p.nx, (j * p.Ly) / p.ny);
          psi[j * p.nx + i] = ps;
          eGrid += 0.5 * (u * u + v * v + kd * kd * ps * ps);
          uBar += u / p.nx;
          psiBar += ps / p.nx;
        }
        eZonalGrid += 0.5 * (uBar * uBar + kd * kd * psiBar * psiBar);
      }
      eGrid /= grid.size;
      eZonalGrid /= p.ny;
      const out = plan.createOutput();
      const s = plan.compute(pvOf(grid, spectrumOf(p, psi), kd), out);
      expect(s).toBe(out);
      expect(Math.abs(s.energy / eGrid - 1)).toBeLessThan(1e-13);
      expect(Math.abs(sum(s.E) / eGrid - 1)).toBeLessThan(1e-13);
      expect(Math.abs(sum(s.EZonal) / eZonalGrid - 1)).toBeLessThan(1e-13);
      for (let i = 0; i < plan.nShells; i++) expect(s.E[i]).toBe(s.EZonal[i] + s.EResidual[i]);
    });
  }

  it('sums to the enstrophy ½⟨q²⟩ − ½q̄² of any real field, Nyquist modes included', () => {
    const p = { nx: 32, ny: 16, Lx: 2, Ly: 1 };
    const grid = new Grid(p);
    const plan = new SpectraPlan(grid, 1.1, { extent: 'stored' });
    const q = randomArray(grid.size, 3);
    let mean = 0,
      sq = 0;
    for (const x of q) {
      mean += x / grid.size;
      sq += (x * x) / grid.size;
    }
    const qHat = spectrumOf(p, q);
    const s = plan.compute(qHat);
    const zGrid = 0.5 * sq - 0.5 * mean * mean;
    expect(Math.abs(s.enstrophy / zGrid - 1)).toBeLessThan(1e-13);
    expect(Math.abs(sum(plan.power(qHat)) / zGrid - 1)).toBeLessThan(1e-13);
    // With the 'stored' extent the 2D map covers every mode: Σ w·E2d = E.
    let e2d = 0;
    const cols = s.kx2d.length;
    for (let c = 0; c < s.E2d.length; c++) e2d += grid.weight(c % cols) * s.E2d[c];
    expect(Math.abs(e2d / s.energy - 1)).toBeLessThan(1e-13);
  });

  it('matches the model energy and enstrophy of a Stria state and marks the kept and complete shells', () => {
    const model = new Model({ ...QUIET, nx: 64, ny: 64, kd: 1.5 });
    model.setState(randomKeptState(model, 21, 2));
    const snap = new SnapshotPlan(model.params);
    const plan = SpectraPlan.forSnapshots(snap);
    const s = plan.compute(model.qHat);
    const ref = energyEnstrophy(model);
    expect(Math.abs(s.energy / ref.energy - 1)).toBeLessThan(1e-13);
    expect(Math.abs(s.enstrophy / ref.enstrophy - 1)).toBeLessThan(1e-13);
    // Kx = Ky = 21: the first dropped mode is (22, 0), shell 21; the kept corner (21, 21) is in shell 29.
    expect(plan.completeShells).toBe(21);
    expect(plan.keptShells).toBe(30);
    expect(s.E[plan.keptShells - 1]).toBeGreaterThan(0);
    for (let i = plan.keptShells; i < plan.nShells; i++) expect(s.E[i]).toBe(0);
    // Default 2D extent is the kept block, which holds all of a Stria state.
    let e2d = 0;
    const cols = s.kx2d.length;
    expect(cols).toBe(22);
    expect(s.ky2d.length).toBe(43);
    for (let c = 0; c < s.E2d.length; c++) e2d += (c % cols === 0 ? 1 : 2) * s.E2d[c];
    expect(Math.abs(e2d / s.energy - 1)).toBeLessThan(1e-13);
  });
});
