import { encodeRunFile } from '../io/runFile';
import type { Checkpoint } from '../model/checkpoint';
import type { Base64Codec } from './stateJson';

/**
 * The text of a run file (lib/io/runFile.ts) with the spectrum's base64 from a codec of the caller's
 * choice: encodeRunFile's portable base64 runs at about 0.4 s a megabyte (3.5 s for a 1024² state),
 * which a checkpoint every few minutes would pay each time; the command line passes Node's.
 * test/sweep/runFileText.test.ts checks that every codec gives encodeRunFile's bytes.
 */
export function runFileText(cp: Checkpoint, saved: Date, codec: Base64Codec): string {
  return encodeRunFile(cp, saved, codec.encode);
}
