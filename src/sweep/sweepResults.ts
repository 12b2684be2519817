import { parseCsv } from '../../lib/io/csv';
import { joinRecords, parseSweepRecord, type SweepRecord } from '../../lib/sweep/sweepRecord';
import { tableRows, type TableRow, type TableValue } from '../../lib/sweep/sweepTable';

/**
 * A command-line sweep's results as table rows (sweepTable.ts): `runs.jsonl` (one record per line;
 * a partial last line of an interrupted sweep is dropped and a run found twice kept once, as the
 * command line does), `table.json`
 * (an array of rows) or `table.csv` (numbers read back as numbers, empty fields as null). Throws
 * RangeError naming the line or field that is not what a results file holds.
 */
export function parseResults(name: string, text: string): { rows: TableRow[]; records: SweepRecord[] | null } {
  if (name.endsWith('.jsonl')) {
    const lines = text.split('\n');
    if (!text.endsWith('\n')) lines.pop(); // an unfinished last line of an interrupted sweep
    const records = lines
      .map((l, i) => [l.trim(), i] as const)
      .filter(([l]) => l !== '')
      .map(([l, i]) => {
        try {
          return parseSweepRecord(l);
        } catch (e) {
          throw new RangeError(`${name} line ${i + 1}: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
        }
      });
    // A run journaled twice (two sweeps into one directory, or a rerun) counts once, as the command
    // line counts it; two records of one run that disagree are refused, naming the run.
    let joined: SweepRecord[];
    try {
      joined = joinRecords([{ name, records }]);
    } catch (e) {
      throw new RangeError(`${name}: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
    }
    return { rows: tableRows(joined), records: joined };
  }
  if (name.endsWith('.json')) {
    const data: unknown = JSON.parse(text);
    if (!Array.isArray(data) || !data.every((r) => r && typeof r === 'object' && !Array.isArray(r)))
      throw new RangeError(`${name}: expected an array of rows (table.json)`);
    return { rows: data as TableRow[], records: null };
  }
  if (name.endsWith('.csv')) {
    const t = parseCsv(text);
    if (!t.header.includes('status'))
      throw new RangeError(`${name}: no "status" column: not a sweep table (table.csv)`);
    const rows = t.rows.map((r) => Object.fromEntries(t.header.map((h, i) => [h, csvValue(r[i])])) as TableRow);
    return { rows, records: null };
  }
  throw new RangeError(`${name}: open runs.jsonl, table.json or table.csv of a sweep's results`);
}

function csvValue(field: string): TableValue {
  if (field === '') return null;
  const x = Number(field);
  return Number.isNaN(x) ? field : x;
}
