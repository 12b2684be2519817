import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvNumberColumn, encodeCsv, formatCsv, formatCsvNumber, parseCsv, parseCsvNumber } from '../../lib/io/csv';

// RFC 4180 (header row, CRLF records, quoting of fields with comma, quote, CR or LF, doubled quotes)
// and the number rules of docs/file-formats.md (shortest round trip, −0 kept, NaN as empty field).
describe('CSV writing', () => {
  it('writes the RFC 4180 form exactly', () => {
    const text = formatCsv([
      { name: 'y', values: [0, -0, NaN, 0.1, -Infinity] },
      { name: 'label, unit', values: ['a,b', 'say "hi"', 'two\r\nlines', '', ' spaced '] },
    ]);
    expect(text).toBe(
      'y,"label, unit"\r\n0,"a,b"\r\n-0,"say ""hi"""\r\n,"two\r\nlines"\r\n0.1,\r\n-Infinity, spaced \r\n',
    );
    expect(Array.from(encodeCsv([{ name: 'ψ', values: [1] }]))).toEqual(
      Array.from(new TextEncoder().encode('ψ\r\n1\r\n')),
    );
  });

  it('writes numbers in the shortest form that reads back to the same double', () => {
    const cases: [number, string][] = [
      [0.1, '0.1'],
      [1 / 3, '0.3333333333333333'],
      [1e-7, '1e-7'],
      [1e21, '1e+21'],
      [5e-324, '5e-324'],
      [2 ** 53, '9007199254740992'],
      [-0, '-0'],
      [NaN, ''],
      [Infinity, 'Infinity'],
    ];
    for (const [x, s] of cases) expect(formatCsvNumber(x)).toBe(s);
  });

  it('refuses columns that do not make a table', () => {
    expect(() => formatCsv([])).toThrow(/no columns/);
    expect(() =>
      formatCsv([
        { name: 'a', values: [1] },
        { name: 'a', values: [2] },
      ]),
    ).toThrow(/column "a" is given twice/);
    expect(() => formatCsv([{ name: '', values: [1] }])).toThrow(/non-empty name/);
    expect(() =>
      formatCsv([
        { name: 'a', values: [1, 2] },
        { name: 'b', values: [1] },
      ]),
    ).toThrow(/column "b" has 1 values, column "a" has 2/);
  });
});

describe('CSV round trip', () => {
  it('gives back every double bit for bit (seeded property)', () => {
    fc.assert(
      fc.property(fc.array(fc.double(), { minLength: 1, maxLength: 50 }), (xs) => {
        const back = csvNumberColumn(parseCsv(formatCsv([{ name: 'v', values: xs }])), 'v');
        return back.length === xs.length && xs.every((x, i) => Object.is(back[i], x));
      }),
      { seed: 4180, numRuns: 300 },
    );
  });

  it('gives back any text, quoted where needed (seeded property)', () => {
    const field = fc.string({ unit: fc.constantFrom('a', 'ζ', ',', '"', '\r', '\n', ' ', 'x') });
    fc.assert(
      fc.property(fc.array(fc.tuple(field, field), { minLength: 1, maxLength: 20 }), (rows) => {
        const t = parseCsv(
          formatCsv([
            { name: 'a', values: rows.map((r) => r[0]) },
            { name: 'b,"c"', values: rows.map((r) => r[1]) },
          ]),
        );
        return t.header.join('|') === 'a|b,"c"' && JSON.stringify(t.rows) === JSON.stringify(rows);
      }),
      { seed: 4180, numRuns: 300 },
    );
  });

  it('keeps the rows of a single column of missing values', () => {
    const t = parseCsv(formatCsv([{ name: 'v', values: [NaN, NaN, 1] }]));
    expect(Array.from(csvNumberColumn(t, 'v'))).toEqual([NaN, NaN, 1]);
  });
});

describe('CSV parsing', () => {
  it('accepts LF line ends, a missing final line end, a byte-order mark, a trailing empty field', () => {
    expect(parseCsv('\ufeffa,b\n1,2\n3,4')).toEqual({
      header: ['a', 'b'],
      rows: [
        ['1', '2'],
        ['3', '4'],
      ],
    });
    expect(parseCsv('a,b\r\n1,')).toEqual({ header: ['a', 'b'], rows: [['1', '']] });
    expect(parseCsv(new TextEncoder().encode('ψ\r\n"x"\r\n'))).toEqual({ header: ['ψ'], rows: [['x']] });
    // A mark before UTF-8 bytes is dropped once, as from a string; malformed bytes become U+FFFD.
    expect(parseCsv(Uint8Array.of(0xef, 0xbb, 0xbf, 0x61, 0x0a, 0x31))).toEqual({ header: ['a'], rows: [['1']] });
    expect(parseCsv(Uint8Array.of(0xef, 0xbb, 0xbf, 0xef, 0xbb, 0xbf, 0x61)).header).toEqual(['\ufeffa']);
    expect(parseCsv(Uint8Array.of(0x61, 0xc3, 0x0a, 0x31))).toEqual({ header: ['a\ufffd'], rows: [['1']] });
  });

  it('refuses what RFC 4180 does not allow, saying where', () => {
    expect(() => parseCsv('a\r\nx"y\r\n')).toThrow(/CSV line 2: a double quote inside an unquoted field/);
    expect(() => parseCsv('a\r\n"x"y\r\n')).toThrow(/CSV line 2: unexpected "y" after a closing quote/);
    expect(() => parseCsv('a\r\n"x\r\n')).toThrow(/CSV line 2: a quoted field is not closed/);
    expect(() => parseCsv('a,b\r\n1\r\n')).toThrow(/CSV record 1 .* has 1 fields, the header has 2/);
    expect(() => parseCsv('')).toThrow(/no header row/);
  });

  it('reads numbers strictly', () => {
    expect([parseCsvNumber(''), parseCsvNumber('NaN')]).toEqual([NaN, NaN]);
    expect([parseCsvNumber('-Infinity'), parseCsvNumber('1e+21'), parseCsvNumber('.5'), parseCsvNumber('-0')]).toEqual([
      -Infinity,
      1e21,
      0.5,
      -0,
    ]);
    for (const bad of ['0x10', ' 1', '1,0', 'inf', '1e', 'one'])
      expect(() => parseCsvNumber(bad), bad).toThrow(/is not a number/);
    const t = parseCsv('a\r\nx\r\n');
    expect(() => csvNumberColumn(t, 'b')).toThrow(/CSV has no column "b" \(it has "a"\)/);
    expect(() => csvNumberColumn(t, 'a')).toThrow(/column "a", row 1: "x" is not a number/);
  });
});
