import { describe, expect, it } from 'vitest';
import { parseByteSize } from '../../cli/byteSize';

describe('sizes in bytes', () => {
  it('reads binary and decimal units and bare bytes, refusing anything else', () => {
    expect(parseByteSize('2GiB')).toBe(2 * 2 ** 30);
    expect(parseByteSize('1.5 MiB')).toBe(1.5 * 2 ** 20);
    expect(parseByteSize('512mib')).toBe(512 * 2 ** 20);
    expect(parseByteSize('2GB')).toBe(2e9);
    expect(parseByteSize('1e3kB')).toBe(1e6);
    expect(parseByteSize('4096')).toBe(4096);
    for (const bad of ['', 'GiB', '2 gigs', '-1GiB', '0', '2G', '1EiB', '1,5MiB', 'NaN'])
      expect(parseByteSize(bad), bad).toBeNaN();
  });
});
