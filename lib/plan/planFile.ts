import * as v from 'valibot';
import { InputError, isInputError } from '../inputError';
import { PlanInputSchema, validatePlanInput, type PlanInput } from './planInput';

/**
 * The plan file: a plan input as versioned JSON, to share with collaborators and to load into
 * `stria plan`. Layout (version 1):
 *   { "format": "stria-plan", "version": 1, "savedAt": "<ISO 8601, optional>", "input": { …PlanInput } }
 * The input is stored exactly as entered (units, kinds and values), never the derived numbers, so a
 * file means the same thing to every later version that reads it. A reader refuses versions it does
 * not know instead of guessing.
 */
export const PLAN_FILE_FORMAT = 'stria-plan';
export const PLAN_FILE_VERSION = 1;

export interface PlanFile {
  format: typeof PLAN_FILE_FORMAT;
  version: typeof PLAN_FILE_VERSION;
  savedAt?: string;
  input: PlanInput;
}

/** The valibot schema of a version-1 plan file. */
export const PlanFileSchema = v.strictObject({
  format: v.literal(PLAN_FILE_FORMAT),
  version: v.literal(PLAN_FILE_VERSION),
  savedAt: v.optional(v.pipe(v.string(), v.isoTimestamp('an ISO 8601 timestamp'))),
  input: PlanInputSchema,
});

/** A plan file for a (validated) input; `savedAt` an ISO 8601 timestamp if wanted. */
export function planFile(input: PlanInput, savedAt?: string): PlanFile {
  validatePlanInput(input);
  return savedAt === undefined
    ? { format: PLAN_FILE_FORMAT, version: PLAN_FILE_VERSION, input }
    : { format: PLAN_FILE_FORMAT, version: PLAN_FILE_VERSION, savedAt, input };
}

/** The plan file as JSON text (two-space indent, trailing newline). */
export function serializePlanFile(input: PlanInput, savedAt?: string): string {
  return JSON.stringify(planFile(input, savedAt), null, 2) + '\n';
}

/**
 * Read a plan file from JSON text (or an already parsed value). Throws an InputError of source 'plan
 * file' whose message says why: not JSON, not a Stria plan file, an unknown version, or an invalid
 * input (naming the field, value and range).
 */
export function parsePlanFile(source: string | unknown): PlanFile {
  let data: unknown = source;
  if (typeof source === 'string') {
    try {
      data = JSON.parse(source);
    } catch (e) {
      throw new InputError(
        'plan file',
        '(file)',
        `not a plan file: the text is not JSON (${e instanceof Error ? e.message : String(e)})`,
      );
    }
  }
  if (typeof data !== 'object' || data === null || Array.isArray(data))
    throw new InputError('plan file', '(file)', 'not a plan file: expected a JSON object');
  const rec = data as Record<string, unknown>;
  if (rec.format !== PLAN_FILE_FORMAT)
    throw new InputError(
      'plan file',
      'format',
      `not a Stria plan file: format is ${JSON.stringify(rec.format)}, expected "${PLAN_FILE_FORMAT}"`,
    );
  if (rec.version !== PLAN_FILE_VERSION) {
    throw new InputError(
      'plan file',
      'version',
      `plan file version ${JSON.stringify(rec.version)} is not known to this Stria, which reads version ${PLAN_FILE_VERSION} only: open it with the Stria that wrote it, or re-save it there as version ${PLAN_FILE_VERSION}`,
    );
  }
  try {
    validatePlanInput(rec.input);
  } catch (e) {
    if (isInputError(e, 'plan input'))
      throw new InputError(
        'plan file',
        'input',
        `plan file input refused: ${e.issues.map((i) => `input.${i.field}: ${i.message}`).join('; ')}`,
      );
    throw e;
  }
  const parsed = v.safeParse(PlanFileSchema, data);
  if (!parsed.success) {
    const i = parsed.issues[0];
    const field = i.path?.map((p) => String(p.key)).join('.') ?? '(file)';
    throw new InputError('plan file', field, `plan file refused: ${field}: ${i.message}`);
  }
  return parsed.output as PlanFile;
}
