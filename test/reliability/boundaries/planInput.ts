import fc from 'fast-check';
import { expectClean, type Boundary } from '../support/boundary';
import { analysesCleanly, cleanPlanInputError, PLAN_SEEDS, validatePlanInput } from '../support/planChecks';
import { applyEdits, editsArbitrary, weirdValue } from '../support/weird';

/**
 * validatePlanInput then analysePlan: the presets and a plan of the tests' own with JSON edits,
 * plans built part by part from random kinds and values, and any value. A refusal is an InputError
 * of source 'plan input' whose issues' fields its message names; an accepted plan is analysed
 * without error or NaN, and its matched run's parameters are accepted by the model.
 */
/** The parts of a plan input: with `odd`, mostly values of the right kind and now and then an odd one. */
function parts(odd: boolean) {
  const mostly = <T>(a: fc.Arbitrary<T>): fc.Arbitrary<unknown> =>
    odd ? fc.oneof({ weight: 8, arbitrary: a }, { weight: 1, arbitrary: weirdValue }) : a;
  const positive = mostly(
    fc.oneof(fc.double({ min: 1e-12, max: 1e12, noNaN: true }), fc.double({ min: 1e-3, max: 1e3, noNaN: true })),
  );
  return {
    units: mostly(fc.constantFrom('physical', 'model')),
    rotation: mostly(
      fc.oneof(
        fc.record({
          kind: fc.constant('planet'),
          planet: mostly(fc.constantFrom('earth', 'jupiter')),
          latitudeDeg: mostly(fc.double({ min: -90, max: 90 })),
        }),
        fc.record(
          { kind: fc.constant('beta'), beta: positive, f: mostly(fc.double({ min: -1e3, max: 1e3, noNaN: true })) },
          { requiredKeys: ['kind', 'beta'] },
        ),
      ),
    ),
    deformation: mostly(
      fc.oneof(
        fc.constant({ kind: 'none' }),
        fc.record({ kind: fc.constant('radius'), Ld: positive }),
        fc.record({ kind: fc.constant('layer'), H: positive, gPrime: positive }),
      ),
    ),
    drive: mostly(
      fc.oneof(
        fc.record({ kind: fc.constant('injection'), eps: positive }),
        fc.record({ kind: fc.constant('velocity'), U: positive }),
      ),
    ),
    dragTime: positive,
    forcing: mostly(fc.record({ wavelength: positive, halfWidth: mostly(fc.double({ min: 0, max: 1 })) })),
    domain: mostly(fc.record({ Lx: positive, Ly: positive })),
    grid: mostly(
      fc.oneof(
        fc.record({
          kind: fc.constant('points'),
          nx: fc.constantFrom(32, 64, 128, 512, 65536, 131072, 48, 0),
          ny: fc.constantFrom(32, 64, 256, 65536, 100),
        }),
        fc.record({ kind: fc.constant('spacing'), dx: positive, dy: positive }),
      ),
    ),
    hyperviscosity: mostly(fc.record({ order: mostly(fc.integer({ min: 0, max: 9 })), gridDampingTime: positive })),
    runLength: positive,
    cfl: mostly(fc.double({ min: 0, max: 2 })),
    rhines: mostly(fc.constantFrom('kR', 'sqrtUbeta', 'nope')),
  };
}
const built = (odd: boolean) =>
  fc
    .tuple(fc.constantFrom(...PLAN_SEEDS), fc.record(parts(odd), { requiredKeys: [] }))
    .map(([seed, p]) => ({ ...(seed as object), ...p }));

export const boundary: Boundary<unknown> = {
  arbitrary: fc.oneof(
    {
      weight: 3,
      arbitrary: fc.tuple(fc.constantFrom(...PLAN_SEEDS), editsArbitrary(2)).map(([s, e]) => applyEdits(s, e)),
    },
    { weight: 3, arbitrary: built(true) },
    { weight: 2, arbitrary: built(false) },
    { weight: 1, arbitrary: fc.anything() },
  ),
  check(input) {
    const r = expectClean(() => validatePlanInput(input), cleanPlanInputError);
    return r.ok ? analysesCleanly(input) : 'rejected';
  },
};
