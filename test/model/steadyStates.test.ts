import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { NonlinearTerm } from '../../lib/model/nonlinearTerm';
import { maxAbs, maxAbsDiff } from '../support/random';
import { QUIET, sampleGrid, spectrumOf } from '../support/modelFixtures';

function stateFromPsi(model: Model, psi: (x: number, y: number) => number): Float64Array {
  const p = model.params;
  const psiHat = spectrumOf(p, sampleGrid(p, psi));
  const q = new Float64Array(psiHat.length);
  for (let m = 0; m < model.grid.spectralSize; m++) {
    const K2 = model.grid.k2[m] + p.kd * p.kd;
    q[2 * m] = -K2 * psiHat[2 * m];
    q[2 * m + 1] = -K2 * psiHat[2 * m + 1];
  }
  return q;
}

// Any ψ with q a function of ψ is an exact steady solution of the unforced inviscid equation
// without β: J(ψ, q) = 0 [published] Vallis 2017, section on steady flows. A single Fourier mode, and
// any sum of modes on one |k| shell (q = −(k² + k_d²)ψ), are such states. All but the gravest are
// barotropically unstable, so round-off grows in time; the tendency itself must be round-off, and a
// short run must stay put. The gravest mode of the box is stable (no larger scale to feed), so it is
// run for long.
describe('steady states of the unforced, inviscid, β = 0 model', () => {
  it('keeps the gravest mode of the box unchanged over 2000 steps', () => {
    const model = new Model({ ...QUIET, nx: 32, ny: 32, dt: 0.02 });
    const q0 = stateFromPsi(model, (x) => 2 * Math.cos(x + 0.4));
    model.setState(q0);
    model.step(2000);
    expect(maxAbsDiff(model.qHat, q0)).toBeLessThan(1e-12 * maxAbs(q0));
  });

  const cases: Array<{ name: string; kd: number; psi: (x: number, y: number) => number }> = [
    { name: 'a single Fourier mode', kd: 0, psi: (x, y) => Math.cos(3 * x + 2 * y + 0.4) },
    { name: 'a single Fourier mode, k_d = 2', kd: 2, psi: (x, y) => Math.sin(x - 4 * y) },
    {
      name: 'four modes on the |k| = 5 shell',
      kd: 0.5,
      psi: (x, y) =>
        Math.cos(5 * x) + 0.7 * Math.sin(3 * x + 4 * y) - 0.4 * Math.cos(4 * x - 3 * y + 1) + 0.2 * Math.sin(5 * y),
    },
  ];
  for (const c of cases) {
    it(`has zero tendency for ${c.name} and keeps it over a short run`, () => {
      const model = new Model({ ...QUIET, nx: 64, ny: 64, kd: c.kd, dt: 0.01 });
      const q0 = stateFromPsi(model, c.psi);
      model.setState(q0);
      model.step(1);
      // The tendency: products of size |u|·|∇q| ~ 1e2 here cancel to a few ulps.
      const n = new NonlinearTerm(model.grid, model.linear, model.transform);
      const out = new Float64Array(q0.length);
      n.evaluate(q0, out);
      expect(maxAbs(out)).toBeLessThan(1e-13 * maxAbs(q0) * maxAbs(model.field('u')) * 10);
      model.step(49);
      expect(maxAbsDiff(model.qHat, q0)).toBeLessThan(1e-12 * maxAbs(q0));
      expect(Math.abs(model.report.energy.transfer)).toBeLessThan(1e-14 * model.report.energy.value);
    });
  }

  it('is not trivially steady: two shells interact and change the state', () => {
    const model = new Model({ ...QUIET, nx: 64, ny: 64, dt: 0.01 });
    const q0 = stateFromPsi(model, (x, y) => Math.cos(3 * x + 2 * y) + Math.sin(x - y));
    model.setState(q0);
    model.step(100);
    expect(maxAbsDiff(model.qHat, q0)).toBeGreaterThan(1e-3 * maxAbs(q0));
  });
});
