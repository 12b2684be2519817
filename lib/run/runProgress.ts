import * as v from 'valibot';
import { InputError, isInputError } from '../inputError';
import { decodeRunFile, encodeRunFile } from '../io/runFile';
import type { Checkpoint } from '../model/checkpoint';
import type { ModelParams } from '../model/params';
import { validateParams } from '../model/validateParams';
import type { RetryRecord } from './blowUpRetry';
import type { MonitoredRunState, RunOrigin } from './monitoredRun';
import { runId } from './runId';
import type { RunPlan } from './runPlan';
import { stateFromJson, stateToJson } from './stateJson';
import type { CapturedState } from './dataState';
import { textDigest } from '../io/digest';
import { namedValues } from '../io/namedValues';

/**
 * The checkpoint file of `stria run --checkpoint`: a run file (lib/io/runFile.ts: parameters and
 * state, so `stria run FILE` continues it as any saved run) with one more top-level entry, "progress",
 * which run-file readers ignore and `stria run --resume` reads:
 *
 *   "progress": { "format": "stria-run-progress", "version": 1,
 *     "id": run id of the command's parameters and plan (lib/run/runId.ts),
 *     "params": the parameters as the command asked (before any retry halved dt),
 *     "plan": the resolved RunPlan, "origin": { "time", "steps" } where the run began,
 *     "retries": [RetryRecord…],
 *     "outputs": { "created_at", "command", "threads" (optional: of the run that began the files),
 *                  "snapshots": { "path", "every", "records" } | null,
 *                  "zonal": { "path", "records" } | null },
 *     "measurement": the MonitoredRunState as JSON (stateJson.ts) | null,
 *     "digest": textDigest (lib/io/digest.ts) of the entry's text without it, a newline, and the
 *               run file's text }
 *
 * Layout: line 1 is "{", line 2 is ` "progress": ` and the entry as compact JSON, then the run file
 * as encodeRunFile writes it without its opening brace. The digest makes a checkpoint damaged on the
 * disk (a flipped bit, a cut, a stray edit anywhere in it) a refused file rather than a resume from
 * a subtly different state; the run file's own checks then only see files written whole. `records`
 * counts the NetCDF records written when the checkpoint was taken, so a resumed run keeps exactly
 * those and rewrites the rest.
 */
export const PROGRESS_FORMAT = 'stria-run-progress';
export const PROGRESS_VERSION = 1;

export interface OutputProgress {
  created_at: string;
  command: string;
  /** Threads the run that began the NetCDF files stepped on (their stria_threads), when recorded. */
  threads?: number;
  snapshots: { path: string; every: number; records: number } | null;
  zonal: { path: string; records: number } | null;
}

export interface RunProgress {
  id: string;
  params: ModelParams;
  plan: RunPlan;
  origin: RunOrigin;
  retries: RetryRecord[];
  outputs: OutputProgress;
  measurement: MonitoredRunState | null;
}

const finite = v.pipe(v.number('must be a number'), v.finite('must be finite'));
const positive = v.pipe(finite, v.gtValue(0, 'must be > 0'));
const count = v.pipe(
  v.number('must be a number'),
  v.safeInteger('must be a whole number'),
  v.minValue(0, 'must be ≥ 0'),
);

const StopSchema = v.variant(
  'kind',
  [
    v.strictObject({ kind: v.literal('steps'), steps: v.pipe(count, v.minValue(1, 'must be ≥ 1')) }),
    v.strictObject({ kind: v.literal('until'), time: positive }),
    v.strictObject({ kind: v.literal('steady'), window: positive, tolerance: positive, maxTime: positive }),
  ],
  'must be { kind: "steps" | "until" | "steady", … }',
);

const ReportSchema = v.strictObject({
  time: v.nullable(v.number()),
  steps: v.nullable(v.number()),
  dt: v.nullable(v.number()),
  cfl: v.nullable(v.number()),
  max_u: v.nullable(v.number()),
  max_v: v.nullable(v.number()),
  reason: v.string('must be a text'),
});

const RetrySchema = v.strictObject({
  attempt: v.pipe(count, v.minValue(1, 'must be ≥ 1')),
  blow_up: ReportSchema,
  restarted_at: v.strictObject({ time: v.pipe(finite, v.minValue(0, 'must be ≥ 0')), steps: count }),
  dt: v.strictObject({ from: positive, to: positive }),
  cfl: v.strictObject({
    from: v.pipe(finite, v.minValue(0, 'must be ≥ 0')),
    to: v.pipe(finite, v.minValue(0, 'must be ≥ 0')),
  }),
});

