import type { RunSummary } from '../lib/analysis/summary';

/** The run summary as aligned "key  value" lines for people (`--json` prints the object itself). */
export function summaryText(s: RunSummary): string {
  const entries = Object.entries(s);
  const width = Math.max(...entries.map(([k]) => k.length));
  return (
    entries
      .map(([k, v]) => `${k.padEnd(width)}  ${typeof v === 'number' ? formatValue(v) : v === null ? '—' : String(v)}`)
      .join('\n') + '\n'
  );
}

function formatValue(x: number): string {
  return Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6)));
}
