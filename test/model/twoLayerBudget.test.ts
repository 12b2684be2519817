import { describe, expect, it } from 'vitest';
import { Forcing } from '../../lib/model/forcing';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { TwoLayerNonlinearTerm } from '../../lib/model/twoLayerNonlinear';
import { linearMatrix } from '../../lib/plan/linearStability';

/** A baroclinically unstable two-layer flow of the test's own, 64², spun up to finite amplitude. */
const TURBULENT: Partial<ModelParams> = {
  layers: 2,
  nx: 64,
  ny: 64,
  kd: 6,
  depth_ratio: 0.6,
  beta: 1.5,
  shear: 0.6,
  mu: 0.1,
  nu: 1e-9,
  nu_order: 4,
  mu_ls: 0.05,
  k_ls: 1.5,
  kf: 12,
  dkf: 2,
  eps: 0.01,
  dt: 0.05,
  cfl: 0.6,
  init_energy: 0.002,
};

interface Independent {
  energyRate: number;
  enstrophyRate: number;
  energy: number;
  enstrophy: number;
  scaleE: number;
  scaleZ: number;
  /** The energy cycle's reservoirs and their rates: barotropic KE, baroclinic KE, APE. */
  keBt: number;
  keBc: number;
  ape: number;
  keBtRate: number;
  keBcRate: number;
  apeRate: number;
}

/**
 * dE/dt and dZ/dt of the present state from the equations alone: RHS_i = (L q̂)_i + N_i (+ F), L the
 * 2 × 2 matrix of lib/plan/linearStability.ts (written from the equations, not the model's operator),
 * N from a fresh TwoLayerNonlinearTerm, ψ̂ = M⁻¹q̂ by the test's own inversion; then
 * dE/dt = −Σ_i h_i⟨ψ_i RHS_i⟩, dZ/dt = Σ_i h_i⟨q_i RHS_i⟩ over the full plane [derived: docs/two-layer.md].
 */
function independentRates(m: Model, steady: Float64Array | null): Independent {
  const g = m.grid;
  const p = m.params;
  const n = 2 * g.spectralSize;
  const q = m.qHat;
  const nl = new TwoLayerNonlinearTerm(g, m.twoLayerLinear!);
  const N1 = new Float64Array(n);
  const N2 = new Float64Array(n);
  nl.evaluate(q.subarray(0, n), q.subarray(n), N1, N2);
  const d = p.depth_ratio;
  const [h1, h2] = [d / (1 + d), 1 / (1 + d)];
  const [F1, F2] = [(p.kd * p.kd) / (1 + d), (d * p.kd * p.kd) / (1 + d)];
  const problem = { kd: p.kd, depthRatio: d, beta: p.beta, shear: p.shear, mu: p.mu, nu: p.nu, order: p.nu_order };
  const out: Independent = {
    energyRate: 0,
    enstrophyRate: 0,
    energy: 0,
    enstrophy: 0,
    scaleE: 0,
    scaleZ: 0,
    keBt: 0,
    keBc: 0,
    ape: 0,
    keBtRate: 0,
    keBcRate: 0,
    apeRate: 0,
  };
  for (let jy = 0; jy < g.ny; jy++)
    for (let ix = 0; ix <= g.Kx; ix++) {
      if (!g.kept(ix, jy)) continue;
      const mi = jy * g.nkx + ix;
      const t = 2 * mi;
      const L = linearMatrix(problem, g.kx[ix], g.ky[jy]);
      const ls = p.mu_ls > 0 && Math.sqrt(g.k2[mi]) <= p.k_ls ? p.mu_ls : 0;
      const [ar, ai, br, bi] = [q[t], q[t + 1], q[n + t], q[n + t + 1]];
      const f = steady ? [steady[t], steady[t + 1]] : [0, 0];
      const r1r = L[0] * ar - L[1] * ai + L[2] * br - L[3] * bi - ls * ar + N1[t] + f[0];
      const r1i = L[0] * ai + L[1] * ar + L[2] * bi + L[3] * br - ls * ai + N1[t + 1] + f[1];
      const r2r = L[4] * ar - L[5] * ai + L[6] * br - L[7] * bi - ls * br + N2[t] + f[0];
      const r2i = L[4] * ai + L[5] * ar + L[6] * bi + L[7] * br - ls * bi + N2[t + 1] + f[1];
      const K2 = g.k2[mi];
      const det = K2 * (K2 + F1 + F2);
      const p1r = ((-K2 - F2) * ar - F1 * br) / det;
      const p1i = ((-K2 - F2) * ai - F1 * bi) / det;
      const p2r = (-F2 * ar + (-K2 - F1) * br) / det;
      const p2i = (-F2 * ai + (-K2 - F1) * bi) / det;
      const w = ix === 0 ? 1 : 2;
      const e = -w * (h1 * (p1r * r1r + p1i * r1i) + h2 * (p2r * r2r + p2i * r2i));
      const z = w * (h1 * (ar * r1r + ai * r1i) + h2 * (br * r2r + bi * r2i));
      out.energyRate += e;
      out.enstrophyRate += z;
      out.scaleE += Math.abs(e);
      out.scaleZ += Math.abs(z);
      out.energy -= 0.5 * w * (h1 * (p1r * ar + p1i * ai) + h2 * (p2r * br + p2i * bi));
      out.enstrophy += 0.5 * w * (h1 * (ar * ar + ai * ai) + h2 * (br * br + bi * bi));
      // The modes: ψ_bt = h₁ψ₁ + h₂ψ₂, τ = ψ₁ − ψ₂; E_bt = ½K²|ψ̂_bt|², E_bc = ½h₁h₂(K² + k_d²)|τ̂|², of
      // which K²/(K² + k_d²) is kinetic and k_d²/(K² + k_d²) potential [derived: docs/two-layer.md].
      const [br2, bi2] = [h1 * p1r + h2 * p2r, h1 * p1i + h2 * p2i];
      const [tr, ti] = [p1r - p2r, p1i - p2i];
      const kd2 = p.kd * p.kd;
      const dBt = -w * (br2 * (h1 * r1r + h2 * r2r) + bi2 * (h1 * r1i + h2 * r2i));
      const dBc = -w * h1 * h2 * (tr * (r1r - r2r) + ti * (r1i - r2i));
      out.keBt += 0.5 * w * K2 * (br2 * br2 + bi2 * bi2);
      out.keBc += 0.5 * w * h1 * h2 * K2 * (tr * tr + ti * ti);
      out.ape += 0.5 * w * h1 * h2 * kd2 * (tr * tr + ti * ti);
      out.keBtRate += dBt;
      out.keBcRate += (K2 / (K2 + kd2)) * dBc;
      out.apeRate += (kd2 / (K2 + kd2)) * dBc;
    }
  return out;
}

