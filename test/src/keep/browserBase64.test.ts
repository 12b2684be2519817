import { describe, expect, it } from 'vitest';
import { encodeBase64, encodeRunFile } from '../../../lib/io/runFile';
import { Model } from '../../../lib/model/model';
import { runFileText } from '../../../lib/run/runFileText';
import { BROWSER_BASE64 } from '../../../src/keep/browserBase64';

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

describe('BROWSER_BASE64', () => {
  // Around the chunk size (3 · 8192 bytes), and the three paddings.
  const sizes = [0, 1, 2, 3, 4, 5, 100, 3 * 8192 - 1, 3 * 8192, 3 * 8192 + 1, 3 * 8192 + 2, 2 * 3 * 8192 + 7];

  it('writes the same text as the portable encoder of lib/io, RFC 4648 with padding', () => {
    for (const n of sizes) expect(BROWSER_BASE64.encode(bytes(n, n + 1)), `n = ${n}`).toBe(encodeBase64(bytes(n, n + 1)));
    // RFC 4648 §10 test vectors.
    const enc = (s: string) => BROWSER_BASE64.encode(new TextEncoder().encode(s));
    expect(['', 'f', 'fo', 'foo', 'foob', 'fooba', 'foobar'].map(enc)).toEqual(['', 'Zg==', 'Zm8=', 'Zm9v', 'Zm9vYg==', 'Zm9vYmE=', 'Zm9vYmFy']);
  });

  it('reads back what it writes', () => {
    for (const n of sizes) expect(BROWSER_BASE64.decode(BROWSER_BASE64.encode(bytes(n, 7 * n)))).toEqual(bytes(n, 7 * n));
  });

  it('gives run files byte for byte those of encodeRunFile', () => {
    const m = new Model({ nx: 64, ny: 64, kf: 12, dkf: 2 });
    m.step(3);
    const cp = m.checkpoint();
    const when = new Date(Date.UTC(2025, 0, 2, 3, 4, 5));
    expect(runFileText(cp, when, BROWSER_BASE64)).toBe(encodeRunFile(cp, when));
  });
});
