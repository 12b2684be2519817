import { describe, expect, it } from 'vitest';
import type { GridFields } from '../../lib/analysis/snapshot';
import { createZonalMeans, ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import { maxAbs, maxAbsDiff } from '../support/random';
import { randomGridFields } from '../support/randomFields';

/** Round-off of sums of nx products followed by a length-ny transform pair, relative to their scale. */
const ROUND_OFF = 1e-13;

/** Fields of ψ = a cos(kx + ly + φ) + b sin(m y + χ), all exact, on an nx × ny grid. */
function planeWaveFields(
  nx: number,
  ny: number,
  Lx: number,
  Ly: number,
  kd: number,
): { f: GridFields; c: Record<string, number> } {
  const a = 0.7;
  const b = 1.3;
  const k = (2 * Math.PI * 2) / Lx;
  const l = (2 * Math.PI * 3) / Ly;
  const m = (2 * Math.PI * 1) / Ly;
  const [phi, chi] = [0.4, -1.1];
  const n = nx * ny;
  const f: GridFields = {
    nx,
    ny,
    Lx,
    Ly,
    u: new Float64Array(n),
    v: new Float64Array(n),
    q: new Float64Array(n),
    zeta: new Float64Array(n),
    psi: new Float64Array(n),
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const x = (i * Lx) / nx;
      const y = (j * Ly) / ny;
      const th = k * x + l * y + phi;
      const z = m * y + chi;
      const p = j * nx + i;
      f.psi[p] = a * Math.cos(th) + b * Math.sin(z);
      f.u[p] = a * l * Math.sin(th) - b * m * Math.cos(z);
      f.v[p] = -a * k * Math.sin(th);
      f.zeta[p] = -a * (k * k + l * l) * Math.cos(th) - b * m * m * Math.sin(z);
      f.q[p] = f.zeta[p] - kd * kd * f.psi[p];
    }
  }
  return { f, c: { a, b, k, l, m, chi } };
}

