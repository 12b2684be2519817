import * as v from 'valibot';
import {
  SUMMARY_BOOLEAN_KEYS,
  SUMMARY_COUNT_KEYS,
  SUMMARY_KEYS,
  SUMMARY_OTHER_KEYS,
  SUMMARY_TEXT_VALUES,
  SUMMARY_TWO_LAYER_KEYS,
  type RunSummary,
} from '../analysis/summary';
import type { StopReason } from '../run/monitoredRun';
import { textDigest } from '../io/digest';
import type { ModelParams } from '../model/params';
import { canonicalJson, runId } from '../run/runId';
import type { RunPlan } from '../run/runPlan';
import type { SweepJob } from './sweepRuns';
import { namedValues } from '../io/namedValues';

/**
 * One finished sweep run: one line of `runs.jsonl` (JSON Lines, one object per line, appended as
 * runs finish, so the file is the sweep's journal and its resume point). `status` is "done", or
 * "blew-up" when the model stopped on a non-finite state or a CFL number past its limit (the run is
 * deterministic, so it would blow up again: it counts as finished). `summary` is the run summary
 * (lib/analysis/summary.ts) at the end, or at the last good state of a blown-up run.
 */
export const RECORD_FORMAT = 'stria-sweep-run';
/**
 * Version 2 lines carry `digest`, the fingerprint (lib/io/digest.ts `textDigest`) of the canonical
 * JSON (keys sorted) of every other field of the line, so that a line changed after it was written —
 * a summary edited by hand, a copy gone wrong — is refused instead of changing the fits, and a
 * summary with the jet detector's verdict, standard errors and the steady state. Version 1 lines
 * (written before both) are refused: their summaries lack the verdicts the tables and fits need.
 */
export const RECORD_VERSION = 2;

/** The job that ran (id, position, point, replica, seed, parameters, plan) and what came of it. */
export interface SweepRecord extends SweepJob {
  format: typeof RECORD_FORMAT;
  version: typeof RECORD_VERSION;
  status: 'done' | 'blew-up';
  /** Why a finished run stopped (null for a blown-up run). */
  stopped: StopReason | null;
  error: string | null;
  summary: RunSummary;
  /** Wall time of the run (s) and when it finished: the only fields that differ between reruns. */
  wall_seconds: number;
  finished_at: string;
  /** The fingerprint of the rest of the line (see RECORD_VERSION). */
  digest?: string;
}

/** The fingerprint of a record: textDigest of the canonical JSON of every field but `digest`. */
export function recordDigest(r: SweepRecord): string {
  const { digest: _, ...rest } = r;
  return textDigest(canonicalJson(rest));
}

/** A record of this version, with its digest. */
export function sealRecord(r: Omit<SweepRecord, 'format' | 'version' | 'digest'>): SweepRecord {
  const record: SweepRecord = { format: RECORD_FORMAT, version: RECORD_VERSION, ...r };
  return { ...record, digest: recordDigest(record) };
}

/** The summary's validators, key by key (lib/analysis/summary.ts says what each holds). */
function summaryEntry(key: keyof RunSummary) {
  if (key in SUMMARY_TEXT_VALUES) {
    const values = SUMMARY_TEXT_VALUES[key as keyof typeof SUMMARY_TEXT_VALUES];
    return v.nullable(v.picklist(values, `must be one of ${values.join(', ')} or null`));
  }
  if ((SUMMARY_BOOLEAN_KEYS as readonly string[]).includes(key)) return v.boolean('must be true or false');
  if ((SUMMARY_COUNT_KEYS as readonly string[]).includes(key)) return v.number('must be a number');
  return v.nullable(v.number('must be a number or null'));
}

const RecordSchema = v.looseObject({
  format: v.literal(RECORD_FORMAT, `must be "${RECORD_FORMAT}"`),
  version: v.literal(RECORD_VERSION, `must be ${RECORD_VERSION}`),
  digest: v.optional(v.pipe(v.string('must be a text'), v.regex(/^[0-9a-f]{16}$/, 'must be 16 hex digits'))),
  id: v.pipe(v.string('must be a text'), v.regex(/^r[0-9a-f]{16}$/, 'must be a run id such as r0123456789abcdef')),
  index: v.pipe(v.number('must be a number'), v.integer('must be an integer'), v.minValue(0, 'must be ≥ 0')),
  point: v.record(v.string(), v.union([v.number(), v.boolean(), v.string()]), 'must be an object of swept values'),
  replica: v.pipe(v.number('must be a number'), v.integer('must be an integer')),
  seed: v.pipe(v.number('must be a number'), v.integer('must be an integer')),
  params: namedValues('must be an object of parameters'),
  plan: v.looseObject(
    {
      stop: v.looseObject({ kind: v.picklist(['steps', 'until', 'steady']) }),
      average: v.number(),
      sampleEvery: v.number(),
    },
    'must be a run plan',
  ),
  status: v.picklist(['done', 'blew-up'], 'must be "done" or "blew-up"'),
  stopped: v.nullable(v.picklist(['steps', 'until', 'steady', 'not-steady'], 'must be a stop reason')),
  error: v.nullable(v.string('must be a text')),
  // Every key of a run summary, as summarize() writes them: a journal line lacking one is damaged,
  // but for the two-layer keys, which lines written before them lack (read as null).
  summary: v.looseObject(
    {
      ...Object.fromEntries(
        [...SUMMARY_KEYS, ...SUMMARY_OTHER_KEYS].map((k) => [
          k,
          (SUMMARY_TWO_LAYER_KEYS as readonly string[]).includes(k) ? v.optional(summaryEntry(k)) : summaryEntry(k),
        ]),
      ),
    },
    'must be a run summary',
  ),
  wall_seconds: v.number('must be a number'),
  finished_at: v.string('must be a text'),
});

