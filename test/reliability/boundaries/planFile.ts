import fc from 'fast-check';
import { isInputError } from '../../../lib/inputError';
import { parsePlanFile, serializePlanFile } from '../../../lib/plan/planFile';
import type { PlanInput } from '../../../lib/plan/planInput';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { analysesCleanly, PLAN_SEEDS } from '../support/planChecks';
import { applyEdits, editsArbitrary, textDamage } from '../support/weird';

/**
 * parsePlanFile: plan files of the presets and of a plan of the tests' own, edited as JSON or
 * damaged as text, as text or as parsed values, and random texts. A refusal is an InputError of
 * source 'plan file' that says what is wrong (not JSON, not a plan file, the version, or the input
 * field); an accepted file is analysed like an accepted plan input.
 */
const FILES = PLAN_SEEDS.map((input) => serializePlanFile(input as PlanInput, '2026-01-01T00:00:00.000Z'));

export const boundary: Boundary<unknown> = {
  arbitrary: fc.oneof(
    { weight: 1, arbitrary: fc.oneof(fc.string(), fc.json(), fc.anything()) },
    {
      weight: 3,
      arbitrary: fc
        .tuple(fc.constantFrom(...FILES), editsArbitrary(2), fc.boolean())
        .map(([t, e, asText]) =>
          asText ? JSON.stringify(applyEdits(JSON.parse(t), e)) : applyEdits(JSON.parse(t), e),
        ),
    },
    { weight: 2, arbitrary: fc.constantFrom(...FILES).chain((t) => textDamage(t)) },
  ),
  check(input) {
    let file;
    try {
      file = parsePlanFile(input);
    } catch (e) {
      if (!isInputError(e, 'plan file'))
        throw new PropertyFailure(
          `parsePlanFile threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}, not an InputError of source 'plan file'`,
        );
      if (!/plan file/i.test(e.message))
        throw new PropertyFailure(`the refusal does not say what is wrong: ${e.message}`);
      if (/input refused: /.test(e.message) && !/input\.[^:]*: /.test(e.message))
        throw new PropertyFailure(`an input refusal names no field: ${e.message}`);
      return 'rejected';
    }
    return analysesCleanly(file.input);
  },
};
