import { describe, expect, it } from 'vitest';
import { checkNetcdfName, netcdfNameProblem, netcdfTextBytes } from '../../lib/io/netcdf3Names';

// The name grammar and "Note on names" of the NetCDF classic format specification.
describe('NetCDF names', () => {
  it('accepts what the grammar allows', () => {
    for (const ok of [
      'q',
      'zeta',
      'stria_nu_order',
      '_FillValue',
      '2d',
      'x.y@z+w-v',
      'a b',
      'Tmax!',
      'ψ',
      'température',
      'x'.repeat(256),
    ]) {
      expect(netcdfNameProblem(ok), ok).toBeNull();
    }
  });

  it('refuses what it does not, saying why', () => {
    const cases: [string, RegExp][] = [
      ['', /empty/],
      ['.x', /first character/],
      ['-x', /first character/],
      [' x', /first character/],
      ['a/b', /'\/' is not allowed/],
      ['a\tb', /control character U\+0009/],
      ['a\u007fb', /control character U\+007F/],
      ['trailing ', /trailing spaces/],
      ['e\u0301', /NFC/], // e + combining acute: the NFC form is é
      ['x'.repeat(257), /longer than 256 bytes/],
      ['é'.repeat(129), /longer than 256 bytes/], // 258 bytes of UTF-8
      ['a\ud800', /not valid Unicode/],
      ['\udc00x', /not valid Unicode/],
    ];
    for (const [name, why] of cases) expect(netcdfNameProblem(name), JSON.stringify(name)).toMatch(why);
  });

  it('names the owner in the thrown message', () => {
    expect(() => checkNetcdfName('a/b', 'variable')).toThrow(/variable has an invalid name "a\/b"/);
  });

  // UTF-8 examples of RFC 3629 §7 [published]; names are stored as UTF-8 (the specification's "Note on names").
  it('stores names and text as UTF-8, and refuses a lone surrogate, which has none', () => {
    expect(Array.from(netcdfTextBytes('A\u2262\u0391.'))).toEqual([0x41, 0xe2, 0x89, 0xa2, 0xce, 0x91, 0x2e]);
    expect(Array.from(netcdfTextBytes('\u65e5\u672c\u8a9e'))).toEqual([
      0xe6, 0x97, 0xa5, 0xe6, 0x9c, 0xac, 0xe8, 0xaa, 0x9e,
    ]);
    expect(Array.from(netcdfTextBytes('\u{233b4}'))).toEqual([0xf0, 0xa3, 0x8e, 0xb4]);
    expect(netcdfNameProblem('a\ud800')).toBe(
      'not valid Unicode (lone surrogate at position 1: not encodable as UTF-8)',
    );
    expect(() => netcdfTextBytes('ab\udc00')).toThrow(
      new RangeError('lone surrogate at position 2: not encodable as UTF-8'),
    );
    expect(() => netcdfTextBytes('\ud800\ud800\udc00')).toThrow(/position 0/);
  });
});
