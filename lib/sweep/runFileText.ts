import { QHAT_ENCODING, RUN_FILE_FORMAT, RUN_FILE_VERSION } from '../io/runFile';
import type { Checkpoint } from '../model/checkpoint';
import type { Base64Codec } from './stateJson';

/**
 * The text of a run file (lib/io/runFile.ts), the same bytes as `encodeRunFile` writes, with the
 * spectrum's base64 from a codec of the caller's choice. encodeRunFile's portable base64 runs at about
 * 0.4 s a megabyte (3.5 s for a 1024² state), which a checkpoint every few minutes would pay each
 * time; the command line passes Node's. test/sweep/runFileText.test.ts checks the bytes against
 * encodeRunFile, so the two cannot drift apart; once the portable encoder is fast this can go.
 */
export function runFileText(cp: Checkpoint, saved: Date, codec: Base64Codec): string {
  const bytes = new Uint8Array(cp.qHat.length * 8);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < cp.qHat.length; i++) view.setFloat64(8 * i, cp.qHat[i], true);
  const file = {
    format: RUN_FILE_FORMAT,
    version: RUN_FILE_VERSION,
    saved: saved.toISOString(),
    params: cp.params,
    state: { time: cp.time, steps: cp.steps, dt: cp.dt, rng: [...cp.rng], qHat: { encoding: QHAT_ENCODING, length: cp.qHat.length, data: codec.encode(bytes) } },
  };
  return JSON.stringify(file, null, 1);
}
