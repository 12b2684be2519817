import { describe, expect, it } from 'vitest';
import { NODE_BASE64 } from '../../cli/nodeBase64';
import { decodeBase64, encodeBase64 } from '../../lib/io/runFile';

describe("Node's base64 for checkpoints", () => {
  it('agrees with the portable codec both ways', () => {
    for (let n = 0; n < 40; n++) {
      const bytes = Uint8Array.from({ length: n }, (_, i) => (i * 97 + n) & 255);
      expect(NODE_BASE64.encode(bytes)).toBe(encodeBase64(bytes));
      expect(Array.from(NODE_BASE64.decode(encodeBase64(bytes)))).toEqual(Array.from(decodeBase64(encodeBase64(bytes))));
    }
  });

  it('refuses what the portable codec refuses: other alphabets, stray characters, bad padding', () => {
    for (const bad of ['AB-D', 'AB_D', 'AB!D', 'A=BC', 'ABC', 'AB\nC', 'AB=D', '====']) {
      expect(() => NODE_BASE64.decode(bad), bad).toThrow(RangeError);
      expect(() => decodeBase64(bad), bad).toThrow();
    }
  });
});
