import { describe, expect, it } from 'vitest';
import { stateChecksum, textDigest } from '../../lib/io/digest';

describe('stateChecksum', () => {
  const base = Float64Array.from({ length: 64 }, (_, i) => Math.sin(i + 0.5));

  it('is 16 hex digits and the same for the same bits', () => {
    const c = stateChecksum(base);
    expect(c).toMatch(/^[0-9a-f]{16}$/);
    expect(stateChecksum(base.slice())).toBe(c);
  });

  it('changes with any one bit, and tells 0 from −0', () => {
    const seen = new Set([stateChecksum(base)]);
    for (const i of [0, 17, 63]) {
      const x = base.slice();
      const words = new Uint32Array(x.buffer);
      words[2 * i] ^= 1; // lowest mantissa bit
      seen.add(stateChecksum(x));
    }
    expect(seen.size).toBe(4);
    expect(stateChecksum(new Float64Array([0]))).not.toBe(stateChecksum(new Float64Array([-0])));
  });

  it('depends on the order of the values', () => {
    const swapped = base.slice();
    [swapped[3], swapped[4]] = [swapped[4], swapped[3]];
    expect(stateChecksum(swapped)).not.toBe(stateChecksum(base));
  });

  // Compatibility, not correctness: the app compares these with checksums Node computed.
  it('keeps the values it has always given', () => {
    expect(stateChecksum(Float64Array.from({ length: 8 }, (_, i) => i - 3.25))).toBe('96111905877436ac');
    expect(stateChecksum(new Float64Array(0))).toBe('811c9dc59747b28c');
  });

  it('reads only the view it is given', () => {
    const big = new Float64Array(128);
    big.set(base, 32);
    expect(stateChecksum(big.subarray(32, 96))).toBe(stateChecksum(base));
  });
});

describe('textDigest', () => {
  // Its first lane is 32-bit FNV-1a, and for ASCII text the UTF-16 code units are the bytes: the
  // 32-bit FNV-1a test vectors of the algorithm's authors' reference list [published: Fowler, Noll, Vo].
  it('runs 32-bit FNV-1a in its first lane', () => {
    expect(textDigest('').slice(0, 8)).toBe('811c9dc5');
    expect(textDigest('a').slice(0, 8)).toBe('e40c292c');
    expect(textDigest('foobar').slice(0, 8)).toBe('bf9cf968');
  });

  // Compatibility, not correctness: checkpoint files carry these digests, so the values the first
  // versions wrote must stay the values computed.
  it('keeps the digests stored in checkpoint files', () => {
    expect(textDigest('')).toBe('811c9dc5d688577c');
    expect(textDigest('{"progress":1}\n{"format":"stria-run"}')).toBe('d1fd8abddd436f26');
    expect(textDigest('é\u{1f600}\ud800')).toBe('ef0f8c73d6144997');
  });

  it('changes with one code unit, a cut or an order swap', () => {
    const text = 'stria checkpoint 0123456789 '.repeat(40);
    const seen = new Set([
      textDigest(text),
      textDigest(text.slice(0, -1)),
      textDigest(text.slice(1)),
      textDigest(`${text.slice(0, 100)}X${text.slice(101)}`),
    ]);
    seen.add(textDigest(text.slice(0, 10) + text[11] + text[10] + text.slice(12)));
    expect(seen.size).toBe(5);
  });
});
