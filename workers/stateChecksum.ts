/**
 * A fingerprint of the model state: two 32-bit hashes (FNV-1a and a multiply–xorshift lane) over the
 * raw bits of the PV spectrum, as 16 hex digits. Two runs with the same fingerprint hold the same bits
 * (up to a negligible chance), which is how a shared link or a reloaded run file is checked against
 * the run it came from. The words are read in the platform's byte order; every platform Stria runs
 * on (x86-64 and ARM64 machines, their browsers and Node) is little-endian.
 */
export function stateChecksum(qHat: Float64Array): string {
  const words = new Uint32Array(qHat.buffer, qHat.byteOffset, qHat.length * 2);
  let a = 0x811c9dc5;
  let b = 0x9747b28c;
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    a = Math.imul(a ^ w, 0x01000193);
    b = Math.imul(b ^ w, 0x5bd1e995);
    b ^= b >>> 15;
  }
  return hex8(a) + hex8(b);
}

function hex8(x: number): string {
  return (x >>> 0).toString(16).padStart(8, '0');
}
