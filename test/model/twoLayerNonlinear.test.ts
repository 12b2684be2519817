import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { TwoLayerNonlinearTerm } from '../../lib/model/twoLayerNonlinear';
import { QUIET, sampleGrid, spectrumOf } from '../support/modelFixtures';
import { maxAbs, maxAbsDiff } from '../support/random';
import { randomTwoLayerState } from '../support/twoLayerFixtures';

type Wave = { a: number; kx: number; ky: number; phi: number };

const sumOf = (waves: Wave[], f: (w: Wave, arg: number) => number) => (x: number, y: number) =>
  waves.reduce((s, w) => s + f(w, w.kx * x + w.ky * y + w.phi), 0);

/**
 * The exact J(ψ_i, q_i) of ψ_i = Σ a cos(k·x + φ), q₁ = ∇²ψ₁ + F₁(ψ₂ − ψ₁), q₂ = ∇²ψ₂ + F₂(ψ₁ − ψ₂)
 * [published: Phillips 1954; Pedlosky 1987 §7.11], from the derivatives, point by point.
 */
function analyticJacobians(w1: Wave[], w2: Wave[], F1: number, F2: number) {
  const px = (w: Wave[]) => sumOf(w, (v, t) => -v.a * v.kx * Math.sin(t));
  const py = (w: Wave[]) => sumOf(w, (v, t) => -v.a * v.ky * Math.sin(t));
  // ∂(∇²ψ)/∂x = Σ a K² kx sin, likewise y.
  const lx = (w: Wave[]) => sumOf(w, (v, t) => v.a * (v.kx ** 2 + v.ky ** 2) * v.kx * Math.sin(t));
  const ly = (w: Wave[]) => sumOf(w, (v, t) => v.a * (v.kx ** 2 + v.ky ** 2) * v.ky * Math.sin(t));
  const [p1x, p1y, p2x, p2y] = [px(w1), py(w1), px(w2), py(w2)];
  const [l1x, l1y, l2x, l2y] = [lx(w1), ly(w1), lx(w2), ly(w2)];
  const J1 = (x: number, y: number) => {
    const qx = l1x(x, y) + F1 * (p2x(x, y) - p1x(x, y));
    const qy = l1y(x, y) + F1 * (p2y(x, y) - p1y(x, y));
    return p1x(x, y) * qy - p1y(x, y) * qx;
  };
  const J2 = (x: number, y: number) => {
    const qx = l2x(x, y) + F2 * (p1x(x, y) - p2x(x, y));
    const qy = l2y(x, y) + F2 * (p1y(x, y) - p2y(x, y));
    return p2x(x, y) * qy - p2y(x, y) * qx;
  };
  return { psi1: sumOf(w1, (v, t) => v.a * Math.cos(t)), psi2: sumOf(w2, (v, t) => v.a * Math.cos(t)), J1, J2 };
}

