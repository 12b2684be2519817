import { describe, expect, it } from 'vitest';
import { runSweepJob } from '../../lib/sweep/runSweepJob';
import {
  formatSweepRecord,
  joinRecords,
  parseSweepRecord,
  sealRecord,
  type SweepRecord,
} from '../../lib/sweep/sweepRecord';
import { expandSweep } from '../../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../../lib/sweep/sweepSpec';
import { sweepFits } from '../../lib/sweep/sweepFits';
import { tableRows } from '../../lib/sweep/sweepTable';

const clock = { seconds: () => 0, iso: () => '2025-01-01T00:00:00Z' };
const spec = parseSweepSpec({
  base: { nx: 32, ny: 32, kf: 8, dkf: 1.5, mu: 0.5, eps: 0.5, nu: 1e-8, dt: 0.05 },
  vary: [{ param: 'beta', values: [5, 10] }],
  length: { steps: 40 },
  average: 1,
});
const records = expandSweep(spec).map((j) => runSweepJob(j, clock));

describe('sweep records', () => {
  it('round-trip through one line of JSON, bit for bit', () => {
    const line = formatSweepRecord(records[0]);
    expect(line).not.toContain('\n');
    expect(parseSweepRecord(line)).toEqual(records[0]);
    expect(() => parseSweepRecord('{"format":"stria-sweep-run","version":2,"id":"x"}')).toThrow(/^id:/);
    // A line of the journal format before the detector's verdicts is refused by its version.
    expect(() => parseSweepRecord('{"format":"stria-sweep-run","version":1,"id":"x"}')).toThrow(/^version: must be 2/);
    expect(() => parseSweepRecord('{"format":')).toThrow(/not JSON/);
  });

  it('refuse a line changed after it was written: by its digest, and by its run id', () => {
    const line = JSON.parse(formatSweepRecord(records[0]));
    const edited = { ...line, summary: { ...line.summary, u_rms: line.summary.u_rms * 1.5 } };
    expect(() => parseSweepRecord(JSON.stringify(edited))).toThrow(/^digest: does not match the line/);
    expect(() => parseSweepRecord(JSON.stringify({ ...line, digest: undefined }))).toThrow(/^digest: missing/);
    // A line whose digest was made again after the edit still names a run its parameters are not.
    const { digest: _, ...rest } = { ...line, params: { ...line.params, beta: 7 } };
    expect(() => parseSweepRecord(JSON.stringify(sealRecord(rest)))).toThrow(
      new RegExp(`^id: ${line.id} is not the id of the line's parameters and plan`),
    );
    // A version-1 line, written before lines carried a digest and the detector's verdicts, is refused by its version.
    const { digest: __, ...v1 } = { ...line, version: 1 };
    expect(() => parseSweepRecord(JSON.stringify(v1))).toThrow(/^version: must be 2/);
  });

  it('join by id, keep one of each, and refuse a disagreement naming the run', () => {
    const rerun: SweepRecord = { ...records[1], wall_seconds: 9, finished_at: '2025-02-01T00:00:00Z' };
    const joined = joinRecords([
      { name: 'a', records: [records[1]] },
      { name: 'b', records: [rerun, records[0]] },
    ]);
    expect(joined.map((r) => r.id)).toEqual(records.map((r) => r.id));
    const changed: SweepRecord = {
      ...records[1],
      summary: { ...records[1].summary, energy: records[1].summary.energy! * (1 + 2 ** -52) },
    };
    expect(() =>
      joinRecords([
        { name: 'a', records: [records[1]] },
        { name: 'b', records: [changed] },
      ]),
    ).toThrow(new RegExp(`${records[1].id} differs between a and b: summary.energy`));
  });

  it('give table rows with the fit scales, and fits that say why they cannot be made', () => {
    const rows = tableRows(records);
    expect(rows[0]).toMatchObject({ id: records[0].id, beta: 5, seed: 1, status: 'done', balance_velocity: 1 });
    expect(rows[0].rhines_length).toBeCloseTo((2 * Math.PI) / records[0].summary.k_rhines!, 12);
    const fits = sweepFits(rows, { resamples: 10 });
    expect(fits.u_rms_vs_balance_velocity.error).toMatch(/2 usable points/);
  });
});