const ProgressSchema = v.strictObject({
  format: v.literal(PROGRESS_FORMAT, `must be "${PROGRESS_FORMAT}"`),
  version: v.literal(
    PROGRESS_VERSION,
    `must be ${PROGRESS_VERSION}: this Stria reads run progress of version ${PROGRESS_VERSION}`,
  ),
  id: v.pipe(v.string('must be a text'), v.regex(/^r[0-9a-f]{16}$/, 'must be a run id such as r0123456789abcdef')),
  params: namedValues('must be an object of parameters'),
  plan: v.strictObject(
    { stop: StopSchema, average: positive, sampleEvery: positive },
    'must be a run plan { stop, average, sampleEvery }',
  ),
  origin: v.strictObject(
    { time: v.pipe(finite, v.minValue(0, 'must be ≥ 0')), steps: count },
    'must be { time, steps }',
  ),
  retries: v.array(RetrySchema, 'must be a list of retries'),
  outputs: v.strictObject({
    created_at: v.string('must be a text'),
    command: v.string('must be a text'),
    threads: v.optional(v.pipe(count, v.minValue(1, 'must be ≥ 1'))),
    snapshots: v.nullable(
      v.strictObject({
        path: v.string('must be a text'),
        every: v.pipe(count, v.minValue(1, 'must be ≥ 1')),
        records: count,
      }),
    ),
    zonal: v.nullable(v.strictObject({ path: v.string('must be a text'), records: count })),
  }),
  measurement: v.nullable(v.unknown()),
  digest: v.pipe(v.string('must be a text'), v.regex(/^[0-9a-f]{16}$/, 'must be 16 hex digits')),
});

/** The checkpoint file's text: the run file of `cp` with the progress entry first. */
export function encodeCheckpointFile(
  cp: Checkpoint,
  progress: RunProgress,
  saved: Date = new Date(),
  threads?: number,
): string {
  const runFile = encodeRunFile(cp, saved, threads);
  const entry = {
    format: PROGRESS_FORMAT,
    version: PROGRESS_VERSION,
    ...progress,
    measurement: progress.measurement ? stateToJson(progress.measurement as unknown as CapturedState) : null,
  };
  // The run file is one JSON object: put the entry first (a splice, not a second multi-megabyte encode).
  if (runFile[0] !== '{') throw new RangeError('encodeCheckpointFile: a run file is a JSON object');
  const head = JSON.stringify(entry);
  const sealed = `${head.slice(0, -1)},"digest":${JSON.stringify(textDigest(`${head}\n${runFile}`))}}`;
  return `{\n "progress": ${sealed},${runFile.slice(1)}`;
}

/**
 * Read a checkpoint file: the run file (a refusal of the run file becomes one of the checkpoint file,
 * with the same field) and its progress entry, checked field by field. Refusals are InputErrors of
 * source 'checkpoint file', their field the path of the entry ("progress.origin.time"). A run file without progress is refused
 * (it holds a state but not the run it belongs to: continue it with `stria run FILE`).
 */
