import { describe, expect, it } from 'vitest';
import { isInputError } from '../../lib/inputError';
import { stateChecksum } from '../../lib/io/digest';
import { LAYER_VIEWS } from '../../lib/model/layerFields';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { BlowUpError, CFL_LIMIT } from '../../lib/model/stepper';
import { validateParams } from '../../lib/model/validateParams';
import { maxAbs, maxAbsDiff } from '../support/random';
import { randomTwoLayerState } from '../support/twoLayerFixtures';

/** A forced, sheared two-layer flow of the test's own at 64². */
const TWO: Partial<ModelParams> = {
  layers: 2,
  nx: 64,
  ny: 64,
  kd: 6,
  depth_ratio: 0.5,
  beta: 1,
  shear: 0.5,
  mu: 0.1,
  nu: 1e-9,
  nu_order: 4,
  kf: 12,
  dkf: 2,
  eps: 0.02,
  dt: 0.05,
  init_energy: 0.01,
};

function refusal(input: Record<string, unknown>): string {
  try {
    validateParams(input);
  } catch (e) {
    if (isInputError(e, 'parameters')) return e.message;
    throw e;
  }
  return '';
}

// Reproducibility and checkpoints [practice: the project's rule, DESIGN and DEVELOPERS.md]: same
// parameters + seed + steps → same bits; a checkpoint resumes bit for bit.
describe('the two-layer model', () => {
  for (const cfl of [0, 0.5]) {
    it(`gives the same bits for the same parameters and seed, and resumes bit for bit (cfl = ${cfl})`, () => {
      const a = new Model({ ...TWO, cfl });
      const b = new Model({ ...TWO, cfl });
      a.step(40);
      b.step(40);
      expect(stateChecksum(a.qHat)).toBe(stateChecksum(b.qHat));
      expect(a.qHat.length).toBe(4 * a.grid.spectralSize);
      const c = new Model({ ...TWO, cfl, seed: 2 });
      c.step(40);
      expect(stateChecksum(c.qHat)).not.toBe(stateChecksum(a.qHat));
      const cp = a.checkpoint();
      expect(cp.qHat.length).toBe(a.qHat.length);
      a.step(60);
      const resumed = Model.restore(structuredClone(cp));
      expect(resumed.layers).toBe(2);
      resumed.step(60);
      expect(stateChecksum(resumed.qHat)).toBe(stateChecksum(a.qHat));
      expect(resumed.time).toBe(a.time);
      expect(resumed.dt).toBe(a.dt);
      expect(JSON.stringify(resumed.report)).toBe(JSON.stringify(a.report));
    });
  }

  it('starts from a random state with the energy asked for, with barotropic and baroclinic parts', () => {
    const m = new Model({ ...TWO, forcing: 'none', init_energy: 0.02 });
    const r = m.step(0);
    expect(r).toBe(m.report);
    m.step();
    expect(m.report.energy.value).toBeCloseTo(0.02, 14);
    expect(m.report.layers!.potential).toBeGreaterThan(0.05 * m.report.energy.value);
  });

  it('adapts its step to the imposed flow as well as to the eddies', () => {
    // At rest the eddies are still, but the imposed flows move: U₁ = h₂·shear, U₂ = −h₁·shear.
    const m = new Model({ ...TWO, init_energy: 0, forcing: 'none', shear: 40, cfl: 0.5, dt: 1 });
    m.setState(randomTwoLayerState(m.grid, 1, 1e-12));
    const r = m.step();
    const U1 = 40 / 1.5;
    expect(r.cfl).toBeLessThanOrEqual(0.5);
    expect(r.dt * (U1 / m.grid.dx)).toBeLessThanOrEqual(0.5);
    expect(r.dt * (U1 / m.grid.dx)).toBeGreaterThan(0.5 * 2 ** -0.25);
  });

  // Blow-up refusal (DESIGN): a CFL number beyond the limit or a non-finite state stops the step,
  // leaving the state as it was.
  it('refuses a step above the CFL limit or into a non-finite state, leaving the state unchanged', () => {
    const m = new Model({ ...TWO, init_energy: 0, forcing: 'none', dt: 1, cfl: 0 });
    m.setState(randomTwoLayerState(m.grid, 2, 30));
    const before = m.qHat.slice();
    expect(() => m.step()).toThrow(BlowUpError);
    try {
      m.step();
    } catch (e) {
      expect((e as BlowUpError).report.cfl).toBeGreaterThan(CFL_LIMIT);
    }
    expect(m.qHat).toEqual(before);
    expect(m.steps).toBe(0);
    const q = randomTwoLayerState(m.grid, 2, 1e-3);
    q[2 * m.grid.spectralSize + 2 * (3 * m.grid.nkx + 2)] = NaN; // lower layer
    m.setState(q);
    expect(() => m.step()).toThrow(/non-finite/);
  });

  // Validation at the boundary (DESIGN): each refusal names the field, the value and the range.
  it('validates the two-layer keys, naming the field and the range', () => {
    expect(refusal({ layers: 2, kd: 0 })).toMatch(/kd = 0: two layers need a deformation wavenumber k_d > 0/);
    expect(refusal({ layers: 3 })).toMatch(/layers = 3: must be 1 or 2/);
    expect(refusal({ layers: 1, shear: 0.5 })).toMatch(/shear = 0\.5: applies to two layers only/);
    expect(refusal({ depth_ratio: 2 })).toMatch(/depth_ratio = 2: applies to two layers only/);
    expect(refusal({ layers: 2, kd: 1, depth_ratio: 0 })).toMatch(/depth_ratio = 0: .*≥ 0\.001 and ≤ 1000/);
    expect(refusal({ layers: 2, kd: 1, shear: Infinity })).toMatch(/shear = Infinity/);
    expect(refusal({ layers: 2, kd: 1, shear: -0.3, depth_ratio: 0.2 })).toBe('');
  });

  it('shows each view of the state: layers, barotropic and baroclinic flows', () => {
    const m = new Model({ ...TWO, forcing: 'none' });
    m.setState(randomTwoLayerState(m.grid, 9));
    const { h1, h2 } = m.twoLayerLinear!.coefficients;
    const size = m.grid.size;
    for (const name of ['q', 'psi', 'zeta', 'u', 'v'] as const) {
      const [up, lo, bt, bc] = LAYER_VIEWS.map((v) => m.field(name, new Float64Array(size), v));
      const scale = Math.max(maxAbs(up), maxAbs(lo));
      expect(
        maxAbsDiff(
          bc,
          up.map((x, i) => x - lo[i]),
        ),
      ).toBeLessThan(1e-14 * scale);
      expect(
        maxAbsDiff(
          bt,
          up.map((x, i) => h1 * x + h2 * lo[i]),
        ),
      ).toBeLessThan(1e-14 * scale);
    }
    // The barotropic PV is the barotropic relative vorticity (F₁h₁ = F₂h₂).
    const zeta = m.field('zeta', undefined, 'barotropic');
    expect(maxAbsDiff(m.field('q'), zeta)).toBeLessThan(1e-13 * maxAbs(zeta));
    // q₁ = ∇²ψ₁ + F₁(ψ₂ − ψ₁) on the grid.
    const F1 = m.params.kd ** 2 * h2;
    const [q1, z1, p1, p2] = [
      m.field('q', undefined, 'upper'),
      m.field('zeta', undefined, 'upper'),
      m.field('psi', undefined, 'upper'),
      m.field('psi', undefined, 'lower'),
    ];
    expect(
      maxAbsDiff(
        q1,
        z1.map((z, i) => z + F1 * (p2[i] - p1[i])),
      ),
    ).toBeLessThan(1e-13 * maxAbs(q1));
  });

  it('reconfigures in place, across grids layer by layer, and afresh for a new number of layers', () => {
    const m = new Model({ ...TWO });
    m.step(10);
    const q = m.qHat.slice();
    const same = m.reconfigure({ shear: 0.8, depth_ratio: 2 });
    expect(same).toBe(m);
    expect(m.qHat).toEqual(q);
    expect(m.twoLayerLinear!.coefficients.h1).toBeCloseTo(2 / 3, 15);
    const finer = m.reconfigure({ nx: 128, ny: 128 });
    expect(finer.layers).toBe(2);
    expect(finer.steps).toBe(10);
    const n64 = 2 * m.grid.spectralSize;
    const n128 = 2 * finer.grid.spectralSize;
    // Mode (ix 3, jy 2) of the lower layer, carried over.
    const at = (n: number, nkx: number) => n + 2 * (2 * nkx + 3);
    expect(finer.qHat[at(n128, finer.grid.nkx)]).toBe(m.qHat[at(n64, m.grid.nkx)]);
    const one = m.reconfigure({ layers: 1, shear: 0, depth_ratio: 1 });
    expect(one).not.toBe(m);
    expect(one.layers).toBe(1);
    expect(one.steps).toBe(0);
    expect(one.qHat.length).toBe(2 * one.grid.spectralSize);
  });
});
