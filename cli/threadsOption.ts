import { availableParallelism } from 'node:os';
import { DEFAULT_THREADS_MIN_POINTS, MAX_THREADS } from '../lib/model/stepTeam';
import { UsageError, type OptionSpec, type ParsedArgs } from './args';

/** `--threads N` of the commands that run one model (docs/cli.md, docs/threads.md). */
export const THREADS_OPTION: OptionSpec = {
  name: 'threads',
  kind: 'count',
  value: 'N',
  help: `threads the step runs on, this one included (default: every core\nfrom ${Math.sqrt(DEFAULT_THREADS_MIN_POINTS)}² up, one below; at most ${MAX_THREADS}); the results are the same bits on any number`,
};

/** Threads a single run takes: --threads, else every core from DEFAULT_THREADS_MIN_POINTS up (stepTeam.ts), else one. */
export function threadsFor(o: ParsedArgs['options'], grid: { nx: number; ny: number }): number {
  const asked = o.threads as number | undefined;
  if (asked !== undefined) {
    if (asked > MAX_THREADS) throw new UsageError(`--threads ${asked}: at most ${MAX_THREADS}`);
    return asked;
  }
  if (grid.nx * grid.ny < DEFAULT_THREADS_MIN_POINTS) return 1;
  return Math.min(MAX_THREADS, Math.max(1, availableParallelism()));
}
