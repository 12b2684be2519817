import type { SweepJob } from './sweepRuns';

/**
 * A deterministic share of a sweep, for job arrays: shard i of n (0 ≤ i < n) holds the runs whose
 * index in the sweep's order is i modulo n. Every run is in exactly one shard, the shards differ in
 * size by at most one run, and consecutive runs (neighbouring values, replicas of one point) land in
 * different shards, so each shard spans the whole range of the sweep.
 */
export interface Shard {
  index: number;
  count: number;
}

/** "i/n" as a Shard; RangeError with the reason for anything else. */
export function parseShard(text: string): Shard {
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  if (!m) throw new RangeError(`"${text}" is not of the form i/n (e.g. 0/4 for the first of four shards)`);
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (!(count >= 1)) throw new RangeError(`"${text}": the number of shards must be at least 1`);
  if (!(index < count)) throw new RangeError(`"${text}": the shard index counts from 0, so it must be below ${count}`);
  return { index, count };
}

export function inShard(job: Pick<SweepJob, 'index'>, shard: Shard): boolean {
  return job.index % shard.count === shard.index;
}

export function selectShard<T extends Pick<SweepJob, 'index'>>(jobs: readonly T[], shard: Shard | null): T[] {
  return shard ? jobs.filter((j) => inShard(j, shard)) : [...jobs];
}
