import { describe, expect, it } from 'vitest';
import { stateChecksum } from '../../workers/stateChecksum';

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

  it('reads only the view it is given', () => {
    const big = new Float64Array(128);
    big.set(base, 32);
    expect(stateChecksum(big.subarray(32, 96))).toBe(stateChecksum(base));
  });
});
