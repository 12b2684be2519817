import { describe, expect, it } from 'vitest';
import { stateChecksum, textDigest } from '../../lib/io/digest';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { Grid } from '../../lib/model/grid';
import { RandomStream } from '../../lib/model/randomStream';
import { plainFloat64 } from '../../lib/model/sharedArena';
import { buildStepParts } from '../../lib/model/stepParts';
import { shareBound, slabRange, type PhasedStep, type StepTeam } from '../../lib/model/stepTeam';
import { validateParams } from '../../lib/model/validateParams';

/**
 * Every share of every phase done one after the other on this thread: what a team of `members`
 * threads computes, without the threads. Shares of a phase touch disjoint parts of the arrays, so
 * doing them in turn is doing them at once.
 */
class InTurnTeam implements StepTeam {
  constructor(
    private readonly step: PhasedStep,
    readonly members: number,
  ) {}
  run(phase: number): void {
    for (let m = this.members - 1; m >= 0; m--) this.step.runPhase(phase, m, this.members);
  }
}

/** The model's stepper, reached for the test (it is private: hosts give threads, not teams). */
function teamUp(model: Model, members: number): void {
  const stepper = (model as unknown as { stepper: PhasedStep & { team: StepTeam } }).stepper;
  stepper.team = new InTurnTeam(stepper, members);
}

function fingerprint(m: Model): string {
  return `${stateChecksum(m.qHat)} ${m.time} ${m.dt} ${textDigest(JSON.stringify(m.report))}`;
}

const CASES: { name: string; params: Partial<ModelParams>; steps: number }[] = [
  {
    name: 'one layer, 64 × 128, adaptive step',
    params: { nx: 64, ny: 128, Ly: 4 * Math.PI, kf: 12, dkf: 2, dt: 0.05, cfl: 0.8, init_energy: 0.5, nu: 1e-12 },
    steps: 60,
  },
  {
    name: 'one layer, 128 × 32, steady forcing',
    params: { nx: 128, ny: 32, Ly: Math.PI / 2, forcing: 'steady', kf: 8, dkf: 3, mu: 0.1, eps: 0.1, dt: 0.01, cfl: 0 },
    steps: 30,
  },
  {
    name: 'two layers, 32 × 64, adaptive step',
    params: { layers: 2, nx: 32, ny: 64, Ly: 4 * Math.PI, kd: 6, shear: 1, kf: 6, dkf: 2, dt: 0.1, cfl: 0.6 },
    steps: 40,
  },
  {
    name: 'two layers, 64², steady forcing',
    params: { layers: 2, nx: 64, ny: 64, kd: 8, shear: 1.5, depth_ratio: 0.5, forcing: 'steady', kf: 8, mu: 0.1 },
    steps: 30,
  },
];

// Same parameters + seed + steps → same bits, on any number of threads [practice: the project's
// reproducibility rule; docs/threads.md]. Here every partition a team of 1 to 9 threads would use,
// including shares left empty on a small grid.
describe('a step shared out gives the bits of one thread', () => {
  for (const c of CASES) {
    it(c.name, () => {
      const solo = new Model(c.params);
      solo.step(c.steps);
      const want = fingerprint(solo);
      for (const members of [2, 3, 5, 9]) {
        const m = new Model(c.params);
        teamUp(m, members);
        m.step(c.steps);
        expect(fingerprint(m), `${members} members`).toBe(want);
      }
    });
  }
});

// A step built for a team of P threads keeps each thread's share in slabs of its own
// (realTransform2D.ts, modeSlabs.ts); run by P members, by fewer (a team that lost helpers: the
// calling thread takes every slab) or by more, it gives the bits of the ordinary layout
// [practice: the project's reproducibility rule; docs/threads.md].
describe('a step cut into slabs gives the bits of one slab', () => {
  for (const c of CASES) {
    it(c.name, () => {
      const p = validateParams(c.params);
      const start = new Model(c.params).qHat;
      const run = (slabs: number, members: number): string => {
        const grid = new Grid(p);
        const { stepper } = buildStepParts(grid, p, new RandomStream(p.seed), plainFloat64, slabs);
        stepper.qHat.set(start);
        stepper.team = new InTurnTeam(stepper, members);
        for (let i = 0; i < c.steps; i++) stepper.step();
        return `${stateChecksum(stepper.qHat)} ${stepper.time} ${stepper.dt} ${textDigest(JSON.stringify(stepper.report))}`;
      };
      const want = run(1, 1);
      for (const [slabs, members] of [
        [2, 2],
        [3, 3],
        [5, 5],
        [2, 1],
        [3, 2],
        [4, 7],
      ]) {
        expect(run(slabs, members), `${slabs} slabs, ${members} members`).toBe(want);
      }
    });
  }
});

describe('shares', () => {
  it('every slab goes to exactly one member, in order, whatever the number of members', () => {
    const out = new Int32Array(2);
    for (let slabs = 1; slabs <= 9; slabs++)
      for (let members = 1; members <= 9; members++) {
        let next = 0;
        for (let m = 0; m < members; m++) {
          slabRange(m, members, slabs, out);
          expect(out[0]).toBe(next);
          expect(out[1]).toBeGreaterThanOrEqual(out[0]);
          next = out[1];
        }
        expect(next).toBe(slabs);
      }
  });

  it('tile the range, cut at multiples of the unit, empty only when there are too few units', () => {
    for (const [n, unit] of [
      [43, 4],
      [171, 4],
      [11, 4],
      [256, 4],
      [32, 2],
    ]) {
      for (let parts = 1; parts <= 12; parts++) {
        let prev = 0;
        for (let k = 0; k <= parts; k++) {
          const b = shareBound(n, k, parts, unit);
          expect(b).toBeGreaterThanOrEqual(prev);
          if (k > 0 && k < parts) expect(b % unit).toBe(0);
          if (Math.ceil(n / unit) >= parts && k > 0) expect(b).toBeGreaterThan(prev);
          prev = b;
        }
        expect(shareBound(n, 0, parts, unit)).toBe(0);
        expect(prev).toBe(n);
      }
    }
  });
});
