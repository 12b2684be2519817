import fc from 'fast-check';
import { isInputError } from '../../../lib/inputError';
import { Model } from '../../../lib/model/model';
import { BlowUpError } from '../../../lib/model/stepper';
import { MonitoredRun } from '../../../lib/run/monitoredRun';
import { runId } from '../../../lib/run/runId';
import { resolveRunPlan } from '../../../lib/run/runPlan';
import { decodeCheckpointFile, encodeCheckpointFile, type RunProgress } from '../../../lib/run/runProgress';
import { textDigest } from '../../../lib/io/digest';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { applyEdits, editsArbitrary, textDamage } from '../support/weird';

/**
 * decodeCheckpointFile: real checkpoints of measured runs, damaged as text (the digest must catch
 * it), edited as JSON and sealed again with a correct digest (the schema and cross-checks must catch
 * it), and random texts. A refusal is an InputError of source 'checkpoint file' naming a field its
 * message shows; an accepted file restores into a model, its measurement either restores or is
 * refused as a misfit (an InputError of source 'state', which `stria run --resume` reports and goes
 * on without), and the run steps on.
 * The measurement itself is only damaged, not re-sealed: its integrity is the digest's to guard.
 */
function checkpointOf(params: Record<string, unknown>, steps: number, until: number): string {
  const model = new Model(params);
  const plan = resolveRunPlan(model.params, { until, average: until / 2, sampleEvery: 0.05 });
  const run = new MonitoredRun(model, plan);
  run.advance(steps);
  const progress: RunProgress = {
    id: runId(model.params, plan),
    params: model.params,
    plan,
    origin: { time: 0, steps: 0 },
    retries: [],
    outputs: {
      created_at: '2026-01-01T00:00:00Z',
      command: 'stria run',
      snapshots: null,
      zonal: { path: 'z.nc', records: 3 },
    },
    measurement: run.saveState(),
  };
  return encodeCheckpointFile(model.checkpoint(), progress, new Date('2026-01-01T00:00:00Z'));
}

const FILES = [
  checkpointOf({ nx: 32, ny: 32, kf: 8, dkf: 1.5, dt: 0.01, init_energy: 1 }, 12, 1),
  checkpointOf({ nx: 32, ny: 32, kf: 6, dkf: 1, dt: 0.02, cfl: 0, mu: 0.1 }, 7, 2),
];

/** A checkpoint split once into its JSON without the measurement, and the measurement's JSON text. */
interface Split {
  skeleton: Record<string, unknown>;
  measurement: string;
}
const PLACEHOLDER = '"@measurement@"';
function split(text: string): Split {
  const json = JSON.parse(text);
  const measurement = JSON.stringify(json.progress.measurement);
  json.progress.measurement = JSON.parse(PLACEHOLDER);
  delete json.progress.digest;
  return { skeleton: json, measurement };
}
const SPLITS = FILES.map(split);

/** The file with its JSON edited outside the measurement, and sealed again with a correct digest. */
function editAndSeal({ skeleton, measurement }: Split, edits: Parameters<typeof applyEdits>[1]): string {
  const edited = applyEdits(skeleton, edits) as Record<string, unknown>;
  const progress = edited.progress;
  const put = (t: string) => t.replace(PLACEHOLDER, () => measurement);
  if (typeof progress !== 'object' || progress === null || Array.isArray(progress)) return put(JSON.stringify(edited));
  const { progress: _, ...runFile } = edited;
  // Sealed as encodeCheckpointFile lays a file out: the entry on line 2, then the run file.
  const head = put(JSON.stringify(progress));
  const body = put(JSON.stringify(runFile, null, 1));
  const sealed = `${head.slice(0, -1)},"digest":${JSON.stringify(textDigest(`${head}\n${body}`))}}`;
  return `{\n "progress": ${sealed},${body.slice(1)}`;
}

const file = fc.constantFrom(...FILES);
const inputs: fc.Arbitrary<string> = fc.oneof(
  {
    weight: 1,
    arbitrary: fc.oneof(fc.string(), fc.json(), fc.constantFrom('', '{}', '{"progress":{}}', '{"progress":null}')),
  },
  { weight: 3, arbitrary: fc.tuple(fc.constantFrom(...SPLITS), editsArbitrary(2)).map(([t, e]) => editAndSeal(t, e)) },
  { weight: 2, arbitrary: file.chain((t) => textDamage(t)) },
  { weight: 1, arbitrary: fc.constantFrom(...SPLITS).map((t) => editAndSeal(t, [])) },
);

export const boundary: Boundary<string> = {
  arbitrary: inputs,
  check(text) {
    let decoded;
    try {
      decoded = decodeCheckpointFile(text);
    } catch (e) {
      if (!isInputError(e, 'checkpoint file'))
        throw new PropertyFailure(
          `decodeCheckpointFile threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}, not an InputError of source 'checkpoint file'`,
        );
      if (!e.field || !e.message.includes(e.field))
        throw new PropertyFailure(`an InputError of source 'checkpoint file' names no field: ${e.message}`);
      return e.field === 'progress.digest' ? 'rejected by the digest' : 'rejected';
    }
    const { checkpoint, progress } = decoded;
    const run = new MonitoredRun(Model.restore(checkpoint), progress.plan, {}, progress.origin);
    let answer = 'accepted';
    if (progress.measurement) {
      try {
        run.restoreState(progress.measurement);
      } catch (e) {
        if (!isInputError(e, 'state'))
          throw new PropertyFailure(`restoreState threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
        answer = 'accepted, measurement refused';
      }
    }
    try {
      run.advance(3);
    } catch (e) {
      if (e instanceof BlowUpError) return `${answer}, blew up`;
      if (e instanceof RangeError && /clock no longer advances/.test(e.message)) return `${answer}, clock stalls`;
      throw new PropertyFailure(
        `accepted, then the run threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`,
      );
    }
    const q = run.model.qHat;
    if (!q.every(Number.isFinite))
      throw new PropertyFailure('accepted, then the state went non-finite without a BlowUpError');
    for (const [k, x] of Object.entries(run.summary()))
      if (typeof x === 'number' && !Number.isFinite(x))
        throw new PropertyFailure(`accepted, then the summary has ${k} = ${x}`);
    return answer;
  },
  preview: (t) => `${t.length} chars: ${t.slice(0, 160).replace(/\s+/g, ' ')}…`,
};
