import { describe, expect, it } from 'vitest';
import { checkNetcdfName, netcdfNameProblem } from '../../lib/io/netcdf3Names';

// The name grammar and "Note on names" of the NetCDF classic format specification.
describe('NetCDF names', () => {
  it('accepts what the grammar allows', () => {
    for (const ok of ['q', 'zeta', 'stria_nu_order', '_FillValue', '2d', 'x.y@z+w-v', 'a b', 'Tmax!', 'ψ', 'température', 'x'.repeat(256)]) {
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
    ];
    for (const [name, why] of cases) expect(netcdfNameProblem(name), JSON.stringify(name)).toMatch(why);
  });

  it('names the owner in the thrown message', () => {
    expect(() => checkNetcdfName('a/b', 'variable')).toThrow(/variable has an invalid name "a\/b"/);
  });
});
