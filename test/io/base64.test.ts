import { describe, expect, it } from 'vitest';
import { InputError } from '../../lib/inputError';
import { decodeBase64, encodeBase64 } from '../../lib/io/base64';
import { decodeRunFile, encodeRunFile } from '../../lib/io/runFile';
import { Model } from '../../lib/model/model';

/** Seeded bytes (a 32-bit LCG), so every value 0–255 turns up. */
function bytes(n: number, seed: number): Uint8Array {
  const out = new Uint8Array(n);
  let s = seed >>> 0;
  for (let i = 0; i < n; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    out[i] = s >>> 24;
  }
  return out;
}

/** The reference: Node's own base64 codec (standard alphabet with padding). */
const nodeBase64 = (b: Uint8Array) => Buffer.from(b.buffer, b.byteOffset, b.byteLength).toString('base64');

describe('base64', () => {
  // Around the encoder's text buffer (65 536 characters = 49 152 bytes), and the three paddings.
  const sizes = [0, 1, 2, 3, 4, 5, 100, 49152 - 1, 49152, 49152 + 1, 49152 + 2, 2 * 49152 + 7];

  it('matches the RFC 4648 test vectors and round-trips every length', () => {
    // [published] RFC 4648 §10.
    const vectors: [string, string][] = [
      ['', ''],
      ['f', 'Zg=='],
      ['fo', 'Zm8='],
      ['foo', 'Zm9v'],
      ['foob', 'Zm9vYg=='],
      ['fooba', 'Zm9vYmE='],
      ['foobar', 'Zm9vYmFy'],
    ];
    for (const [plain, coded] of vectors) {
      const b = new TextEncoder().encode(plain);
      expect(encodeBase64(b)).toBe(coded);
      expect(Array.from(decodeBase64(coded))).toEqual(Array.from(b));
    }
    const all = Uint8Array.from({ length: 300 }, (_, i) => (i * 89 + 7) & 255);
    for (let n = 0; n <= all.length; n += 37)
      expect(Array.from(decodeBase64(encodeBase64(all.subarray(0, n))))).toEqual(Array.from(all.subarray(0, n)));
  });

  it("writes the text of Node's codec and reads it back, at every size around its buffer", () => {
    for (let n = 0; n < 40; n++) {
      const b = Uint8Array.from({ length: n }, (_, i) => (i * 97 + n) & 255);
      expect(encodeBase64(b)).toBe(nodeBase64(b));
      expect(Array.from(decodeBase64(nodeBase64(b)))).toEqual(Array.from(b));
    }
    for (const n of sizes) {
      const b = bytes(n, n + 1);
      expect(encodeBase64(b), `n = ${n}`).toBe(nodeBase64(b));
      expect(decodeBase64(encodeBase64(b)), `n = ${n}`).toEqual(b);
    }
    // A view into a larger buffer encodes only its own bytes.
    const big = bytes(64, 3);
    expect(encodeBase64(big.subarray(5, 38))).toBe(nodeBase64(big.subarray(5, 38)));
  });

  it('refuses other alphabets, stray characters and bad padding, naming the first bad position', () => {
    const refused: [string, string][] = [
      ['AB-D', 'invalid base64 character at position 2'],
      ['AB_D', 'invalid base64 character at position 2'],
      ['AB!D', 'invalid base64 character at position 2'],
      ['A=BC', 'invalid base64 character at position 1'],
      ['ABC', 'base64 length 3 is not a multiple of 4'],
      ['AB\nC', 'invalid base64 character at position 2'],
      ['AB=D', 'invalid base64 character at position 2'],
      ['====', 'invalid base64 character at position 0'],
      ['A===', 'invalid base64 character at position 1'],
      ['ABé=', 'invalid base64 character at position 2'],
      ['QUJDRA=A', 'invalid base64 character at position 6'],
    ];
    for (const [bad, reason] of refused) {
      let error: unknown;
      try {
        decodeBase64(bad, 'state.qHat.data');
      } catch (e) {
        error = e;
      }
      expect(error, bad).toBeInstanceOf(InputError);
      expect((error as InputError).source, bad).toBe('run file');
      expect((error as InputError).message, bad).toBe(`run file: state.qHat.data: ${reason}`);
    }
    expect(() => decodeBase64('AB-D')).toThrow('run file: (base64): invalid base64 character at position 2');
  });

  it('drops the bits past the last whole byte, as RFC 4648 §3.5 lets a decoder', () => {
    expect(Array.from(decodeBase64('QR=='))).toEqual([65]);
    expect(Array.from(decodeBase64('QUI='))).toEqual([65, 66]);
  });

  it('gives run files whose state is the bytes of the spectrum, read back exactly', () => {
    const m = new Model({ nx: 64, ny: 64, kf: 12, dkf: 2 });
    m.step(3);
    const cp = m.checkpoint();
    const text = encodeRunFile(cp, new Date(Date.UTC(2025, 0, 2, 3, 4, 5)));
    const le = new Uint8Array(cp.qHat.buffer, cp.qHat.byteOffset, cp.qHat.byteLength); // little-endian platforms
    expect(JSON.parse(text).state.qHat.data).toBe(nodeBase64(le));
    expect(Array.from(decodeRunFile(text).qHat)).toEqual(Array.from(cp.qHat));
  });
});
