import { describe, expect, it } from 'vitest';
import { utf8Decode, utf8Encode, utf8Length } from '../../lib/io/utf8';

// Against the platform's own encoder (WHATWG Encoding / RFC 3629).
describe('utf8', () => {
  const samples = ['', 'ascii', 'βy', 'ζ = ∇²ψ', 'emoji 🌀 and 𝜓', 'é\u0000x', '\u07ff\u0800\uffff'];

  it('encodes as TextEncoder does and decodes back', () => {
    for (const s of samples) {
      const b = utf8Encode(s);
      expect(Array.from(b)).toEqual(Array.from(new TextEncoder().encode(s)));
      expect(utf8Length(s)).toBe(b.length);
      expect(utf8Decode(b)).toBe(s);
    }
  });

  it('refuses lone surrogates and decodes malformed bytes to U+FFFD', () => {
    expect(() => utf8Encode('a\udc00')).toThrow(/lone surrogate/);
    expect(() => utf8Encode('\ud800')).toThrow(/lone surrogate/);
    expect(utf8Decode([0x61, 0xc3])).toBe('a\ufffd');
    expect(utf8Decode([0xc0, 0x80])).toBe('\ufffd\ufffd'); // overlong NUL
    expect(utf8Decode([0xed, 0xa0, 0x80])).toBe('\ufffd\ufffd\ufffd'); // encoded surrogate
  });
});
