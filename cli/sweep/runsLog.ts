import { appendFileSync, existsSync, readFileSync, truncateSync } from 'node:fs';
import { formatSweepRecord, parseSweepRecord, type SweepRecord } from '../../lib/sweep/sweepRecord';

/**
 * `runs.jsonl`, a sweep's journal: one record per finished run, appended as each finishes with one
 * write of one line. A process killed mid-write can leave a last line without its newline; reading
 * drops it (that run simply is not finished) and `openRunsLog` cuts it off before appending, so the
 * next record starts on a line of its own. Any complete line that is not a record is an error,
 * named by file and line: a journal is never silently rewritten.
 */
export function readRunsLog(path: string): { records: SweepRecord[]; partialTail: boolean } {
  if (!existsSync(path)) return { records: [], partialTail: false };
  const text = readFileSync(path, 'utf8');
  const lines = text.split('\n');
  const tail = lines.pop()!; // '' when the file ends with a newline
  const records = lines.flatMap((line, i) => {
    if (line.trim() === '') return [];
    try {
      return [parseSweepRecord(line)];
    } catch (e) {
      throw new Error(`${path}:${i + 1}: not a sweep record: ${(e as Error).message}`, { cause: e });
    }
  });
  return { records, partialTail: tail.trim() !== '' };
}

/** Make `path` ready to append to: drop a partial last line. Returns how many bytes were dropped. */
export function openRunsLog(path: string): number {
  if (!existsSync(path)) return 0;
  const bytes = readFileSync(path);
  const end = bytes.lastIndexOf(0x0a) + 1;
  if (end === bytes.length) return 0;
  truncateSync(path, end);
  return bytes.length - end;
}

export function appendRecord(path: string, record: SweepRecord): void {
  appendFileSync(path, `${formatSweepRecord(record)}\n`);
}

/** Write a whole journal (merge): records in the order given. */
export function writeRunsLog(path: string, records: readonly SweepRecord[]): void {
  appendFileSync(path, '', { flag: 'w' });
  for (const r of records) appendRecord(path, r);
}
