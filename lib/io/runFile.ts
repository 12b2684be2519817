import * as v from 'valibot';
import { CHECKPOINT_FORMAT, CHECKPOINT_VERSION, type Checkpoint } from '../model/checkpoint';
import { Grid } from '../model/grid';
import { storedParams, type ModelParams } from '../model/params';
import { InputError, isInputError } from '../inputError';
import { validateParams } from '../model/validateParams';
import { decodeBase64, encodeBase64 } from './base64';
import { namedValues } from './namedValues';

/**
 * The Stria run file: a saved run that resumes bit for bit. Versioned JSON:
 *
 *   { "format": "stria-run", "version": 1, "saved": ISO 8601 time (optional),
 *     "threads": threads the saving run stepped on (optional; not part of the state),
 *     "params": { …ModelParams, model units… },
 *     "state": { "time": t, "steps": n, "dt": adaptive step in use,
 *                "rng": [four signed 32-bit integers: the random stream's state],
 *                "qHat": { "encoding": "float64le-base64", "length": L, "data": "…" } } }
 *
 * `qHat` is the PV anomaly spectrum in the half-plane layout of lib/model/grid.ts, L = 2·ny·(nx/2 + 1)
 * numbers as IEEE 754 doubles, little-endian, in standard base64 (RFC 4648, with padding); with two
 * layers (params.layers = 2) the upper layer's spectrum then the lower layer's, L = 4·ny·(nx/2 + 1).
 * A one-layer run's params leave out the two-layer keys (layers, shear, depth_ratio: `storedParams`),
 * so its file is the version-1 file it always was; params without them read as one layer. Numbers in
 * the JSON are written by JavaScript's shortest round-trip formatting, so they read back exactly.
 */
export const RUN_FILE_FORMAT = 'stria-run';
export const RUN_FILE_VERSION = 1;
export const QHAT_ENCODING = 'float64le-base64';

const int32 = v.pipe(
  v.number('must be a number'),
  v.integer('must be an integer'),
  v.minValue(-0x80000000, 'must fit in a signed 32-bit integer'),
  v.maxValue(0x7fffffff, 'must fit in a signed 32-bit integer'),
);
const finite = (what: string) => v.pipe(v.number(`${what}: must be a number`), v.finite(`${what}: must be finite`));

const RunFileSchema = v.object({
  format: v.literal(RUN_FILE_FORMAT, `must be "${RUN_FILE_FORMAT}" (this is not a Stria run file)`),
  version: v.literal(
    RUN_FILE_VERSION,
    `must be ${RUN_FILE_VERSION}: this Stria reads run files of version ${RUN_FILE_VERSION}`,
  ),
  saved: v.optional(v.string('must be a date string')),
  threads: v.optional(
    v.pipe(v.number('must be a number'), v.integer('must be a whole number'), v.minValue(1, 'must be ≥ 1')),
  ),
  params: namedValues('must be an object of named parameters'),
  state: v.object(
    {
      time: v.pipe(finite('model time'), v.minValue(0, 'model time must be ≥ 0')),
      // Beyond 2^53 adding a step no longer changes the count, and a run counting steps never ends.
      steps: v.pipe(
        v.number('must be a number'),
        v.integer('must be an integer'),
        v.minValue(0, 'must be ≥ 0'),
        v.maxValue(Number.MAX_SAFE_INTEGER, `must be ≤ ${Number.MAX_SAFE_INTEGER}`),
      ),
      dt: v.pipe(finite('time step'), v.gtValue(0, 'time step must be > 0')),
      rng: v.pipe(
        v.array(int32, 'must be an array of four 32-bit integers'),
        v.length(4, 'must hold exactly four 32-bit integers'),
        // xoroshiro128+ never reaches the all-zero state and, put there, draws zeros for ever: no forcing.
        v.check((r) => r.some((x) => x !== 0), 'must not be all zero (the random stream would draw only zeros)'),
      ),
      qHat: v.object(
        {
          encoding: v.literal(QHAT_ENCODING, `must be "${QHAT_ENCODING}"`),
          length: v.pipe(v.number('must be a number'), v.integer('must be an integer'), v.minValue(0, 'must be ≥ 0')),
          data: v.pipe(
            v.string('must be a base64 string'),
            v.regex(/^[A-Za-z0-9+/]*={0,2}$/, 'must be standard base64 (A–Z, a–z, 0–9, +, /, = padding)'),
          ),
        },
        'must be an object with encoding, length and data',
      ),
    },
    'must be an object with time, steps, dt, rng and qHat',
  ),
});

