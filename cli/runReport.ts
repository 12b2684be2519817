import type { RunSummary } from '../lib/analysis/summary';
import type { BlowUpReport, RetryRecord } from '../lib/run/blowUpRetry';
import { summaryText } from './summaryText';

/**
 * What `stria run` prints on standard output: the run summary, then the retries made (each blow-up
 * recovered from) and the blow-up that ended the run, if one did. `--json` prints one object: the
 * summary's keys, then `retries` (a list, empty when none) and `blow_up` (the report or null);
 * non-finite numbers of a report are null, as in the summary.
 */
export function runReport(
  summary: RunSummary,
  retries: readonly RetryRecord[],
  blowUp: BlowUpReport | null,
  json: boolean,
): string {
  if (json) return `${JSON.stringify({ ...summary, retries, blow_up: blowUp })}\n`;
  const extra: string[] = [];
  extra.push(
    `retries  ${retries.length}${retries.length ? ` (dt ${retries[0].dt.from} → ${retries[retries.length - 1].dt.to})` : ''}`,
  );
  if (blowUp)
    extra.push(
      `blow_up  t = ${blowUp.time}, step ${blowUp.steps}: ${blowUp.reason} (CFL ${blowUp.cfl}, max|u| ${blowUp.max_u}, max|v| ${blowUp.max_v}, dt ${blowUp.dt})`,
    );
  return summaryText(summary) + extra.join('\n') + '\n';
}