describe('zonal means and eddy fluxes', () => {
  it('gives the exact means and fluxes of a plane wave on a zonal flow', () => {
    const [nx, ny, Lx, Ly, kd, beta] = [32, 16, 3, 2, 1.5, 4];
    const { f, c } = planeWaveFields(nx, ny, Lx, Ly, kd);
    const plan = new ZonalMeanPlan(f, { beta });
    const z = plan.compute(f);
    const { a, b, k, l, m, chi } = c;
    // Each check relative to the size of its own terms.
    const sU = b * m;
    const sQ = b * (m * m + kd * kd) + beta * Ly;
    const sFlux = a * a * (k * k + l * l + kd * kd) * Math.max(k, l);
    for (let j = 0; j < ny; j++) {
      const y = (j * Ly) / ny;
      expect(Math.abs(z.ubar[j] + b * m * Math.cos(m * y + chi))).toBeLessThan(ROUND_OFF * sU);
      expect(Math.abs(z.psibar[j] - b * Math.sin(m * y + chi))).toBeLessThan(ROUND_OFF * b);
      const qb = -b * (m * m + kd * kd) * Math.sin(m * y + chi);
      expect(Math.abs(z.qbar[j] - qb)).toBeLessThan(ROUND_OFF * sQ);
      expect(Math.abs(z.qtot[j] - (qb + beta * y))).toBeLessThan(ROUND_OFF * sQ);
      expect(Math.abs(z.dqdy[j] - (beta - b * (m * m + kd * kd) * m * Math.cos(m * y + chi)))).toBeLessThan(
        ROUND_OFF * sQ * m,
      );
      // u′ = a l sin θ, v′ = −a k sin θ: u′v′ = −a²kl/2, EKE = a²(k² + l²)/4; a single wave carries no PV flux.
      expect(Math.abs(z.upvp[j] + (a * a * k * l) / 2)).toBeLessThan(ROUND_OFF * sFlux);
      expect(Math.abs(z.eke[j] - (a * a * (k * k + l * l)) / 4)).toBeLessThan(ROUND_OFF * sFlux);
      expect(Math.abs(z.vpqp[j])).toBeLessThan(ROUND_OFF * sFlux);
      expect(Math.abs(z.convUpvp[j])).toBeLessThan(ROUND_OFF * sFlux * l);
    }
  });

  it('reports the total PV de-periodised: q̄ + βy_j rises by βLy·(ny − 1)/ny across the grid', () => {
    const f = randomGridFields({ nx: 32, ny: 32, Lx: 2, Ly: 5, kd: 0, maxIx: 10, maxM: 10, seed: 3 });
    const plan = new ZonalMeanPlan(f, { beta: 2.5 });
    const z = plan.compute(f);
    for (let j = 0; j < 32; j++) expect(z.qtot[j] - z.qbar[j]).toBeCloseTo((2.5 * j * 5) / 32, 13);
  });

  // Taylor identity [published] Taylor, Phil. Trans. R. Soc. A 215, 1 (1915); Vallis 2017,
  // wave–mean-flow chapter (CHECKS): v′q′ = −∂y(u′v′), also with the k_d² term, to round-off on any
  // periodic field. For q = ∇²ψ − k_d²ψ: v′q′ = ψ′_x ψ′_xx + ψ′_x ψ′_yy − k_d² ψ′_x ψ′, whose zonal
  // means are 0, ∂y(ψ′_x ψ′_y) = −∂y(u′v′), and −k_d² ∂x(ψ′²/2) = 0 [derived] (docs/zonalMean.md).
  // On the grid this is exact when products are not aliased in y, i.e. fields with |m| < ny/4.
  for (const kd of [0, 4]) {
    it(`holds the Taylor identity v′q′ = −∂y(u′v′) to round-off (k_d = ${kd}, fields with |m| < ny/4)`, () => {
      const f = randomGridFields({ nx: 64, ny: 64, Lx: 2 * Math.PI, Ly: 3, kd, maxIx: 21, maxM: 15, seed: 11 + kd });
      const plan = new ZonalMeanPlan(f, { beta: 7 });
      const z = plan.compute(f);
      const scale = maxAbs(z.vpqp);
      expect(scale).toBeGreaterThan(1e-3); // a real flux to compare
      expect(maxAbsDiff(z.vpqp, z.convUpvp)).toBeLessThan(ROUND_OFF * scale);
    });
  }

  it('has zero zonal-mean v′ψ′ and v′ζ′ = v′q′ with k_d > 0 (the k_d² term drops out)', () => {
    const f = randomGridFields({ nx: 64, ny: 32, Lx: 4, Ly: 3, kd: 3, maxIx: 21, maxM: 7, seed: 5 });
    const plan = new ZonalMeanPlan(f, { beta: 0 });
    const withQ = plan.compute(f);
    const withZeta = plan.compute({ ...f, q: f.zeta }, createZonalMeans(32));
    const withPsi = plan.compute({ ...f, q: f.psi }, createZonalMeans(32));
    expect(maxAbsDiff(withQ.vpqp, withZeta.vpqp)).toBeLessThan(ROUND_OFF * maxAbs(withQ.vpqp));
    expect(maxAbs(withPsi.vpqp)).toBeLessThan(ROUND_OFF * maxAbs(f.v) * maxAbs(f.psi));
  });

  it('on a 2/3-dealiased state the identity holds in the kept band, and fails by aliasing without it', () => {
    const spec = { nx: 64, ny: 64, Lx: 2 * Math.PI, Ly: 2 * Math.PI, kd: 1, maxIx: 21, maxM: 21, seed: 21 };
    const f = randomGridFields(spec);
    const banded = new ZonalMeanPlan(f, { beta: 1, band: 21 }).compute(f);
    expect(maxAbsDiff(banded.vpqp, banded.convUpvp)).toBeLessThan(ROUND_OFF * maxAbs(banded.vpqp));
    // Products of |m| ≤ 21 reach |m| = 42 > ny/2: aliased back onto 22..32, where the two sides differ.
    const full = new ZonalMeanPlan(f, { beta: 1 }).compute(f);
    expect(maxAbsDiff(full.vpqp, full.convUpvp)).toBeGreaterThan(1e-3 * maxAbs(full.vpqp));
  });

  it('fills the given outputs without keeping state between calls', () => {
    const a = randomGridFields({ nx: 32, ny: 32, Lx: 1, Ly: 1, kd: 0, maxIx: 10, maxM: 7, seed: 1 });
    const b = randomGridFields({ nx: 32, ny: 32, Lx: 1, Ly: 1, kd: 0, maxIx: 10, maxM: 7, seed: 2 });
    const plan = new ZonalMeanPlan(a, { beta: 3 });
    const out = createZonalMeans(32);
    plan.compute(a, out);
    expect(plan.compute(b, out)).toBe(out);
    const fresh = plan.compute(b);
    for (const key of Object.keys(out) as Array<keyof typeof out>) expect(maxAbsDiff(out[key], fresh[key])).toBe(0);
  });

  it('refuses fields of another grid', () => {
    const f = randomGridFields({ nx: 32, ny: 32, Lx: 1, Ly: 1, kd: 0, maxIx: 10, maxM: 7, seed: 1 });
    const plan = new ZonalMeanPlan({ nx: 32, ny: 32, Lx: 1, Ly: 2 }, { beta: 0 });
    expect(() => plan.compute(f)).toThrow(RangeError);
  });
});