// −J(ψ_i, q_i) of the two-layer model against the analytic Jacobian of a few waves whose products all
// lie inside the kept modes: exact to round-off, including the interface term F_i J(ψ_i, ψ_j).
describe('TwoLayerNonlinearTerm', () => {
  for (const depthRatio of [1, 0.3]) {
    it(`equals −J(ψ_i, q_i) of analytic fields to round-off (δ = ${depthRatio})`, () => {
      const kd = 2.2;
      const p = {
        ...QUIET,
        layers: 2 as const,
        kd,
        depth_ratio: depthRatio,
        nx: 32,
        ny: 32,
        Lx: 2 * Math.PI,
        Ly: 4 * Math.PI,
      };
      const F1 = (kd * kd) / (1 + depthRatio);
      const F2 = (depthRatio * kd * kd) / (1 + depthRatio);
      const w1: Wave[] = [
        { a: 0.7, kx: 1, ky: 0.5, phi: 0.3 },
        { a: -0.4, kx: 2, ky: -1.5, phi: 1.1 },
        { a: 0.25, kx: 0, ky: 2, phi: -0.4 },
      ];
      const w2: Wave[] = [
        { a: 0.5, kx: 3, ky: 0, phi: 2.0 },
        { a: -0.3, kx: 1, ky: 1, phi: -1.2 },
        { a: 0.2, kx: 2, ky: 2.5, phi: 0.7 },
      ];
      const { psi1, psi2, J1, J2 } = analyticJacobians(w1, w2, F1, F2);
      const model = new Model(p);
      const g = model.grid;
      const s1 = spectrumOf(p, sampleGrid(p, psi1));
      const s2 = spectrumOf(p, sampleGrid(p, psi2));
      const n = 2 * g.spectralSize;
      const q = new Float64Array(2 * n);
      for (let m = 0; m < g.spectralSize; m++) {
        for (const c of [0, 1]) {
          const a = s1[2 * m + c];
          const b = s2[2 * m + c];
          q[2 * m + c] = -g.k2[m] * a + F1 * (b - a);
          q[n + 2 * m + c] = -g.k2[m] * b + F2 * (a - b);
        }
      }
      model.setState(q);
      const nl = new TwoLayerNonlinearTerm(g, model.twoLayerLinear!);
      const out1 = new Float64Array(n).fill(3);
      const out2 = new Float64Array(n).fill(3);
      nl.evaluate(model.qHat.subarray(0, n), model.qHat.subarray(n), out1, out2);
      const e1 = spectrumOf(p, sampleGrid(p, J1)).map((x) => -x);
      const e2 = spectrumOf(p, sampleGrid(p, J2)).map((x) => -x);
      const scale = Math.max(maxAbs(e1), maxAbs(e2));
      expect(scale).toBeGreaterThan(0.1);
      expect(maxAbsDiff(out1, e1)).toBeLessThan(1e-13 * scale);
      expect(maxAbsDiff(out2, e2)).toBeLessThan(1e-13 * scale);
      // ψ̂ kept for the budget: the analytic ψ̂₁, ψ̂₂.
      expect(maxAbsDiff(nl.psi1, s1)).toBeLessThan(1e-14 * maxAbs(s1));
      expect(maxAbsDiff(nl.psi2, s2)).toBeLessThan(1e-14 * maxAbs(s2));
      // Speeds: the largest |u_i| and |v_i| of the sampled fields.
      const u1 = sampleGrid(
        p,
        sumOf(w1, (v, t) => v.a * v.ky * Math.sin(t)),
      );
      expect(nl.maxU1).toBeCloseTo(maxAbs(u1), 13);
    });
  }

  // Energy E = ½Σh_i⟨|∇ψ_i|²⟩ + ½F₁h₁⟨(ψ₁ − ψ₂)²⟩ and potential enstrophy ½Σh_i⟨q_i²⟩ are conserved by
  // the Jacobians [published: Pedlosky 1987; Vallis 2017], and by their Galerkin truncation [practice]:
  // Σh_i⟨ψ_i J(ψ_i, q_i)⟩ = 0 and Σh_i⟨q_i J(ψ_i, q_i)⟩ = 0 to round-off, on random dealiased states.
  for (const [nx, ny, depthRatio] of [
    [32, 32, 1],
    [64, 32, 0.25],
    [32, 128, 4],
  ]) {
    it(`conserves energy and potential enstrophy at ${nx}×${ny}, δ = ${depthRatio}`, () => {
      const model = new Model({ ...QUIET, layers: 2, kd: 5, depth_ratio: depthRatio, nx, ny, Ly: 3 });
      const g = model.grid;
      const n = 2 * g.spectralSize;
      model.setState(randomTwoLayerState(g, 7 + nx));
      const nl = new TwoLayerNonlinearTerm(g, model.twoLayerLinear!);
      const a1 = new Float64Array(n);
      const a2 = new Float64Array(n);
      const q1 = model.qHat.subarray(0, n);
      const q2 = model.qHat.subarray(n);
      nl.evaluate(q1, q2, a1, a2);
      const h1 = depthRatio / (1 + depthRatio);
      const h2 = 1 / (1 + depthRatio);
      let e = 0,
        z = 0,
        eScale = 0,
        zScale = 0;
      for (let m = 0; m < g.spectralSize; m++) {
        const w = m % g.nkx === 0 ? 1 : 2;
        for (const c of [0, 1]) {
          const t = 2 * m + c;
          e += w * (h1 * nl.psi1[t] * a1[t] + h2 * nl.psi2[t] * a2[t]);
          z += w * (h1 * q1[t] * a1[t] + h2 * q2[t] * a2[t]);
          eScale += w * (h1 * Math.abs(nl.psi1[t] * a1[t]) + h2 * Math.abs(nl.psi2[t] * a2[t]));
          zScale += w * (h1 * Math.abs(q1[t] * a1[t]) + h2 * Math.abs(q2[t] * a2[t]));
        }
      }
      expect(Math.abs(e)).toBeLessThan(1e-13 * eScale);
      expect(Math.abs(z)).toBeLessThan(1e-13 * zScale);
      // Exactly zero off the kept modes, and a real field (Hermitian kx = 0 column).
      for (let jy = 0; jy < g.ny; jy++)
        for (let ix = 0; ix < g.nkx; ix++) {
          const t = 2 * (jy * g.nkx + ix);
          if (!g.kept(ix, jy)) expect(a1[t] === 0 && a1[t + 1] === 0 && a2[t] === 0 && a2[t + 1] === 0).toBe(true);
        }
      for (let jy = 1; jy < g.ny / 2; jy++) {
        const p = 2 * jy * g.nkx;
        const q = 2 * (g.ny - jy) * g.nkx;
        expect(a2[p] === a2[q] && a2[p + 1] === -a2[q + 1]).toBe(true);
      }
    });
  }
});
