import { existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { canonicalJson } from '../../lib/run/runId';
import { joinRecords } from '../../lib/sweep/sweepRecord';
import { parseSweepSpec, type SweepSpec } from '../../lib/sweep/sweepSpec';
import { isInputError } from '../../lib/inputError';
import { UsageError, type OptionSpec, type ParsedArgs } from '../args';
import { EXIT_OK, type Command, type CommandIO } from '../command';
import { lockDirectory } from '../dirLock';
import { guardOutputs, identity } from '../outputGuard';
import { readRunsLog, writeRunsLog } from '../sweep/runsLog';
import { fitsText, writeResults } from '../sweep/writeResults';

const options: OptionSpec[] = [
  {
    name: 'out',
    kind: 'text',
    value: 'DIR',
    help: 'directory of the merged results (required; may be one of the inputs)',
  },
  {
    name: 'overwrite',
    kind: 'flag',
    help: 'replace the runs.jsonl an --out directory holds when it is not one of the inputs',
  },
];

export const mergeCommand: Command = {
  name: 'merge',
  summary: 'join sweep directories (shards, or parts run elsewhere) into one: runs, table and fits',
  usage: 'stria merge DIR... --out DIR [--overwrite]',
  description: `
Reads DIR/runs.jsonl of every directory given (or the .jsonl files themselves), joins the runs by
id, and writes the joined runs.jsonl, table.csv, table.json and fits.json to --out, in sweep order.
A run present in several directories is kept once. Runs are deterministic, so two records of one
id must agree on everything the computation decides (parameters, plan, status, every number of the
summary, bit for bit): if they do not, merge refuses, naming the run and the two directories, and
writes nothing. Only the wall time and the finishing time may differ.

The fits use the "fits" options of the spec.json the directories hold (stria sweep writes it);
when the directories hold different specs, merge says so and uses the first one's.`,
  examples: `
  # four shards of one sweep, run as a job array, then joined
  stria merge beta-sweep-0 beta-sweep-1 beta-sweep-2 beta-sweep-3 --out beta-sweep`,
  options,
  run,
};

async function run(args: ParsedArgs, io: CommandIO): Promise<number> {
  const out = args.options.out as string | undefined;
  if (args.positionals.length === 0)
    throw new UsageError('give the directories to merge: stria merge DIR... --out DIR');
  if (out === undefined) throw new UsageError('--out DIR is required: where the merged results go');
  const sources = args.positionals.map((p) => {
    const file = existsSync(p) && statSync(p).isDirectory() ? join(p, 'runs.jsonl') : p;
    if (!existsSync(file)) throw new UsageError(`${p}: no runs.jsonl there (is it a sweep directory?)`);
    const { records, partialTail } = readRunsLog(file);
    if (partialTail) io.err.write(`stria merge: ${file}: ignoring an unfinished last line\n`);
    return { name: p, file, records, spec: readSpecBeside(p, file) };
  });
  let records;
  try {
    records = joinRecords(sources);
  } catch (e) {
    if (e instanceof RangeError) throw new Error(`conflict: ${e.message}; nothing written`, { cause: e });
    throw e;
  }
  const specs = sources.filter((s) => s.spec !== null);
  if (specs.some((s) => canonicalJson(s.spec!.json) !== canonicalJson(specs[0].spec!.json))) {
    io.err.write(
      `stria merge: the directories hold different sweep specs; the fit options of ${specs[0].name} are used\n`,
    );
  }
  const spec: SweepSpec | null = specs.length ? specs[0].spec!.spec : null;
  // The merged journal replaces --out's own only when that one is merged in too, or when asked.
  const outLog = join(out, 'runs.jsonl');
  guardOutputs([{ option: '--out', path: out, kind: 'folder' }], [], { overwrite: false, choices: '' });
  const merged = sources.some((s) => identity(s.file) === identity(outLog));
  if (existsSync(outLog) && !merged && !args.options.overwrite)
    throw new UsageError(
      `--out ${out} holds runs.jsonl of its own: add it to the directories to merge, or give --overwrite to replace it`,
    );
  mkdirSync(out, { recursive: true });
  const lock = lockDirectory(out, 'stria merge', (line) => io.err.write(`stria merge: ${line}\n`));
  let fits;
  try {
    writeRunsLog(outLog, records);
    if (specs.length) writeFileSync(join(out, 'spec.json'), specs[0].spec!.text);
    fits = writeResults(out, records, spec?.fits ?? {});
  } finally {
    lock.release();
  }
  const total = sources.reduce((n, s) => n + s.records.length, 0);
  io.out.write(
    `${records.length} runs (from ${total} records in ${sources.length} directories) in ${out}: runs.jsonl, table.csv, table.json, fits.json\n${fitsText(fits)}`,
  );
  return EXIT_OK;
}

/** The spec.json of a sweep directory, or null when there is none (or it cannot be read as a spec). */
function readSpecBeside(input: string, runsFile: string): { spec: SweepSpec; json: unknown; text: string } | null {
  const path = join(runsFile, '..', 'spec.json');
  if (!existsSync(path)) return null;
  const text = readFileSync(path, 'utf8');
  try {
    const json: unknown = JSON.parse(text);
    return { spec: parseSweepSpec(json), json, text };
  } catch (e) {
    if (e instanceof SyntaxError || isInputError(e, 'sweep spec'))
      throw new UsageError(`${input}: spec.json is not a sweep spec (${e.message})`);
    throw e;
  }
}
