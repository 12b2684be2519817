/**
 * CSV of columnar data (RFC 4180): a header row of column names, then one row per index, fields
 * separated by commas, records ended by CRLF (the last one too). A field is quoted when it holds a
 * comma, a double quote, CR or LF, and a quote inside is doubled.
 *
 * Numbers are written at full precision in the shortest form that reads back to the same double
 * (ECMAScript Number-to-String, e.g. 0.1, 1e-7, 6.283185307179586), with −0 kept as "-0". NaN is
 * written as an empty field, which spreadsheets, pandas and R all read as missing; ±∞ are written as
 * "Infinity" and "-Infinity", which Python, pandas and R read as infinities.
 */
export interface CsvColumn {
  name: string;
  values: ArrayLike<number> | readonly string[];
}

/** The CSV text of equal-length columns. */
export function formatCsv(columns: readonly CsvColumn[]): string {
  if (columns.length === 0) throw new RangeError('CSV: no columns given');
  const names = new Set<string>();
  const rows = columns[0].values.length;
  for (const c of columns) {
    if (typeof c.name !== 'string' || c.name === '') throw new RangeError('CSV: every column needs a non-empty name');
    if (names.has(c.name)) throw new RangeError(`CSV: column "${c.name}" is given twice`);
    names.add(c.name);
    if (c.values.length !== rows)
      throw new RangeError(
        `CSV: column "${c.name}" has ${c.values.length} values, column "${columns[0].name}" has ${rows}`,
      );
  }
  const lines: string[] = new Array(rows + 1);
  lines[0] = columns.map((c) => quoteField(c.name)).join(',');
  const fields: string[] = new Array(columns.length);
  for (let r = 0; r < rows; r++) {
    for (let k = 0; k < columns.length; k++) {
      const x = columns[k].values[r];
      fields[k] = typeof x === 'number' ? formatCsvNumber(x) : quoteField(String(x));
    }
    lines[r + 1] = fields.join(',');
  }
  return lines.join('\r\n') + '\r\n';
}

/** The CSV as UTF-8 bytes, without a byte-order mark. */
export function encodeCsv(columns: readonly CsvColumn[]): Uint8Array {
  return new TextEncoder().encode(formatCsv(columns));
}

/** Shortest round-trip decimal form; "-0" for negative zero, "" for NaN. */
export function formatCsvNumber(x: number): string {
  if (Number.isNaN(x)) return '';
  if (x === 0 && 1 / x < 0) return '-0';
  return String(x);
}

/** RFC 4180 escaping: quote when the field holds a comma, a quote, CR or LF. */
export function quoteField(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A parsed CSV: the header row and the records, all fields as text. */
export interface CsvTable {
  header: string[];
  rows: string[][];
}

/**
 * Parses RFC 4180 CSV (CRLF or bare LF line ends, an optional final line end, an optional UTF-8
 * byte-order mark). Refuses a quote inside an unquoted field, text after a closing quote, an
 * unterminated quoted field, and records whose field count differs from the header's.
 */
export function parseCsv(input: string | Uint8Array): CsvTable {
  // ignoreBOM keeps a mark in the text, so that the one line below drops it from strings and bytes alike.
  let text = typeof input === 'string' ? input : new TextDecoder('utf-8', { ignoreBOM: true }).decode(input);
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const records: string[][] = [];
  let record: string[] = [];
  let i = 0;
  let line = 1;
  const n = text.length;
  while (i < n) {
    let field = '';
    if (text[i] === '"') {
      const startLine = line;
      i++;
      for (;;) {
        const close = text.indexOf('"', i);
        if (close < 0) throw new RangeError(`CSV line ${startLine}: a quoted field is not closed`);
        for (let k = i; k < close; k++) if (text.charCodeAt(k) === 10) line++;
        field += text.slice(i, close);
        if (text[close + 1] === '"') {
          field += '"';
          i = close + 2;
        } else {
          i = close + 1;
          break;
        }
      }
      if (i < n && text[i] !== ',' && text[i] !== '\r' && text[i] !== '\n')
        throw new RangeError(`CSV line ${line}: unexpected ${JSON.stringify(text[i])} after a closing quote`);
    } else {
      const start = i;
      while (i < n && text[i] !== ',' && text[i] !== '\r' && text[i] !== '\n') {
        if (text[i] === '"') throw new RangeError(`CSV line ${line}: a double quote inside an unquoted field`);
        i++;
      }
      field = text.slice(start, i);
    }
    record.push(field);
    if (i < n && text[i] === ',') {
      i++;
      if (i === n) record.push(''); // a trailing comma ends with an empty field
      continue;
    }
    // End of record: CRLF, LF, a lone CR, or the end of the text.
    if (text[i] === '\r') i++;
    if (text[i] === '\n') i++;
    line++;
    records.push(record);
    record = [];
  }
  if (record.length > 0) records.push(record); // text ended right after a trailing comma
  if (records.length === 0) throw new RangeError('CSV: no header row');
  const [header, ...rows] = records;
  rows.forEach((r, k) => {
    if (r.length !== header.length)
      throw new RangeError(
        `CSV record ${k + 1} (line ${k + 2} if no field spans lines) has ${r.length} fields, the header has ${header.length}`,
      );
  });
  return { header, rows };
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Reads one numeric field as written by formatCsvNumber: "" and "NaN" are NaN. Refuses anything else. */
export function parseCsvNumber(field: string): number {
  const x = numberOf(field);
  if (x === null) throw new RangeError(`CSV: ${JSON.stringify(field)} is not a number`);
  return x;
}

/** The named column of a parsed table as numbers. */
export function csvNumberColumn(table: CsvTable, name: string): Float64Array {
  const k = table.header.indexOf(name);
  if (k < 0)
    throw new RangeError(`CSV has no column "${name}" (it has ${table.header.map((h) => `"${h}"`).join(', ')})`);
  return Float64Array.from(table.rows, (r, i) => {
    const x = numberOf(r[k]);
    if (x === null) throw new RangeError(`CSV column "${name}", row ${i + 1}: ${JSON.stringify(r[k])} is not a number`);
    return x;
  });
}

function numberOf(field: string): number | null {
  if (field === '' || field === 'NaN') return NaN;
  if (field === 'Infinity' || field === '+Infinity') return Infinity;
  if (field === '-Infinity') return -Infinity;
  return DECIMAL.test(field) ? Number(field) : null;
}
