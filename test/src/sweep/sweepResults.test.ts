import { describe, expect, it } from 'vitest';
import { encodeCsv } from '../../../lib/io/csv';
import { formatSweepRecord, sealRecord } from '../../../lib/sweep/sweepRecord';
import { expandSweep } from '../../../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../../../lib/sweep/sweepSpec';
import { runSweepJob } from '../../../lib/sweep/runSweepJob';
import { tableColumns, tableCsvColumns, tableRows, pointKeysOf } from '../../../lib/sweep/sweepTable';
import { parseResults } from '../../../src/sweep/sweepResults';

const clock = { seconds: () => 0, iso: () => '2026-01-01T00:00:00Z' };

describe('parseResults', () => {
  const spec = parseSweepSpec({
    base: { nx: 32, ny: 32, kf: 6, dkf: 1 },
    vary: [{ param: 'beta', values: [5, 10] }],
    length: { steps: 20 },
    sampleEvery: 0.05,
  });
  const records = expandSweep(spec).map((j) => runSweepJob(j, clock));
  const rows = tableRows(records);

  it('reads runs.jsonl, dropping an unfinished last line, into the same rows as the command line', () => {
    const text = records.map(formatSweepRecord).join('\n') + '\n{"format":"stria-sw';
    const parsed = parseResults('runs.jsonl', text);
    expect(parsed.rows).toEqual(rows);
    expect(parsed.records?.length).toBe(2);
    expect(parseResults('runs.jsonl', records.map(formatSweepRecord).join('\n') + '\n').rows).toEqual(rows);
  });

  it('counts a run journaled twice once, as the command line does, and refuses two that disagree', () => {
    const again = records.map((r) => sealRecord({ ...r, wall_seconds: 5, finished_at: '2026-01-02T00:00:00Z' }));
    const text = [...records, ...again].map((r) => JSON.stringify(r)).join('\n') + '\n';
    expect(parseResults('runs.jsonl', text).rows).toEqual(rows);
    const changed = sealRecord({ ...records[0], summary: { ...records[0].summary, u_rms: 1 } });
    expect(() =>
      parseResults('runs.jsonl', [...records, changed].map((r) => JSON.stringify(r)).join('\n') + '\n'),
    ).toThrow(new RegExp(`runs.jsonl: run ${records[0].id} differs`));
  });

  it('reads table.csv with numbers as numbers and empty fields as null', () => {
    const csv = new TextDecoder().decode(encodeCsv(tableCsvColumns(rows, tableColumns(pointKeysOf(records)))));
    const parsed = parseResults('table.csv', csv).rows;
    expect(parsed.map((r) => r.beta)).toEqual([5, 10]);
    expect(parsed[0].u_rms).toBe(rows[0].u_rms);
    expect(parsed[0].status).toBe('done');
  });

  it('names the line of a bad record and refuses other files', () => {
    expect(() => parseResults('runs.jsonl', '{"x":1}\n')).toThrow(/line 1/);
    expect(() => parseResults('notes.txt', '')).toThrow(/runs.jsonl/);
    expect(() => parseResults('table.csv', 'a,b\r\n1,2\r\n')).toThrow(/status/);
  });
});