export function decodeCheckpointFile(text: string): { checkpoint: Checkpoint; progress: RunProgress } {
  // Damage anywhere is caught here, before any part of the file is believed.
  const { entry, runFile } = sealedEntry(text);
  let checkpoint: Checkpoint;
  try {
    checkpoint = decodeRunFile(runFile);
  } catch (e) {
    if (isInputError(e, 'run file')) throw new InputError('checkpoint file', e.field, e.reason);
    throw e;
  }
  const parsed = v.safeParse(ProgressSchema, entry);
  if (!parsed.success) {
    const issue = parsed.issues[0];
    const path = issue.path?.map((p) => String(p.key)).join('.');
    const unknownKey = issue.kind === 'schema' && issue.type === 'strict_object' && issue.expected === 'never';
    throw new InputError(
      'checkpoint file',
      path ? `progress.${path}` : 'progress',
      unknownKey ? 'is not a field of the run progress' : issue.message,
    );
  }
  const p = parsed.output;
  let params: ModelParams;
  try {
    params = validateParams(p.params);
  } catch (e) {
    if (isInputError(e, 'parameters'))
      throw new InputError('checkpoint file', `progress.params.${e.issues[0].field}`, e.issues[0].message);
    throw e;
  }
  const plan = p.plan as RunPlan;
  if (runId(params, plan) !== p.id)
    throw new InputError('checkpoint file', 'progress.id', 'does not match the parameters and plan beside it');
  if (
    checkpoint.params.nx !== params.nx ||
    checkpoint.params.ny !== params.ny ||
    checkpoint.params.Lx !== params.Lx ||
    checkpoint.params.Ly !== params.Ly
  ) {
    throw new InputError(
      'checkpoint file',
      'params',
      'the saved state is of another grid or domain than the run it says it belongs to',
    );
  }
  if (checkpoint.steps < p.origin.steps || checkpoint.time < p.origin.time)
    throw new InputError('checkpoint file', 'progress.origin', 'lies after the saved state');
  return {
    checkpoint,
    progress: {
      id: p.id,
      params,
      plan,
      origin: p.origin,
      retries: p.retries as RetryRecord[],
      outputs: p.outputs,
      measurement: p.measurement === null ? null : measurementFromJson(p.measurement),
    },
  };
}

const PREFIX = '{\n "progress": ';
const DIGEST_TAIL = /,"digest":"([0-9a-f]{16})"\}$/;

/**
 * The progress entry of a checkpoint's text, once its digest matches. The digest is over the texts
 * exactly as written: the entry is one line of compact JSON (JSON.stringify never writes a line
 * break), so it is found, and the run file rebuilt, by position rather than by re-encoding.
 */
function sealedEntry(text: string): { entry: unknown; runFile: string } {
  if (!text.startsWith(PREFIX)) {
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch (e) {
      throw new InputError('checkpoint file', '(file)', `not JSON (${e instanceof Error ? e.message : String(e)})`);
    }
    const isObject = typeof json === 'object' && json !== null && !Array.isArray(json);
    if (isObject && !Object.hasOwn(json as object, 'progress'))
      throw new InputError(
        'checkpoint file',
        'progress',
        'is missing: this is not a checkpoint (a saved run continues with stria run FILE)',
      );
    throw new InputError(
      'checkpoint file',
      '(file)',
      'is not laid out as stria run writes checkpoints (it must begin with its progress entry): it was edited or damaged',
    );
  }
  const end = text.indexOf('\n', PREFIX.length);
  if (end < 0 || text[end - 1] !== ',')
    throw new InputError('checkpoint file', '(file)', 'is cut short after its progress entry');
  const sealed = text.slice(PREFIX.length, end - 1);
  const m = DIGEST_TAIL.exec(sealed);
  if (!m)
    throw new InputError(
      'checkpoint file',
      'progress.digest',
      'is missing: the progress entry must end with its digest',
    );
  const head = `${sealed.slice(0, m.index)}}`;
  const runFile = `{${text.slice(end)}`;
  if (textDigest(`${head}\n${runFile}`) !== m[1])
    throw new InputError(
      'checkpoint file',
      'progress.digest',
      'does not match the file: it was damaged or edited after it was written',
    );
  try {
    return { entry: JSON.parse(sealed), runFile };
  } catch (e) {
    throw new InputError('checkpoint file', 'progress', `not JSON (${e instanceof Error ? e.message : String(e)})`);
  }
}

function measurementFromJson(j: unknown): MonitoredRunState {
  let s: unknown;
  try {
    s = stateFromJson(j, 'progress.measurement');
  } catch (e) {
    if (isInputError(e, 'state')) throw new InputError('checkpoint file', e.field, e.reason);
    throw e;
  }
  const obj = (x: unknown): x is Record<string, unknown> =>
    typeof x === 'object' && x !== null && !Array.isArray(x) && !ArrayBuffer.isView(x);
  if (!obj(s) || !obj(s.run) || !(s.steady === null || obj(s.steady)) || !obj(s.monitor))
    throw new InputError('checkpoint file', 'progress.measurement', 'must be { run, steady, monitor }');
  const m = s.monitor;
  for (const k of ['self', 'budget', 'hovmoller', 'means'])
    if (!obj(m[k])) throw new InputError('checkpoint file', `progress.measurement.monitor.${k}`, 'must be an object');
  return s as unknown as MonitoredRunState;
}
