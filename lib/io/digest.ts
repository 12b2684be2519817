/**
 * Fast 64-bit fingerprints, as 16 hex digits: two 32-bit lanes, FNV-1a and a multiply–xorshift, run
 * over a sequence of 32-bit values. They tell data damaged or changed (a flipped bit, a cut, a stray
 * edit, a state that drifted) from the same data, over megabytes in milliseconds (runId's 64-bit
 * FNV-1a runs on BigInt and is meant for short texts). Not a security measure.
 *
 * The fingerprints are stored in checkpoint files and compared across Node and browsers: any change
 * to the lanes, their seeds or what each function feeds them changes every stored value.
 *
 * Each fingerprint runs its own loop over the two lane steps below (the engines inline them): a
 * shared loop over a callback or through a buffer measured two to ten times slower.
 */

const FNV_SEED = 0x811c9dc5;
const FNV_PRIME = 0x01000193;
const MIX_SEED = 0x9747b28c;
const MIX_PRIME = 0x5bd1e995;

/** The FNV-1a lane after one more value w (taken as 32 bits). */
function fnvLane(a: number, w: number): number {
  return Math.imul(a ^ w, FNV_PRIME);
}

/** The multiply–xorshift lane after one more value w (taken as 32 bits). */
function mixLane(b: number, w: number): number {
  const m = Math.imul(b ^ w, MIX_PRIME);
  return m ^ (m >>> 15);
}

function hex(a: number, b: number): string {
  return hex8(a) + hex8(b);
}

function hex8(x: number): string {
  return (x >>> 0).toString(16).padStart(8, '0');
}

/**
 * The fingerprint of a text: the lanes over its UTF-16 code units, then its length mixed into the
 * second lane, so that a cut at a point where both lanes happen to agree still differs. It tells a
 * checkpoint that was damaged on the disk from one written whole (lib/run/runProgress.ts).
 */
export function textDigest(text: string): string {
  let a = FNV_SEED;
  let b = MIX_SEED;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    a = fnvLane(a, c);
    b = mixLane(b, c);
  }
  b = Math.imul(b ^ text.length, MIX_PRIME);
  return hex(a, b);
}

/**
 * The fingerprint of the model state: the lanes over the raw bits of the PV spectrum as 32-bit words
 * (its length is not mixed in). Two runs with the same fingerprint hold the same bits (up to a
 * negligible chance), which is how a shared link or a reloaded run file is checked against the run
 * it came from. The words are read in the platform's byte order; every platform Stria runs on
 * (x86-64 and ARM64 machines, their browsers and Node) is little-endian.
 */
export function stateChecksum(qHat: Float64Array): string {
  const words = new Uint32Array(qHat.buffer, qHat.byteOffset, qHat.length * 2);
  let a = FNV_SEED;
  let b = MIX_SEED;
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    a = fnvLane(a, w);
    b = mixLane(b, w);
  }
  return hex(a, b);
}
