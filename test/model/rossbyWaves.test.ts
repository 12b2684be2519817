import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { QUIET, sampleGrid, spectrumOf } from '../support/modelFixtures';

// The test's own reference: linear Rossby waves of the one-layer QG beta-plane, K² = kx² + ky² + kd²:
//   ω = −β kx/K², c = ω/kx = −β/K², c_gx = β(kx² − ky² − kd²)/K⁴, c_gy = 2β kx ky/K⁴.
// [published] Pedlosky, Geophysical Fluid Dynamics, 2nd ed., Springer 1987; Vallis, Atmospheric and
// Oceanic Fluid Dynamics, 2nd ed., Cambridge 2017. Units follow the inputs (β in 1/(length·time),
// k in 1/length → c in length/time).

/** Zonal phase speed ω/kx = −β/K². */
function rossbyPhaseSpeed(beta: number, kx: number, ky: number, kd: number): number {
  return -beta / (kx * kx + ky * ky + kd * kd);
}

/** Group velocity [c_gx, c_gy] = [∂ω/∂kx, ∂ω/∂ky]. */
function rossbyGroupVelocity(beta: number, kx: number, ky: number, kd: number): [number, number] {
  const K2 = kx * kx + ky * ky + kd * kd;
  const K4 = K2 * K2;
  return [(beta * (kx * kx - ky * ky - kd * kd)) / K4, (2 * beta * kx * ky) / K4];
}

/** Set ψ = psi(x, y) as the model state (q̂ = −K² ψ̂). */
function setPsi(model: Model, psi: (x: number, y: number) => number): void {
  const p = model.params;
  const psiHat = spectrumOf(p, sampleGrid(p, psi));
  const q = new Float64Array(psiHat.length);
  const kd2 = p.kd * p.kd;
  for (let m = 0; m < model.grid.spectralSize; m++) {
    const K2 = model.grid.k2[m] + kd2;
    q[2 * m] = -K2 * psiHat[2 * m];
    q[2 * m + 1] = -K2 * psiHat[2 * m + 1];
  }
  model.setState(q);
}

// Rossby waves: ω = −β kx/K², c_gx = β(kx² − ky² − kd²)/K⁴, c_gy = 2β kx ky/K⁴
// [published] Pedlosky, Geophysical Fluid Dynamics, 2nd ed., 1987; Vallis, AOFD, 2nd ed., 2017.
describe('Rossby-wave dispersion relation', () => {
  it('reproduces the worked example: β(45°), 1000 km wavelength → c = −0.41002 m/s, c_gx = +0.41002 m/s', () => {
    // [derived] from the published relation with β = 1.6186774e-11 m⁻¹s⁻¹, k_y = k_d = 0.
    const k = (2 * Math.PI) / 1e6;
    expect(rossbyPhaseSpeed(1.6186774e-11, k, 0, 0)).toBeCloseTo(-0.41002, 5);
    expect(rossbyGroupVelocity(1.6186774e-11, k, 0, 0)[0]).toBeCloseTo(0.41002, 5);
  });

  it('group velocity is the derivative of the frequency (central difference, 1e-8)', () => {
    const [beta, kx, ky, kd] = [2.5, 1.3, -0.7, 0.9];
    const w = (a: number, b: number) => (-beta * a) / (a * a + b * b + kd * kd);
    const h = 1e-5;
    const [cx, cy] = rossbyGroupVelocity(beta, kx, ky, kd);
    expect(Math.abs((w(kx + h, ky) - w(kx - h, ky)) / (2 * h) - cx)).toBeLessThan(1e-8);
    expect(Math.abs((w(kx, ky + h) - w(kx, ky - h)) / (2 * h) - cy)).toBeLessThan(1e-8);
  });
});

