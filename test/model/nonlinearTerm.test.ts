import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { NonlinearTerm } from '../../lib/model/nonlinearTerm';
import { maxAbs, maxAbsDiff } from '../support/random';
import { QUIET, randomKeptState, sampleGrid, spectrumOf } from '../support/modelFixtures';

type Wave = { a: number; kx: number; ky: number; phi: number };

/** ψ = Σ a cos(kx x + ky y + φ) and the exact J(ψ, q) of it, q = ∇²ψ − kd²ψ, from the derivatives. */
function analyticJacobian(
  waves: Wave[],
  kd: number,
): { psi: (x: number, y: number) => number; J: (x: number, y: number) => number } {
  const psi = (x: number, y: number) => waves.reduce((s, w) => s + w.a * Math.cos(w.kx * x + w.ky * y + w.phi), 0);
  const J = (x: number, y: number) => {
    let px = 0,
      py = 0,
      qx = 0,
      qy = 0;
    for (const w of waves) {
      const s = Math.sin(w.kx * x + w.ky * y + w.phi);
      const K2 = w.kx * w.kx + w.ky * w.ky + kd * kd;
      px -= w.a * w.kx * s;
      py -= w.a * w.ky * s;
      qx += K2 * w.a * w.kx * s;
      qy += K2 * w.a * w.ky * s;
    }
    return px * qy - py * qx;
  };
  return { psi, J };
}

function nonlinearOf(model: Model): Float64Array {
  const nl = new NonlinearTerm(model.grid, model.linear, model.transform);
  const out = new Float64Array(model.qHat.length);
  nl.evaluate(model.qHat, out);
  return out;
}

// The Jacobian J(ψ, q) = ψ_x q_y − ψ_y q_x of the QG equation (Pedlosky 1987; Vallis 2017), evaluated
// analytically for a few waves whose products all lie inside the kept modes: an exact check.
describe('NonlinearTerm', () => {
  for (const kd of [0, 1.7]) {
    it(`equals −J(ψ, q) of an analytic field to round-off (k_d = ${kd})`, () => {
      const p = { ...QUIET, nx: 32, ny: 32, Lx: 2 * Math.PI, Ly: 4 * Math.PI, kd };
      const waves: Wave[] = [
        { a: 0.7, kx: 1, ky: 0.5, phi: 0.3 },
        { a: -0.4, kx: 2, ky: -1.5, phi: 1.1 },
        { a: 0.25, kx: 0, ky: 2, phi: -0.4 },
        { a: 0.5, kx: 3, ky: 0, phi: 2.0 },
      ];
      const { psi, J } = analyticJacobian(waves, kd);
      const model = new Model(p);
      const psiHat = spectrumOf(p, sampleGrid(p, psi));
      const qHat = new Float64Array(psiHat.length);
      const g = model.grid;
      for (let m = 0; m < g.spectralSize; m++) {
        const K2 = g.k2[m] + kd * kd;
        qHat[2 * m] = -K2 * psiHat[2 * m];
        qHat[2 * m + 1] = -K2 * psiHat[2 * m + 1];
      }
      model.setState(qHat);
      const got = nonlinearOf(model);
      const minusJ = sampleGrid(p, (x, y) => -J(x, y));
      const ref = spectrumOf(p, minusJ);
      expect(maxAbs(ref)).toBeGreaterThan(0.1);
      expect(maxAbsDiff(got, ref)).toBeLessThan(1e-13 * maxAbs(ref));
    });
  }

  // Energy and enstrophy conservation of the Galerkin-truncated Jacobian (Kraichnan 1967; a fact of
  // every truncated spectral model, common practice): Σ q̂*·N/K² = 0 and Σ q̂*·N = 0 over all modes.
  for (const [nx, ny, kd] of [
    [32, 32, 0],
    [64, 32, 0],
    [64, 128, 3],
  ]) {
    it(`transfers conserve energy and enstrophy to round-off at ${nx}×${ny}, k_d = ${kd}`, () => {
      const model = new Model({ ...QUIET, nx, ny, Lx: 2 * Math.PI, Ly: 2 * Math.PI * (ny / nx), kd });
      model.setState(randomKeptState(model, nx + ny + kd));
      const n = nonlinearOf(model);
      const q = model.qHat;
      const g = model.grid;
      const inv = model.linear.invK2;
      let dE = 0,
        dZ = 0,
        scaleE = 0,
        scaleZ = 0;
      for (let jy = 0; jy < g.ny; jy++) {
        for (let ix = 0; ix < g.nkx; ix++) {
          const m = jy * g.nkx + ix;
          const w = g.weight(ix);
          const t = w * (q[2 * m] * n[2 * m] + q[2 * m + 1] * n[2 * m + 1]);
          const mag = w * Math.hypot(q[2 * m], q[2 * m + 1]) * Math.hypot(n[2 * m], n[2 * m + 1]);
          dE += t * inv[m];
          dZ += t;
          scaleE += mag * inv[m];
          scaleZ += mag;
        }
      }
      expect(scaleZ).toBeGreaterThan(0);
      expect(Math.abs(dE)).toBeLessThan(1e-13 * scaleE);
      expect(Math.abs(dZ)).toBeLessThan(1e-13 * scaleZ);
    });
  }
});