function gridMean(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s / a.length;
}

// The two-layer energy and enstrophy budgets [derived: docs/two-layer.md, from the layer equations of
// Phillips 1954 / Pedlosky 1987 §7.11 / Vallis 2017]: generation by the imposed shear (eddy heat flux
// times the shear) = dE/dt + drag + hyperviscous + large-scale losses − injection, closing every step
// to round-off.
describe('two-layer budgets', () => {
  for (const forcing of ['none', 'steady', 'stochastic'] as const) {
    it(`close every step to round-off and match the equations (forcing ${forcing})`, () => {
      const m = new Model({ ...TURBULENT, forcing });
      m.step(300); // finite amplitude: generation, drag and transfer all at work
      const steady =
        forcing === 'steady'
          ? new Forcing(m.grid, m.params, { invK2: m.twoLayerLinear!.invK2Barotropic }).steady
          : null;
      const upperV = new Float64Array(m.grid.size);
      const tau = new Float64Array(m.grid.size);
      for (let i = 0; i < 40; i++) {
        const ind = i % 8 === 0 ? independentRates(m, steady) : null;
        if (i % 8 === 0) {
          m.field('v', upperV, 'upper');
          m.field('psi', tau, 'baroclinic');
        }
        const r = m.step();
        const e = r.energy;
        const z = r.enstrophy;
        const loss = e.drag + e.hyper + e.largeScale + Math.abs(e.generation!) + e.injection;
        // The nonlinear transfer is the residual: zero to round-off, every step.
        expect(Math.abs(e.transfer)).toBeLessThan(1e-13 * loss);
        expect(Math.abs(z.transfer)).toBeLessThan(1e-13 * (z.hyper + Math.abs(z.drag) + Math.abs(z.generation!)));
        expect(e.tendency).toBe(e.injection + e.generation! - e.drag - e.hyper - e.largeScale + e.transfer);
        expect(r.kinetic + r.layers!.potential).toBeCloseTo(e.value, 14);
        expect(r.kinetic).toBe(r.layers!.kineticUpper + r.layers!.kineticLower);
        expect(e.generation).toBeGreaterThan(0); // the shear feeds the eddies
        if (ind) {
          expect(Math.abs(e.value / ind.energy - 1)).toBeLessThan(1e-12);
          expect(Math.abs(z.value / ind.enstrophy - 1)).toBeLessThan(1e-12);
          // Stochastic forcing: its ensemble-mean rate is not part of the deterministic right-hand side.
          const eInj = forcing === 'stochastic' ? e.injection : 0;
          const zInj = forcing === 'stochastic' ? z.injection : 0;
          expect(Math.abs(e.tendency - eInj - ind.energyRate)).toBeLessThan(1e-12 * ind.scaleE);
          expect(Math.abs(z.tendency - zInj - ind.enstrophyRate)).toBeLessThan(1e-12 * ind.scaleZ);
          // The heat flux on the grid: ⟨v₁ τ⟩, τ = ψ₁ − ψ₂, and the generation F₁h₁(U₁ − U₂)⟨vτ⟩.
          const heat = gridMean(upperV, tau);
          expect(Math.abs(r.layers!.heatFlux / heat - 1)).toBeLessThan(1e-11);
          const d = m.params.depth_ratio;
          const F1h1 = ((m.params.kd * m.params.kd) / (1 + d)) * (d / (1 + d));
          expect(Math.abs(e.generation! / (F1h1 * m.params.shear * heat) - 1)).toBeLessThan(1e-11);
        }
      }
    });
  }

  // The realized change over a step, (E(t + dt) − E(t))/dt with the random kick, is what the report
  // says, E from the state by the test's own inversion [derived]; and white-in-time forcing injects ε
  // into the two-layer energy in the ensemble mean [published: Novikov, Sov. Phys. JETP 20, 1290
  // (1965) [memory for page]]: here the mean of the realized injection over many steps, within 3
  // standard errors.
  it('reports the realized change of each step, and stochastic forcing injects ε on average', () => {
    const m = new Model({ ...TURBULENT, forcing: 'stochastic', init_energy: 0, eps: 0.05 });
    const injections: number[] = [];
    for (let i = 0; i < 400; i++) {
      const before = i % 50 === 0 ? independentRates(m, null).energy : NaN;
      const r = m.step();
      if (i % 50 === 0) {
        const after = independentRates(m, null).energy;
        expect(Math.abs(r.energy.realizedTendency - (after - before) / r.dt)).toBeLessThan(
          1e-9 * Math.abs(r.energy.realizedTendency) + 1e-15,
        );
      }
      injections.push(r.energy.realizedInjection);
      expect(r.energy.injection).toBeCloseTo(0.05, 12);
    }
    const mean = injections.reduce((s, x) => s + x, 0) / injections.length;
    const sd = Math.sqrt(injections.reduce((s, x) => s + (x - mean) ** 2, 0) / (injections.length - 1));
    expect(Math.abs(mean - 0.05)).toBeLessThan((3 * sd) / Math.sqrt(injections.length));
  });
});

