import fc from 'fast-check';
import { isInputError } from '../../../lib/inputError';
import { decodeBase64, encodeBase64 } from '../../../lib/io/base64';
import { decodeRunFile, encodeRunFile } from '../../../lib/io/runFile';
import type { Checkpoint } from '../../../lib/model/checkpoint';
import { Model } from '../../../lib/model/model';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { applyEdits, editsArbitrary, stepsCleanly, textDamage, weirdValue } from '../support/weird';

/**
 * decodeRunFile: real run files (a few grids and forcings, part-way through a run) damaged as text,
 * edited as JSON, with flipped bits in the spectrum or a regenerated clock and random state, and
 * random texts. A refusal is an InputError of source 'run file' naming a field that its message
 * shows; an accepted file restores into a model that steps cleanly, and whose random stream still
 * draws (white forcing on).
 */
function saved(p: Record<string, unknown>, steps: number): string {
  const m = new Model(p);
  m.step(steps);
  return encodeRunFile(m.checkpoint(), new Date('2026-01-01T00:00:00Z'));
}

const FILES = [
  saved({ nx: 32, ny: 32, kf: 8, dkf: 1.5, dt: 0.01, init_energy: 1 }, 5),
  saved({ nx: 64, ny: 32, Lx: 2 * Math.PI, Ly: Math.PI, kf: 8, dkf: 2, dt: 0.01, cfl: 0 }, 3),
  saved({ nx: 32, ny: 32, kf: 6, dkf: 1, forcing: 'steady', mu: 0.1, dt: 0.02 }, 2),
];

const int32 = fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 });
const stateField = fc.record(
  {
    time: fc.oneof(fc.constantFrom(0, 1, 1e10, 1e15, 1e17, 1e300, -1, 5e-324), fc.double({ noNaN: true })),
    steps: fc.oneof(fc.constantFrom(0, 1, 2 ** 52, 2 ** 53, 2 ** 53 + 2, 2 ** 60, 1e300, -1, 0.5), fc.nat()),
    dt: fc.oneof(fc.constantFrom(1e-300, 1e-20, 0.01, 1e12), fc.double({ noNaN: true })),
    rng: fc.oneof(fc.tuple(int32, int32, int32, int32), fc.constant([0, 0, 0, 0]), fc.array(int32, { maxLength: 6 })),
  },
  { requiredKeys: [] },
);

function withState(text: string, s: Record<string, unknown>): string {
  const j = JSON.parse(text);
  Object.assign(j.state, s);
  return JSON.stringify(j);
}

function flipBits(text: string, flips: [number, number][]): string {
  const j = JSON.parse(text);
  const bytes = decodeBase64(j.state.qHat.data);
  for (const [i, bit] of flips) bytes[i % bytes.length] ^= 1 << bit;
  j.state.qHat.data = encodeBase64(bytes);
  return JSON.stringify(j);
}

const file = fc.constantFrom(...FILES);
const inputs: fc.Arbitrary<string> = fc.oneof(
  {
    weight: 1,
    arbitrary: fc.oneof(fc.string(), fc.json(), fc.constantFrom('', '{}', '[]', 'null', '{"format":"stria-run"}')),
  },
  {
    weight: 3,
    arbitrary: fc.tuple(file, editsArbitrary(3)).map(([t, e]) => JSON.stringify(applyEdits(JSON.parse(t), e))),
  },
  { weight: 2, arbitrary: file.chain((t) => textDamage(t)) },
  {
    weight: 2,
    arbitrary: fc
      .tuple(file, fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 7 })), { minLength: 1, maxLength: 4 }))
      .map(([t, f]) => flipBits(t, f)),
  },
  { weight: 2, arbitrary: fc.tuple(file, stateField).map(([t, s]) => withState(t, s)) },
  {
    weight: 1,
    arbitrary: fc
      .tuple(file, fc.constantFrom('time', 'steps', 'dt', 'rng', 'qHat'), weirdValue)
      .map(([t, k, x]) => withState(t, { [k]: x })),
  },
);

export const boundary: Boundary<string> = {
  arbitrary: inputs,
  check(text) {
    let cp: Checkpoint;
    try {
      cp = decodeRunFile(text);
    } catch (e) {
      if (!isInputError(e, 'run file'))
        throw new PropertyFailure(
          `decodeRunFile threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}, not an InputError of source 'run file'`,
        );
      if (!e.field || !e.message.includes(e.field))
        throw new PropertyFailure(`an InputError of source 'run file' names no field: ${e.message}`);
      return 'rejected';
    }
    let model: Model;
    try {
      model = Model.restore(cp);
    } catch (e) {
      throw new PropertyFailure(
        `accepted, but Model.restore threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`,
      );
    }
    const answer = stepsCleanly(cp.params, () => Model.restore(cp));
    const p = cp.params;
    if (answer === 'accepted' && p.forcing === 'stochastic' && p.eps >= 1e-100 && model.forcedModes > 0) {
      model.step();
      // A working stream injects about ε a step; a stuck one (all-zero state) only round-off.
      if (Math.abs(model.report.energy.realizedInjection) < 1e-9 * p.eps)
        throw new PropertyFailure(`accepted a random state [${cp.rng.join(', ')}] that draws no forcing at all`);
    }
    return answer;
  },
};
