import fc from 'fast-check';
import { runSweepJob } from '../../../lib/sweep/runSweepJob';
import { formatSweepRecord, joinRecords, parseSweepRecord } from '../../../lib/sweep/sweepRecord';
import { expandSweep } from '../../../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../../../lib/sweep/sweepSpec';
import { sweepFits } from '../../../lib/sweep/sweepFits';
import { tableRows } from '../../../lib/sweep/sweepTable';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { applyEdits, editsArbitrary, textDamage } from '../support/weird';

/**
 * parseSweepRecord, the reader of a sweep's journal (runs.jsonl, read on resume and by stria merge):
 * real records edited as JSON or damaged as text, and random texts. A refusal is a RangeError that
 * names the field (or says "not JSON"); an accepted record goes through what resume and merge do
 * with it (join, table, fits) without any other error.
 */
const clock = { seconds: () => 0, iso: () => '2026-01-01T00:00:00Z' };
const spec = parseSweepSpec({
  base: { nx: 32, ny: 32, kf: 8, dkf: 1.5, mu: 0.5, eps: 0.5, nu: 1e-8, dt: 0.05 },
  vary: [{ param: 'beta', values: [5, 10, 20] }],
  length: { steps: 30 },
  average: 1,
});
const RECORDS = expandSweep(spec).map((j) => runSweepJob(j, clock));
const LINES = RECORDS.map(formatSweepRecord);

export const boundary: Boundary<string> = {
  arbitrary: fc.oneof(
    { weight: 1, arbitrary: fc.oneof(fc.string(), fc.json()) },
    {
      weight: 4,
      arbitrary: fc
        .tuple(fc.constantFrom(...RECORDS), editsArbitrary(3))
        .map(([r, e]) => JSON.stringify(applyEdits(r, e))),
    },
    { weight: 2, arbitrary: fc.constantFrom(...LINES).chain((l) => textDamage(l)) },
  ),
  check(line) {
    let record;
    try {
      record = parseSweepRecord(line);
    } catch (e) {
      if (!(e instanceof RangeError))
        throw new PropertyFailure(`parseSweepRecord threw ${e instanceof Error ? e.name : typeof e}: ${String(e)}`);
      if (!/^(not JSON \(|(\(record\)|[A-Za-z_][\w.]*): )/.test(e.message))
        throw new PropertyFailure(`the refusal names no field: ${e.message}`);
      return 'rejected';
    }
    try {
      const joined = joinRecords([{ name: 'a', records: [record, ...RECORDS.slice(1)] }]);
      sweepFits(tableRows(joined), { resamples: 50, seed: 1 });
    } catch (e) {
      if (e instanceof RangeError && / differs between /.test(e.message)) return 'accepted, conflict refused';
      throw new PropertyFailure(
        `accepted, then joining or tabulating it threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`,
      );
    }
    return 'accepted';
  },
};