describe('linear Rossby waves in the model', () => {
  // A single Fourier mode has J(ψ, q) = 0, so the run is linear and the integrating factor exact:
  // the phase must move at −β/K² to ~1e-8 relative (CHECKS: worked example, [derived]).
  for (const kd of [0, 2e-6]) {
    it(`moves the 1000 km β(45°) wave at the dispersion-relation speed (k_d = ${kd} m⁻¹), SI units`, () => {
      const beta = 1.6186774e-11;
      const L = 1e6;
      const model = new Model({ ...QUIET, nx: 32, ny: 32, Lx: L, Ly: L, beta, kd, dt: 1800, forcing: 'none' });
      const k = (2 * Math.PI) / L;
      setPsi(model, (x) => Math.cos(k * x));
      const idx = 2 * 1; // mode (ix = 1, jy = 0)
      let phase = Math.atan2(model.qHat[idx + 1], model.qHat[idx]);
      let total = 0;
      const steps = 200;
      for (let s = 0; s < steps; s++) {
        model.step();
        const ph = Math.atan2(model.qHat[idx + 1], model.qHat[idx]);
        let d = ph - phase;
        if (d > Math.PI) d -= 2 * Math.PI;
        if (d < -Math.PI) d += 2 * Math.PI;
        total += d;
        phase = ph;
      }
      // q̂ ∝ e^{−iωt} for a wave e^{i(kx − ωt)}: phase speed c = ω/k = −(Δphase)/(k t).
      const c = -total / (k * model.time);
      const expected = rossbyPhaseSpeed(beta, k, 0, kd);
      if (kd === 0) expect(c).toBeCloseTo(-0.41002, 5);
      expect(Math.abs(c / expected - 1)).toBeLessThan(1e-8);
    });
  }

  // A wave packet of tiny amplitude (nonlinearity ~1e-12 relative) carries its energy at the group
  // velocity. For linear waves the space-integrated energy flux is Σ_k c_g(k) E_k exactly (cross terms
  // between modes integrate to zero), so the energy centroid moves at that spectral mean [derived]:
  // checked to 1e-6 relative. It is near c_g(k0) only to O(1/(σ k0)): 5e-2 there.
  const cases: Array<{ kx: number; ky: number; kd: number }> = [
    { kx: 1.2, ky: 0.6, kd: 0 },
    { kx: 1.0, ky: -0.8, kd: 0.5 },
  ];
  for (const { kx, ky, kd } of cases) {
    it(`moves a packet at the group velocity (k0 = (${kx}, ${ky}), k_d = ${kd})`, () => {
      const L = 120;
      const beta = 1;
      const model = new Model({ ...QUIET, nx: 256, ny: 256, Lx: L, Ly: L, beta, kd, dt: 0.5 });
      const sigma = 9;
      const [x0, y0] = [L / 2, L / 2];
      setPsi(
        model,
        (x, y) => 1e-6 * Math.exp(-((x - x0) ** 2 + (y - y0) ** 2) / (2 * sigma * sigma)) * Math.cos(kx * x + ky * y),
      );
      const centroid = () => {
        const u = model.field('u');
        const v = model.field('v');
        const psi = model.field('psi');
        let sx = 0,
          sy = 0,
          s = 0;
        const nx = model.grid.nx;
        for (let j = 0; j < model.grid.ny; j++) {
          for (let i = 0; i < nx; i++) {
            const n = j * nx + i;
            const e = u[n] * u[n] + v[n] * v[n] + kd * kd * psi[n] * psi[n];
            sx += e * ((i * L) / nx);
            sy += e * ((j * L) / model.grid.ny);
            s += e;
          }
        }
        return [sx / s, sy / s];
      };
      // Spectrally weighted group velocity of the initial packet, E_k = ½ w K²|ψ̂|² = ½ w |q̂|²/K².
      const g = model.grid;
      let wx = 0,
        wy = 0,
        wsum = 0;
      for (let jy = 0; jy < g.ny; jy++) {
        for (let ix = 0; ix < g.nkx; ix++) {
          const m = jy * g.nkx + ix;
          if (!g.kept(ix, jy)) continue;
          const e = g.weight(ix) * (model.qHat[2 * m] ** 2 + model.qHat[2 * m + 1] ** 2) * model.linear.invK2[m];
          const [gx, gy] = rossbyGroupVelocity(beta, g.kx[ix], g.ky[jy], kd);
          wx += e * gx;
          wy += e * gy;
          wsum += e;
        }
      }
      const [ax, ay] = centroid();
      model.step(40);
      const [bx, by] = centroid();
      const [cx, cy] = rossbyGroupVelocity(beta, kx, ky, kd);
      const vx = (bx - ax) / model.time;
      const vy = (by - ay) / model.time;
      const speed = Math.hypot(cx, cy);
      expect(Math.abs(vx - wx / wsum)).toBeLessThan(1e-6 * speed);
      expect(Math.abs(vy - wy / wsum)).toBeLessThan(1e-6 * speed);
      expect(Math.abs(vx - cx)).toBeLessThan(5e-2 * speed);
      expect(Math.abs(vy - cy)).toBeLessThan(5e-2 * speed);
    });
  }
});