/**
 * The run file of a checkpoint, as JSON text; `threads`, when given, records how many threads the run
 * stepped on (the bits do not depend on it, so a file resumes the same on any number).
 */
export function encodeRunFile(cp: Checkpoint, saved: Date = new Date(), threads?: number): string {
  const bytes = new Uint8Array(cp.qHat.length * 8);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < cp.qHat.length; i++) view.setFloat64(8 * i, cp.qHat[i], true);
  const file = {
    format: RUN_FILE_FORMAT,
    version: RUN_FILE_VERSION,
    saved: saved.toISOString(),
    ...(threads === undefined ? {} : { threads }),
    params: storedParams(cp.params),
    state: {
      time: cp.time,
      steps: cp.steps,
      dt: cp.dt,
      rng: [...cp.rng],
      qHat: { encoding: QHAT_ENCODING, length: cp.qHat.length, data: encodeBase64(bytes) },
    },
  };
  return JSON.stringify(file, null, 1);
}

/**
 * Read a run file back into a checkpoint, or throw an InputError of source 'run file' naming the
 * first bad entry by its path (e.g. "state.qHat.data", "params.nu").
 */
export function decodeRunFile(text: string): Checkpoint {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new InputError('run file', '(file)', `not JSON (${e instanceof Error ? e.message : String(e)})`);
  }
  const parsed = v.safeParse(RunFileSchema, json);
  if (!parsed.success) {
    const issue = parsed.issues[0];
    const path = issue.path?.map((p) => String(p.key)).join('.') || '(file)';
    throw new InputError('run file', path, issue.message);
  }
  const { params: rawParams, state } = parsed.output;
  let params: ModelParams;
  try {
    params = validateParams(rawParams);
  } catch (e) {
    if (isInputError(e, 'parameters'))
      throw new InputError('run file', `params.${e.issues[0].field}`, e.issues[0].message);
    throw e;
  }
  // A clock at which one more step changes nothing (t + dt = t) would never reach a later time.
  if (!(state.time + Math.min(state.dt, params.dt) > state.time)) {
    throw new InputError(
      'run file',
      'state.time',
      `t = ${state.time} is too large for the time step ${Math.min(state.dt, params.dt)} to advance it`,
    );
  }
  const grid = new Grid(params);
  const expected = 2 * params.layers * grid.spectralSize;
  if (state.qHat.length !== expected) {
    throw new InputError(
      'run file',
      'state.qHat.length',
      `is ${state.qHat.length}, but a ${params.nx} × ${params.ny} grid ${params.layers === 2 ? 'of two layers ' : ''}needs ${expected}`,
    );
  }
  const bytes = decodeBase64(state.qHat.data, 'state.qHat.data');
  if (bytes.length !== 8 * expected) {
    throw new InputError(
      'run file',
      'state.qHat.data',
      `holds ${bytes.length} bytes, but ${expected} doubles need ${8 * expected}`,
    );
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const qHat = new Float64Array(expected);
  for (let i = 0; i < expected; i++) qHat[i] = view.getFloat64(8 * i, true);
  for (let layer = 0; layer < params.layers; layer++)
    checkSpectrum(qHat.subarray(layer * 2 * grid.spectralSize, (layer + 1) * 2 * grid.spectralSize), grid, layer);
  const [r0, r1, r2, r3] = state.rng;
  return {
    format: CHECKPOINT_FORMAT,
    version: CHECKPOINT_VERSION,
    params,
    time: state.time,
    steps: state.steps,
    dt: state.dt,
    rng: [r0, r1, r2, r3],
    qHat,
  };
}

/** Every value finite, and zero on the modes the model never holds (dealiased ones and the mean). */
function checkSpectrum(qHat: Float64Array, grid: Grid, layer: number): void {
  const where = (ix: number, jy: number) => `mode (ix ${ix}, jy ${jy})${layer > 0 ? ' of the lower layer' : ''}`;
  for (let jy = 0; jy < grid.ny; jy++) {
    for (let ix = 0; ix < grid.nkx; ix++) {
      const t = 2 * (jy * grid.nkx + ix);
      if (!Number.isFinite(qHat[t]) || !Number.isFinite(qHat[t + 1])) {
        throw new InputError('run file', 'state.qHat.data', `${where(ix, jy)} is not a finite number`);
      }
      if (!grid.kept(ix, jy) && (qHat[t] !== 0 || qHat[t + 1] !== 0)) {
        throw new InputError(
          'run file',
          'state.qHat.data',
          `${where(ix, jy)} lies outside the dealiased range but is not zero`,
        );
      }
    }
  }
}