/** Parse one line; throws RangeError naming the field when it is not a sweep record. */
export function parseSweepRecord(line: string): SweepRecord {
  let json: unknown;
  try {
    json = JSON.parse(line);
  } catch (e) {
    throw new RangeError(`not JSON (${e instanceof Error ? e.message : String(e)})`, { cause: e });
  }
  const parsed = v.safeParse(RecordSchema, json);
  if (!parsed.success) {
    const issue = parsed.issues[0];
    throw new RangeError(`${issue.path?.map((p) => String(p.key)).join('.') || '(record)'}: ${issue.message}`);
  }
  const bad = nonFinitePath(json, '');
  if (bad !== null)
    throw new RangeError(`${bad || '(record)'}: must be a finite number (JSON such as 1e999 reads as Infinity)`);
  const r = json as SweepRecord;
  // What the line says of itself must hold: it is whole (its digest), and it is the run it names (its id).
  if (r.digest === undefined) throw new RangeError(`digest: missing (a version ${RECORD_VERSION} line carries one)`);
  if (recordDigest(r) !== r.digest)
    throw new RangeError(
      'digest: does not match the line: it was changed after it was written; remove the line to run that run again',
    );
  const id = runId(r.params as unknown as ModelParams, r.plan as RunPlan);
  if (id !== r.id)
    throw new RangeError(
      `id: ${r.id} is not the id of the line's parameters and plan (${id}): the line was changed after it was written; remove it to run that run again`,
    );
  return r;
}

/** Path of the first number in a JSON value that is not finite, or null. */
function nonFinitePath(x: unknown, path: string): string | null {
  if (typeof x === 'number') return Number.isFinite(x) ? null : path;
  if (x === null || typeof x !== 'object') return null;
  for (const [k, val] of Object.entries(x)) {
    const found = nonFinitePath(val, path ? `${path}.${k}` : k);
    if (found !== null) return found;
  }
  return null;
}

/** The record as one line of JSON (without the newline). */
export function formatSweepRecord(r: SweepRecord): string {
  return JSON.stringify(r);
}

/** Everything of a record that the run's computation decides; equal for every rerun of the run. */
export function resultKey(r: SweepRecord): string {
  return canonicalJson({
    id: r.id,
    params: r.params,
    plan: r.plan,
    seed: r.seed,
    status: r.status,
    stopped: r.stopped,
    error: r.error,
    summary: r.summary,
  });
}

/**
 * Records joined by id, first seen kept. Throws RangeError naming the id and both sources when two
 * records of one id disagree on anything the computation decides (a conflict is a bug or a changed
 * Stria, never something to pick a winner in silently).
 */
export function joinRecords(sources: readonly { name: string; records: readonly SweepRecord[] }[]): SweepRecord[] {
  const byId = new Map<string, { record: SweepRecord; from: string; key: string }>();
  for (const s of sources) {
    for (const r of s.records) {
      const key = resultKey(r);
      const seen = byId.get(r.id);
      if (!seen) byId.set(r.id, { record: r, from: s.name, key });
      else if (seen.key !== key)
        throw new RangeError(
          `run ${r.id} differs between ${seen.from} and ${s.name}: ${firstDifference(seen.record, r)}`,
        );
    }
  }
  return sortRecords([...byId.values()].map((e) => e.record));
}

/** Sweep order: by index, then id. */
export function sortRecords(records: SweepRecord[]): SweepRecord[] {
  return records.sort((a, b) => a.index - b.index || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

function firstDifference(a: SweepRecord, b: SweepRecord): string {
  for (const k of ['params', 'plan', 'seed', 'status', 'stopped', 'error'] as const) {
    if (canonicalJson(a[k]) !== canonicalJson(b[k])) return `${k} differs`;
  }
  for (const k of Object.keys({ ...a.summary, ...b.summary })) {
    const x = (a.summary as unknown as Record<string, unknown>)[k];
    const y = (b.summary as unknown as Record<string, unknown>)[k];
    const show = (z: unknown) => (z === undefined ? 'missing' : String(z));
    if (x === undefined || y === undefined ? x !== y : canonicalJson(x) !== canonicalJson(y))
      return `summary.${k} is ${show(x)} in one and ${show(y)} in the other`;
  }
  return 'the records differ';
}
