import { availableParallelism } from 'node:os';
import { MAX_THREADS, SMALL_GRID_POINTS } from '../lib/model/stepTeam';
import { UsageError, type OptionSpec, type ParsedArgs } from './args';

/** `--threads N` of the commands that run one model (docs/cli.md, docs/threads.md). */
export const THREADS_OPTION: OptionSpec = {
  name: 'threads',
  kind: 'count',
  value: 'N',
  help: `threads the step runs on, this one included (default: every core,\none below ${Math.sqrt(SMALL_GRID_POINTS)}²; at most ${MAX_THREADS}); the results are the same bits on any number`,
};

/** Threads a single run takes: --threads, else every core (one on a small grid). */
export function threadsFor(o: ParsedArgs['options'], grid: { nx: number; ny: number }): number {
  const asked = o.threads as number | undefined;
  if (asked !== undefined) {
    if (asked > MAX_THREADS) throw new UsageError(`--threads ${asked}: at most ${MAX_THREADS}`);
    return asked;
  }
  if (grid.nx * grid.ny < SMALL_GRID_POINTS) return 1;
  return Math.min(MAX_THREADS, Math.max(1, availableParallelism()));
}
