import { describe, expect, it } from 'vitest';
import {
  criticalShear,
  eigenvalues2x2,
  growthRate,
  linearMatrix,
  mostUnstable,
  type PhillipsProblem,
} from '../../lib/plan/linearStability';
import { expectQuoted } from './quoted';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

/** The largest growth over a fine grid of (k, l) with K below kMax (for thresholds and cutoffs). */
function largestGrowth(p: PhillipsProblem, kMax: number, n = 200): number {
  let best = -Infinity;
  for (let i = 1; i <= n; i++) {
    for (let j = -n; j <= n; j++) {
      const k = (kMax * i) / n;
      const l = (kMax * j) / n;
      best = Math.max(best, growthRate(p, k, l).growth);
    }
  }
  return best;
}

describe('linear stability of the two-layer (Phillips) model', () => {
  // The eigenproblem of CHECKS.md [derived]: ωψ = k M⁻¹(UM + Q)ψ, growth = Im ω. Here written as
  // dq/dt = Lq; the two must agree: L's eigenvalues are −iω. Checked against the textbook form
  // solved independently (ψ-space, direct 2 × 2 formula) on a few modes.
  it('has the eigenvalues of the textbook form ωψ = k M⁻¹(UM + Q)ψ', () => {
    const p: PhillipsProblem = { kd: 2, depthRatio: 0.25, beta: 0.1, shear: 1 };
    const h1 = 0.25 / 1.25;
    const h2 = 1 / 1.25;
    const F1 = 4 * h2;
    const F2 = 4 * h1;
    const U1 = h2;
    const U2 = -h1;
    const Q1 = 0.1 + F1;
    const Q2 = 0.1 - F2;
    for (const [k, l] of [
      [0.5, 0],
      [1.2, 0.3],
      [2.5, -1],
    ]) {
      const K2 = k * k + l * l;
      const M = [-K2 - F1, F1, F2, -K2 - F2];
      const det = M[0] * M[3] - M[1] * M[2];
      const Mi = [M[3] / det, -M[1] / det, -M[2] / det, M[0] / det];
      // B = UM + Q (real), then k·M⁻¹B, real 2 × 2: its eigenvalues ω.
      const B = [U1 * M[0] + Q1, U1 * M[1], U2 * M[2], U2 * M[3] + Q2];
      const C = [
        k * (Mi[0] * B[0] + Mi[1] * B[2]),
        k * (Mi[0] * B[1] + Mi[1] * B[3]),
        k * (Mi[2] * B[0] + Mi[3] * B[2]),
        k * (Mi[2] * B[1] + Mi[3] * B[3]),
      ];
      const tr = (C[0] + C[3]) / 2;
      const disc = ((C[0] - C[3]) / 2) ** 2 + C[1] * C[2];
      const growth = disc < 0 ? Math.sqrt(-disc) : 0;
      const g = growthRate(p, k, l);
      expect(Math.abs(g.growth - growth)).toBeLessThan(1e-13);
      if (disc < 0) expect(rel(g.frequency, tr)).toBeLessThan(1e-12);
    }
  });

  it('finds the eigenvalues of a 2 × 2 complex matrix', () => {
    // A matrix with eigenvalues 1 + 2i and −0.5 + 0.25i: V diag(λ) V⁻¹ with V = [[1, 2], [1, −1]].
    const [a, b] = [
      [1, 2],
      [-0.5, 0.25],
    ];
    // V diag V⁻¹, V⁻¹ = (1/−3)[[−1, −2], [−1, 1]]
    const Vi = [1 / 3, 2 / 3, 1 / 3, -1 / 3];
    const cm = (x: number[], y: number[]) => [x[0] * y[0] - x[1] * y[1], x[0] * y[1] + x[1] * y[0]];
    const entry = (r: number, c: number) => {
      const V = [
        [1, 2],
        [1, -1],
      ];
      const t1 = cm([V[r][0], 0], cm(a, [Vi[c], 0]));
      const t2 = cm([V[r][1], 0], cm(b, [Vi[2 + c], 0]));
      return [t1[0] + t2[0], t1[1] + t2[1]];
    };
    const L = [...entry(0, 0), ...entry(0, 1), ...entry(1, 0), ...entry(1, 1)];
    const e = eigenvalues2x2(L);
    const pairs = [
      [e[0], e[1]],
      [e[2], e[3]],
    ].sort((x, y) => y[0] - x[0]);
    expect(pairs[0][0]).toBeCloseTo(1, 14);
    expect(pairs[0][1]).toBeCloseTo(2, 14);
    expect(pairs[1][0]).toBeCloseTo(-0.5, 14);
    expect(pairs[1][1]).toBeCloseTo(0.25, 14);
  });

  // Equal layers, β = 0 [published: Phillips, Tellus 6, 273 (1954) [memory for pages]; Pedlosky 1987
  // §7.11; Vallis 2017, baroclinic-instability chapter]: σ = (kΔU/2)((k_d² − K²)/(k_d² + K²))^½ at l = 0,
  // maximum (√2 − 1)(ΔU/2)k_d at k = (√2 − 1)^½ k_d. Worked [derived]: k_d = 1, ΔU = 1 →
  // σ_max = 0.207107 at k = 0.64359.
  it('gives the equal-layer growth rate without β, and its maximum', () => {
    const p: PhillipsProblem = { kd: 1.7, depthRatio: 1, beta: 0, shear: 0.8 };
    for (const k of [0.2, 0.9, 1.5, 1.69]) {
      const K2 = k * k;
      const expected = ((k * 0.8) / 2) * Math.sqrt((1.7 ** 2 - K2) / (1.7 ** 2 + K2));
      expect(rel(growthRate(p, k, 0).growth, expected)).toBeLessThan(1e-12);
    }
    const worked = mostUnstable({ kd: 1, depthRatio: 1, beta: 0, shear: 1 });
    expectQuoted(worked.growth, '0.207107');
    expectQuoted(worked.k, '0.64359');
    expect(rel(worked.growth, (Math.SQRT2 - 1) / 2)).toBeLessThan(1e-12);
    expect(rel(worked.k, Math.sqrt(Math.SQRT2 - 1))).toBeLessThan(1e-6);
  });

  // The short-wave cutoff, equal layers, β = 0 [published, same sources]: no growth for K > k_d, in
  // every direction; growth for every K < k_d with k ≠ 0.
  it('cuts off growth at K = k_d (equal layers, β = 0)', () => {
    const p: PhillipsProblem = { kd: 3, depthRatio: 1, beta: 0, shear: 0.7 };
    for (const angle of [0, 0.3, 0.9, 1.4]) {
      const kx = Math.cos(angle);
      const ly = Math.sin(angle);
      expect(growthRate(p, 3.001 * kx, 3.001 * ly).growth).toBeLessThanOrEqual(0);
      expect(growthRate(p, 6 * kx, 6 * ly).growth).toBeLessThanOrEqual(0);
      expect(growthRate(p, 2.999 * kx, 2.999 * ly).growth).toBeGreaterThan(0);
      expect(growthRate(p, 0.5 * kx, 0.5 * ly).growth).toBeGreaterThan(0);
    }
  });

  // Equal layers with β [published: Phillips 1954; Pedlosky 1987 §7.11]: instability needs
  // ΔU > 2β/k_d². Worked [derived]: k_d = 1, δ = 1, β = 0.25 → no growth at ΔU = 0.50, growth 0.0176
  // at ΔU = 0.51; at ΔU = 1, σ_max = 0.167704 at k = 0.7337 (l = 0).
  it('needs ΔU > 2β/k_d² with equal layers, and gives the worked growth rates', () => {
    expect(criticalShear(1, 1, 0.25)).toBe(0.5);
    expect(criticalShear(2.5, 1, 0.3)).toBeCloseTo((2 * 0.3) / 2.5 ** 2, 15);
    const stable = { kd: 1, depthRatio: 1, beta: 0.25, shear: 0.5 };
    expect(largestGrowth(stable, 2)).toBeLessThan(1e-7);
    expectQuoted(mostUnstable({ ...stable, shear: 0.51 }).growth, '0.0176');
    const at1 = mostUnstable({ ...stable, shear: 1 });
    expectQuoted(at1.growth, '0.167704');
    expectQuoted(at1.k, '0.7337');
  });

  // Unequal layers, worked [derived]: k_d = 2, δ = 0.25, β = 0.1, ΔU = 1 → σ_max = 0.304372 at
  // k = 1.1814 (l = 0).
  it('gives the worked growth rate of unequal layers', () => {
    const m = mostUnstable({ kd: 2, depthRatio: 0.25, beta: 0.1, shear: 1 });
    expectQuoted(m.growth, '0.304372');
    expectQuoted(m.k, '1.1814');
  });

  // The threshold β/F₂ for unequal layers [derived: the Charney–Stern condition in layer form, Q₂
  // must change sign; that it is also sufficient is what this test checks]. Equal layers: 2β/k_d².
  for (const depthRatio of [0.25, 1, 3]) {
    it(`has its critical shear at β/F₂ (δ = ${depthRatio})`, () => {
      const c = criticalShear(2, depthRatio, 0.1);
      const p = { kd: 2, depthRatio, beta: 0.1 };
      expect(largestGrowth({ ...p, shear: 0.999 * c }, 6, 120)).toBeLessThan(1e-9);
      expect(largestGrowth({ ...p, shear: 1.02 * c }, 6, 120)).toBeGreaterThan(1e-4);
    });
  }

  it('moves the frequency, not the growth, with a barotropic flow; drag and hyperviscosity damp', () => {
    const p: PhillipsProblem = { kd: 2, depthRatio: 0.5, beta: 0.2, shear: 1 };
    const a = growthRate(p, 1.3, 0.4);
    const b = growthRate({ ...p, barotropicFlow: 0.7 }, 1.3, 0.4);
    expect(Math.abs(a.growth - b.growth)).toBeLessThan(1e-14);
    expect(b.frequency - a.frequency).toBeCloseTo(1.3 * 0.7, 13);
    expect(growthRate({ ...p, nu: 0.01, order: 2 }, 1.3, 0.4).growth).toBeCloseTo(
      a.growth - 0.01 * (1.3 ** 2 + 0.4 ** 2) ** 2,
      13,
    );
    expect(growthRate({ ...p, mu: 0.1 }, 1.3, 0.4).growth).toBeLessThan(a.growth);
    const L = linearMatrix({ ...p, mu: 0.1 }, 1.3, 0.4);
    expect(L[4]).toBeLessThan(0); // drag enters through the lower layer's row only
    expect(Math.abs(L[0]) + Math.abs(L[2])).toBe(0);
  });
});
