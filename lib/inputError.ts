/**
 * The one error for refused input: parameters, plan inputs and plan files, run files and checkpoint
 * files, sweep specs, run lengths and saved measurement state. Every boundary that checks what a
 * person or a file gave throws it, naming what was being read (`source`) and each refused entry
 * (`issues`: its field, the value given where that helps, and why). Callers that turn one kind of
 * refusal into their own words test the source too (`isInputError(e, 'run file')`), so that a refusal
 * of another kind passes through them as before.
 *
 * The message keeps the form each boundary has always given, which the command line and the app
 * show as they are:
 *   parameters, plan input             field = value: why; field = value: why …
 *   run file, checkpoint file, sweep,  <source>: field: why
 *   parameter file
 *   state                              field: why
 *   run length, plan file              why
 */
export type InputSource =
  | 'parameters'
  | 'plan input'
  | 'plan file'
  | 'parameter file'
  | 'run file'
  | 'checkpoint file'
  | 'sweep spec'
  | 'run length'
  | 'state';

/** One refused entry: its field (a dotted path), the value given, and what is allowed. */
export interface InputIssue {
  field: string;
  value?: unknown;
  message: string;
}

export class InputError extends Error {
  readonly source: InputSource;
  readonly issues: InputIssue[];

  /** Every refused entry at once, or one entry by its field and reason. */
  constructor(source: InputSource, issues: InputIssue[]);
  constructor(source: InputSource, field: string, reason: string);
  constructor(source: InputSource, issuesOrField: InputIssue[] | string, reason = '') {
    const issues = typeof issuesOrField === 'string' ? [{ field: issuesOrField, message: reason }] : issuesOrField;
    super(MESSAGE[source](source, issues));
    this.name = 'InputError';
    this.source = source;
    this.issues = issues;
  }

  /** The first refused entry's field. */
  get field(): string {
    return this.issues[0]?.field ?? '';
  }

  /** Why the first refused entry was refused. */
  get reason(): string {
    return this.issues[0]?.message ?? '';
  }
}

/** Whether `e` is a refusal of input read from `source`. */
export function isInputError(e: unknown, source: InputSource): e is InputError {
  return e instanceof InputError && e.source === source;
}

type Format = (source: InputSource, issues: readonly InputIssue[]) => string;
const withValues: Format = (_, issues) => issues.map((i) => `${i.field} = ${show(i.value)}: ${i.message}`).join('; ');
const ofFile: Format = (source, issues) => `${source}: ${issues.map((i) => `${i.field}: ${i.message}`).join('; ')}`;
const atField: Format = (_, issues) => issues.map((i) => `${i.field}: ${i.message}`).join('; ');
const reasonOnly: Format = (_, issues) => issues.map((i) => i.message).join('; ');

const MESSAGE: Record<InputSource, Format> = {
  parameters: withValues,
  'plan input': withValues,
  'run file': ofFile,
  'parameter file': ofFile,
  'checkpoint file': ofFile,
  'sweep spec': ofFile,
  state: atField,
  'run length': reasonOnly,
  'plan file': reasonOnly,
};

/** A value as a message shows it: strings quoted, objects as (at most 60 characters of) JSON. */
function show(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number' || typeof value === 'boolean' || value === null || value === undefined)
    return String(value);
  try {
    return JSON.stringify(value).slice(0, 60);
  } catch {
    return typeof value;
  }
}
