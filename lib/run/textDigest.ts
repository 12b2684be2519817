/**
 * A fast 64-bit fingerprint of a text (two 32-bit lanes, FNV-1a and a multiply–xorshift, over its
 * UTF-16 code units), as 16 hex digits. It tells a checkpoint that was damaged on the disk (a
 * flipped bit, a cut, a stray edit) from one written whole, over megabytes in milliseconds (runId's
 * 64-bit FNV-1a runs on BigInt and is meant for short texts). Not a security measure.
 */
export function textDigest(text: string): string {
  let a = 0x811c9dc5;
  let b = 0x9747b28c;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    a = Math.imul(a ^ c, 0x01000193);
    b = Math.imul(b ^ c, 0x5bd1e995);
    b ^= b >>> 15;
  }
  // Mix the length in, so that a cut at a point where both lanes happen to agree still differs.
  b = Math.imul(b ^ text.length, 0x5bd1e995);
  return hex8(a) + hex8(b);
}

function hex8(x: number): string {
  return (x >>> 0).toString(16).padStart(8, '0');
}
