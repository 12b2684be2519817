import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import { parseShard, selectShard, type Shard } from '../../lib/sweep/shard';
import type { SweepRecord } from '../../lib/sweep/sweepRecord';
import { joinRecords } from '../../lib/sweep/sweepRecord';
import { describePoint, expandSweep, type SweepJob } from '../../lib/sweep/sweepRuns';
import { parseSweepSpec, type SweepSpec } from '../../lib/sweep/sweepSpec';
import { estimateRunMemory, formatBytes } from '../../lib/run/runMemory';
import { isInputError } from '../../lib/inputError';
import { UsageError, type OptionSpec, type ParsedArgs } from '../args';
import { DEFAULT_MEMORY_BUDGET, parseByteSize } from '../byteSize';
import { CLI_RUNTIME_BYTES } from './run';
import { EXIT_INTERRUPTED, EXIT_OK, type Command, type CommandIO } from '../command';
import { lockDirectory } from '../dirLock';
import { guardOutputs } from '../outputGuard';
import { appendRecord, openRunsLog, readRunsLog } from '../sweep/runsLog';
import { defaultJobs, runInPool } from '../sweep/workerPool';
import { fitsText, writeResults } from '../sweep/writeResults';

const options: OptionSpec[] = [
  { name: 'out', kind: 'text', value: 'DIR', help: 'results directory (default: SPEC without .json, plus "-results")' },
  {
    name: 'jobs',
    kind: 'count',
    value: 'N',
    help: `runs at a time, one worker thread each (default: cores − 1, at least 1; here ${defaultJobs()})`,
  },
  {
    name: 'shard',
    kind: 'text',
    value: 'i/n',
    help: 'run only shard i of n (i from 0): the runs whose index is i modulo n',
  },
  { name: 'list', kind: 'flag', help: 'list the runs (id, index, shard, values, seed, finished or not) and exit' },
  { name: 'quiet', kind: 'flag', help: 'no line per finished run on standard error' },
  {
    name: 'memory-budget',
    kind: 'text',
    value: 'SIZE',
    help: 'refuse a sweep whose runs at a time (--jobs) would need more than SIZE,\ne.g. 8GiB (default 2GiB)',
  },
];

/** What each worker thread takes besides its run (its own JavaScript heap and loader: about 40 MiB measured). */
export const WORKER_RUNTIME_BYTES = 48 * 2 ** 20;

export const sweepCommand: Command = {
  name: 'sweep',
  summary: 'many runs from a JSON spec, in parallel, resumable and splittable: table and scaling fits',
  usage: 'stria sweep SPEC [--out DIR] [--jobs N] [--shard i/n] [--list] [--quiet] [--memory-budget SIZE]',
  description: `
Runs every combination of the swept values (one or two parameters) times the replicas (seeds
base seed, base seed + 1, ...), each for the spec's length, and appends one JSON line per finished
run to DIR/runs.jsonl: its id, swept values, seed, parameters, run plan, status, summary and wall
time. A run's id is a digest of its parameters (seed included) and its run plan, so rerunning the
same command after an interruption skips the finished runs and does the rest.

When the runs are done (those of the shard, with --shard) it writes DIR/table.csv and
DIR/table.json (one row per run) and DIR/fits.json: jet_spacing against the Rhines length 2pi/k_rhines
and u_rms against (eps/mu)^1/2, as power laws fitted in log-log with bootstrap percentile
intervals. Shards written to separate directories are joined by stria merge.

The spec format is in docs/cli.md; its fields are checked before anything runs, and a refused
field is named.`,
  examples: `
  # sweep.json: beta over three values, two seeds each, 32 x 32, until t = 150
  {
    "base": { "nx": 32, "ny": 32, "kf": 8, "dkf": 1.5, "mu": 0.05, "eps": 0.05,
              "nu": 1e-8, "nu_order": 4, "dt": 0.05, "cfl": 0.8 },
    "vary": [ { "param": "beta", "logRange": { "from": 5, "to": 20, "count": 3 } } ],
    "replicas": 2,
    "length": { "until": 150 },
    "average": 75
  }

  stria sweep sweep.json --out beta-sweep --jobs 2
  stria sweep sweep.json --out beta-sweep-0 --shard 0/4     # one of four cluster jobs`,
  options,
  run,
};

