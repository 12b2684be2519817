import fc from 'fast-check';
import { isInputError } from '../../../lib/inputError';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { validateParams } from '../../../lib/model/validateParams';
import { estimateRunMemory } from '../../../lib/run/runMemory';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { stepsCleanly, trickyKey, weirdValue } from '../support/weird';

/**
 * validateParams: anything goes in (any JSON-like value, valid parameters with fields replaced by odd
 * values, field-by-field random records); a refusal is an InputError of source 'parameters' whose
 * every issue names a field that its message shows; an acceptance is a full, finite parameter set on
 * which a model builds and steps cleanly. Grids are kept to at most 256² so that accepted cases
 * stay quick.
 */
const KEYS = Object.keys(DEFAULT_PARAMS);
const SMALL = { nx: 32, ny: 32, kf: 8, dkf: 1.5, dt: 0.01 };

const size = fc.constantFrom(32, 64, 128, 256, 16, 31, 33, 48, 2048, 0, -32, 32.5);
const fieldValue: Record<string, fc.Arbitrary<unknown>> = {
  nx: size,
  ny: size,
  Lx: fc.oneof(fc.double({ min: 1e-3, max: 1e3, noNaN: true }), weirdValue),
  Ly: fc.oneof(fc.double({ min: 1e-3, max: 1e3, noNaN: true }), weirdValue),
  kf: fc.oneof(fc.double({ min: 0, max: 40, noNaN: true }), weirdValue),
  dkf: fc.oneof(fc.double({ min: 0, max: 10, noNaN: true }), weirdValue),
  nu_order: fc.oneof(fc.integer({ min: -2, max: 10 }), weirdValue),
  forcing: fc.oneof(fc.constantFrom('stochastic', 'steady', 'none', 'Steady', ''), weirdValue),
  scheme: fc.oneof(fc.constantFrom('ifrk4', 'rk4'), weirdValue),
  force_zonal: fc.oneof(fc.boolean(), weirdValue),
  seed: fc.oneof(fc.integer({ min: -1, max: 2 ** 32 }), weirdValue),
};
const anyField = (k: string) =>
  fieldValue[k] ??
  fc.oneof(fc.double({ min: 0, max: 1e3, noNaN: true }), fc.double({ min: 0, max: 1e12, noNaN: true }), weirdValue);

const nearValid = fc
  .tuple(fc.subarray(KEYS, { minLength: 1, maxLength: 3 }), fc.array(fc.tuple(trickyKey, weirdValue), { maxLength: 1 }))
  .chain(([keys, extra]) =>
    fc
      .tuple(...keys.map((k) => anyField(k).map((x) => [k, x] as const)))
      .map((entries) => ({ ...SMALL, ...Object.fromEntries(entries), ...Object.fromEntries(extra) })),
  );

const fieldwise = fc
  .record(Object.fromEntries(KEYS.map((k) => [k, anyField(k)])), { requiredKeys: [] })
  .map((r) => ({ ...SMALL, ...r }));

// In-range extremes, with the forcing off (no annulus rule) or on: where overflow would hide.
const extreme = fc.constantFrom(0, 5e-324, 1e-300, 1e-12, 1e-3, 1, 1e3, 1e6, 1e12);
const extremes = fc
  .record(
    {
      Lx: extreme,
      Ly: extreme,
      beta: extreme,
      kd: extreme,
      mu: extreme,
      nu: fc.constantFrom(0, 1e-300, 1, 1e12, 1e100, 1e300),
      nu_order: fc.integer({ min: 1, max: 8 }),
      eps: extreme,
      dt: extreme,
      cfl: fc.constantFrom(0, 1e-300, 0.5, 1.2),
      init_energy: extreme,
      forcing: fc.constantFrom('none', 'stochastic'),
    },
    { requiredKeys: [] },
  )
  .map((r) => ({ ...SMALL, ...r }));

export const boundary: Boundary<unknown> = {
  arbitrary: fc.oneof(
    { weight: 1, arbitrary: fc.anything({ withBigInt: true, withNullPrototype: true, withSparseArray: true }) },
    { weight: 4, arbitrary: nearValid },
    { weight: 3, arbitrary: fieldwise },
    { weight: 2, arbitrary: extremes },
  ),
  check(input) {
    let p;
    try {
      p = validateParams(input);
    } catch (e) {
      if (!isInputError(e, 'parameters'))
        throw new PropertyFailure(
          `validateParams threw ${e instanceof Error ? e.name : typeof e}, not an InputError of source 'parameters': ${String(e)}`,
        );
      if (e.issues.length === 0) throw new PropertyFailure('an InputError of source "parameters" with no issue');
      for (const i of e.issues) {
        if (typeof i.field !== 'string') throw new PropertyFailure(`an issue names no field: ${JSON.stringify(i)}`);
        // A key that is the empty text is named by its value, shown as "".
        if (!e.message.includes(i.field === '' ? '""' : i.field))
          throw new PropertyFailure(`the message does not name the field ${JSON.stringify(i.field)}: ${e.message}`);
      }
      return 'rejected';
    }
    if (Object.keys(p).sort().join() !== [...KEYS].sort().join())
      throw new PropertyFailure(`accepted parameters with keys ${Object.keys(p).join(', ')}`);
    for (const [k, x] of Object.entries(p))
      if (typeof x === 'number' && !Number.isFinite(x)) throw new PropertyFailure(`accepted ${k} = ${x}`);
    const mem = estimateRunMemory(p);
    if (!(mem.totalBytes > 0 && Number.isFinite(mem.totalBytes)))
      throw new PropertyFailure(`memory estimate ${mem.totalBytes} for accepted parameters`);
    return stepsCleanly(p);
  },
};
