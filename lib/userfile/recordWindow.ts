/**
 * A window of records written "a:b": records a to b − 1, counted from 0 (half-open, like a slice);
 * a or b may be left out (the first, the end) and may be negative (counted from the end: "-10:" is
 * the last ten). "a" alone is the single record a.
 */
export function parseRecordWindow(text: string, count: number): { start: number; end: number } {
  const m = /^\s*(-?\d+)?\s*(:)?\s*(-?\d+)?\s*$/.exec(text);
  if (
    !m ||
    (m[1] === undefined && m[3] === undefined && m[2] === undefined) ||
    (m[2] === undefined && m[3] !== undefined)
  ) {
    throw new RangeError(`records "${text}": write a:b (records a to b − 1, from 0), a:, :b, or a single record a`);
  }
  const at = (s: string | undefined, dflt: number) => {
    if (s === undefined) return dflt;
    const k = Number(s);
    return k < 0 ? count + k : k;
  };
  const start = at(m[1], 0);
  const end = m[2] === undefined ? start + 1 : at(m[3], count);
  if (!(start >= 0 && end <= count && start < end))
    throw new RangeError(`records "${text}" select nothing of the file's ${count} records (0 to ${count - 1})`);
  return { start, end };
}