// The energy cycle of the two layers [derived: docs/two-layer.md, "The energy cycle", from the layer
// equations of Pedlosky 1987 §7.11 and Vallis 2017]: mean-flow APE → eddy APE (generation) → eddy KE
// (conversion) → barotropic KE (transfer) → drag and hyperviscosity. Each reservoir's rate, from the
// right-hand side of the equations projected on the modes by the test's own inversion, equals the
// sum of the cycle's terms to round-off at every step; the parts of drag, hyper and large-scale drag
// add up to the budget's.
describe('two-layer energy cycle', () => {
  for (const forcing of ['none', 'steady', 'stochastic'] as const) {
    it(`closes per reservoir every step to round-off (forcing ${forcing})`, () => {
      const m = new Model({ ...TURBULENT, forcing });
      m.step(300);
      const steady =
        forcing === 'steady'
          ? new Forcing(m.grid, m.params, { invK2: m.twoLayerLinear!.invK2Barotropic }).steady
          : null;
      for (let i = 0; i < 24; i++) {
        const ind = independentRates(m, steady);
        const r = m.step();
        const e = r.energy;
        const c = r.layers!;
        const scale = ind.scaleE;
        const near = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThan(1e-12 * scale);
        near(c.kineticBarotropic, ind.keBt);
        near(c.kineticBaroclinic, ind.keBc);
        near(c.potential, ind.ape);
        expect(Math.abs(c.kineticBarotropic + c.kineticBaroclinic - r.kinetic)).toBeLessThan(1e-13 * r.kinetic);
        // The stochastic forcing's ensemble-mean rate is not in the deterministic right-hand side.
        const inj = forcing === 'stochastic' ? 0 : e.injection;
        near(e.generation! - c.conversion - c.hyperPotential - c.largeScalePotential, ind.apeRate);
        near(
          c.conversion -
            c.barotropicTransfer -
            c.dragBaroclinic -
            c.hyperBaroclinic -
            c.largeScaleBaroclinic +
            e.transfer,
          ind.keBcRate,
        );
        near(c.barotropicTransfer - c.dragBarotropic - c.hyperBarotropic - c.largeScaleBarotropic + inj, ind.keBtRate);
        near(c.dragBarotropic + c.dragBaroclinic, e.drag);
        near(c.hyperPotential + c.hyperBaroclinic + c.hyperBarotropic, e.hyper);
        near(c.largeScalePotential + c.largeScaleBaroclinic + c.largeScaleBarotropic, e.largeScale);
        // The cycle runs the textbook way in the equilibrated flow: the eddies turn APE into KE and
        // pass it to the barotropic mode, where the drag takes it [practice: a standard result of
        // two-layer baroclinic turbulence].
        expect(c.conversion).toBeGreaterThan(0);
        expect(c.barotropicTransfer).toBeGreaterThan(0);
      }
    });
  }
});