/** Read and check a spec file: refused specs and unreadable files become usage errors. */
export function readSpec(path: string): { spec: SweepSpec; text: string } {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new UsageError(`cannot read the spec ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new UsageError(`${path} is not JSON (${(e as Error).message})`);
  }
  try {
    return { spec: parseSweepSpec(json), text };
  } catch (e) {
    if (isInputError(e, 'sweep spec')) throw new UsageError(`${path}: ${e.field}: ${e.reason}`);
    throw e;
  }
}

async function run(args: ParsedArgs, io: CommandIO): Promise<number> {
  const o = args.options;
  if (args.positionals.length !== 1)
    throw new UsageError(
      args.positionals.length
        ? `expected one SPEC, got ${args.positionals.length}`
        : 'give the sweep spec: stria sweep SPEC',
    );
  const specPath = args.positionals[0];
  const { spec, text } = readSpec(specPath);
  let jobs: SweepJob[];
  try {
    jobs = expandSweep(spec);
  } catch (e) {
    if (isInputError(e, 'sweep spec')) throw new UsageError(`${specPath}: ${e.field}: ${e.reason}`);
    throw e;
  }
  let shard: Shard | null = null;
  if (o.shard !== undefined) {
    try {
      shard = parseShard(o.shard as string);
    } catch (e) {
      throw new UsageError(`--shard ${(e as Error).message}`);
    }
  }
  const mine = selectShard(jobs, shard);
  const dir =
    (o.out as string | undefined) ?? join(dirname(specPath), `${basename(specPath, extname(specPath))}-results`);
  const log = join(dir, 'runs.jsonl');
  const journal = readRunsLog(log).records;
  // Finished runs of this sweep, from the journal (deduplicated, conflicts refused).
  const finished = new Map(joinRecords([{ name: log, records: journal }]).map((r) => [r.id, r]));
  if (o.list) {
    io.out.write(listText(jobs, shard, finished));
    return EXIT_OK;
  }
  const todo = mine.filter((j) => !finished.has(j.id));
  const jobsN = Math.min((o.jobs as number | undefined) ?? defaultJobs(), Math.max(1, todo.length));
  // Before anything is written: a sweep that cannot fit leaves no trace.
  checkSweepMemory(todo, jobsN, memoryBudgetOf(o['memory-budget'] as string | undefined));
  guardOutputs([{ option: '--out', path: dir, kind: 'folder' }], [], { overwrite: false, choices: '' });
  mkdirSync(dir, { recursive: true });
  // One sweep at a time in a directory; the journal is read again under the lock.
  const lock = lockDirectory(dir, 'stria sweep', (line) => io.err.write(`stria sweep: ${line}\n`));
  try {
    return await sweepLocked(io, o, { spec, text, dir, log, mine, shard, jobs: jobsN });
  } finally {
    lock.release();
  }
}

/** The sweep proper, with the directory's lock held. */
async function sweepLocked(
  io: CommandIO,
  o: ParsedArgs['options'],
  s: { spec: SweepSpec; text: string; dir: string; log: string; mine: SweepJob[]; shard: Shard | null; jobs: number },
): Promise<number> {
  const { spec, text, dir, log, mine, shard } = s;
  // Another sweep may have finished runs between the first read and the lock.
  const finished = new Map(joinRecords([{ name: log, records: readRunsLog(log).records }]).map((r) => [r.id, r]));
  const todo = mine.filter((j) => !finished.has(j.id));
  const jobsN = Math.min(s.jobs, Math.max(1, todo.length));
  writeFileSync(join(dir, 'spec.json'), text);
  const dropped = openRunsLog(log);
  if (dropped) io.err.write(`stria sweep: dropped an unfinished last line (${dropped} bytes) of ${log}\n`);
  io.err.write(
    `stria sweep: ${mine.length} runs${shard ? ` in shard ${shard.index}/${shard.count}` : ''}, ${mine.length - todo.length} already finished, ${todo.length} to run on ${jobsN} worker${jobsN === 1 ? '' : 's'}\n`,
  );
  let done = mine.length - todo.length;
  const { interrupted } = await runInPool(todo, {
    size: jobsN,
    interrupted: io.interrupted,
    onRecord: (r) => {
      appendRecord(log, r);
      finished.set(r.id, r);
      done++;
      if (!o.quiet)
        io.err.write(
          `[${done}/${mine.length}] ${r.id} ${describePoint(r.point)}, seed ${r.seed}: ${r.status === 'done' ? (r.stopped === 'not-steady' ? 'done, not steady by its cap' : 'done') : `blew up (${r.error})`} in ${r.wall_seconds.toFixed(1)} s\n`,
        );
    },
  });
  const records = mine.map((j) => finished.get(j.id)).filter((r): r is SweepRecord => r !== undefined);
  const fits = writeResults(dir, records, spec.fits);
  io.out.write(
    `${records.length} of ${mine.length} runs in ${dir}: runs.jsonl, table.csv, table.json, fits.json\n${fitsText(fits)}`,
  );
  if (interrupted) {
    io.err.write(
      `stria sweep: interrupted; run the same command again to finish the remaining ${mine.length - records.length} runs\n`,
    );
    return EXIT_INTERRUPTED;
  }
  const blown = records.filter((r) => r.status !== 'done').length;
  // A blow-up is a result of the sweep (its parameters are unstable), not a failure of the command.
  if (blown)
    io.err.write(
      `stria sweep: ${blown} run${blown === 1 ? '' : 's'} blew up (status "blew-up" in the table, left out of the fits)\n`,
    );
  return EXIT_OK;
}

function memoryBudgetOf(text: string | undefined): number {
  if (text === undefined) return DEFAULT_MEMORY_BUDGET;
  const bytes = parseByteSize(text);
  if (!Number.isFinite(bytes))
    throw new UsageError(`--memory-budget ${text}: needs a size such as 512MiB, 8GiB or 2000000000 (bytes)`);
  return bytes;
}

/**
 * The `jobs` largest runs at once, each in its worker, must fit the budget: refused before any
 * worker starts, with the estimate and the number of workers that would fit.
 */
function checkSweepMemory(todo: readonly SweepJob[], jobs: number, budget: number): void {
  if (todo.length === 0) return;
  const perRun = todo.map((j) => estimateRunMemory(j.params).totalBytes + WORKER_RUNTIME_BYTES).sort((a, b) => b - a);
  const need = CLI_RUNTIME_BYTES + perRun.slice(0, jobs).reduce((s, x) => s + x, 0);
  if (need <= budget) return;
  let fit = 0;
  for (let sum = CLI_RUNTIME_BYTES; fit < jobs && sum + perRun[fit] <= budget; fit++) sum += perRun[fit];
  const largest = todo.reduce((a, j) => (j.params.nx * j.params.ny > a.params.nx * a.params.ny ? j : a));
  throw new UsageError(
    `${jobs} runs at a time need about ${formatBytes(need)} (the largest, ${largest.params.nx} × ${largest.params.ny}, about ${formatBytes(perRun[0])} with its worker), more than the memory budget of ${formatBytes(budget)}: ` +
      (fit > 0
        ? `give --jobs ${fit} or a larger --memory-budget`
        : 'even one run does not fit: give a larger --memory-budget or smaller grids'),
  );
}

function listText(jobs: readonly SweepJob[], shard: Shard | null, finished: ReadonlyMap<string, SweepRecord>): string {
  const n = shard?.count ?? 1;
  const lines = jobs
    .filter((j) => !shard || j.index % n === shard.index)
    .map(
      (j) =>
        `${j.id}  ${String(j.index).padStart(4)}  shard ${j.index % n}/${n}  ${describePoint(j.point)}, seed ${j.seed}  ${finished.has(j.id) ? 'finished' : 'to run'}`,
    );
  return `${lines.join('\n')}\n`;
}
