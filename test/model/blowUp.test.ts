import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { BlowUpError, CFL_LIMIT } from '../../lib/model/stepper';
import { QUIET, randomKeptState } from '../support/modelFixtures';

// DESIGN: non-finite values or a CFL number beyond the stable range stop the run with a report.
describe('blow-up guard', () => {
  it('refuses a step above the CFL limit, with a report, leaving the state unchanged', () => {
    const m = new Model({ ...QUIET, nx: 32, ny: 32, dt: 1 });
    m.setState(randomKeptState(m, 1, 3));
    const before = m.qHat.slice();
    let err: unknown;
    try {
      m.step();
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(BlowUpError);
    const r = (err as BlowUpError).report;
    expect(r.cfl).toBeGreaterThan(CFL_LIMIT);
    expect(r.steps).toBe(0);
    expect((err as Error).message).toMatch(/CFL number above 1\.5 .*dt = 1\.000.*max\|u\|/);
    expect(m.qHat).toEqual(before);
    expect(m.steps).toBe(0);
  });

  it('stops on a non-finite state instead of carrying NaN', () => {
    const m = new Model({ ...QUIET, nx: 32, ny: 32, dt: 0.01 });
    const q = randomKeptState(m, 1, 1);
    q[2 * (3 * m.grid.nkx + 2)] = NaN;
    m.setState(q);
    expect(() => m.step()).toThrow(BlowUpError);
    expect(() => m.step()).toThrow(/non-finite/);
  });
});

describe('step collapse guard', () => {
  it('refuses a step too small to advance the clock, keeping the step in use', () => {
    // A state so fast that the CFL target asks for a step 2^40 below the largest one.
    const m = new Model({ ...QUIET, nx: 32, ny: 32, dt: 0.01, cfl: 0.5 });
    m.setState(randomKeptState(m, 1, 1e14));
    expect(() => m.step()).toThrow(/time step collapsed/);
    expect(m.dt).toBe(0.01);
    expect(m.steps).toBe(0);
  });

  it('after a non-finite velocity the model steps again once the state is good', () => {
    const m = new Model({ ...QUIET, nx: 32, ny: 32, dt: 0.01, cfl: 0.5 });
    const good = randomKeptState(m, 1, 1);
    const bad = good.slice();
    bad[2 * (3 * m.grid.nkx + 2)] = NaN;
    m.setState(bad);
    expect(() => m.step()).toThrow(/non-finite/);
    m.setState(good);
    const r = m.step();
    expect(Number.isFinite(r.dt) && r.dt > 0).toBe(true);
    expect(m.steps).toBe(1);
  });
});
