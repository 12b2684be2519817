import { resolve } from 'node:path';
import { writeFileSync } from 'node:fs';
import { encodeRunFile } from '../../lib/io/runFile';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import {
  blowUpReport,
  DEFAULT_MAX_RETRIES,
  describeBlowUp,
  type BlowUpPolicy,
  type RetryRecord,
} from '../../lib/run/blowUpRetry';
import { MonitoredRun, type RunOrigin } from '../../lib/run/monitoredRun';
import { runId } from '../../lib/run/runId';
import { checkMemoryBudget, estimateRunMemory, MemoryBudgetError } from '../../lib/run/runMemory';
import { describeStopRule, resolveRunPlan, type RunLengthRequest, type RunPlan } from '../../lib/run/runPlan';
import type { RunProgress } from '../../lib/run/runProgress';
import { isInputError } from '../../lib/inputError';
import { lengthText, timeText } from '../../lib/plan/format';
import { UsageError, type OptionSpec, type ParsedArgs } from '../args';
import { DEFAULT_MEMORY_BUDGET, parseByteSize } from '../byteSize';
import { CheckpointStore, readCheckpoint } from '../checkpointStore';
import { EXIT_FAILED, EXIT_INTERRUPTED, EXIT_OK, type Command, type CommandIO } from '../command';
import { resolveRunStart } from '../paramInput';
import { historyCommand } from '../historyCommand';
import { guardOutputs, identity, type InputPath, type OutputPath } from '../outputGuard';
import { ProgressBar } from '../progressBar';
import { checkSameRun } from '../resumeCheck';
import { RunDriver } from '../runDriver';
import { RunOutputs, type OutputCounts } from '../runOutputs';
import { runReport } from '../runReport';
import { startStepThreads } from '../stepThreads';
import { THREADS_OPTION, threadsFor } from '../threadsOption';
import { striaVersion } from '../version';

/** Steps between checkpoints when --checkpoint-every-steps is not given. */
export const DEFAULT_CHECKPOINT_EVERY = 1000;
/** What the command line itself takes (Node and the TypeScript loader: about 100 MiB measured). */
export const CLI_RUNTIME_BYTES = 128 * 2 ** 20;

const options: OptionSpec[] = [
  {
    name: 'preset',
    kind: 'text',
    value: 'ID',
    help: 'start from a demo scenario: jets, few-jets, many-jets, deformation, isotropic',
  },
  {
    name: 'set',
    kind: 'list',
    value: 'KEY=VALUE',
    help: 'set a parameter (repeatable): beta, kd, mu, nu, nu_order, kf, dkf, eps,\nLx, Ly, nx, ny, dt, cfl, seed, forcing, force_zonal, mu_ls, k_ls, init_energy,\nlayers (1 or 2), shear, depth_ratio (two layers: docs/two-layer.md)',
  },
  { name: 'steps', kind: 'count', value: 'N', help: 'take N steps' },
  {
    name: 'until',
    kind: 'number',
    value: 'T',
    help: 'step until model time T (absolute: a saved run resumed stops at T too)',
  },
  {
    name: 'until-steady',
    kind: 'flag',
    help: 'step until statistically steady (criterion below), at most until --max-time',
  },
  { name: 'steady-tol', kind: 'number', value: 'X', help: 'relative tolerance of the steady criterion (default 0.05)' },
  {
    name: 'steady-window',
    kind: 'number',
    value: 'T',
    help: 'window of the steady criterion, in model time (default 1/(2 mu),\nthe spin-up time)',
  },
  {
    name: 'max-time',
    kind: 'number',
    value: 'T',
    help: 'give up on steadiness at model time T (default start + 20 windows)',
  },
  {
    name: 'average',
    kind: 'number',
    value: 'T',
    help: 'average the summary over the last T model time units\n(default 1/mu, or 50 if mu = 0, at most the length of the run)',
  },
  {
    name: 'sample-interval',
    kind: 'number',
    value: 'T',
    help: 'sample the zonal means every T model time units, a time, not a\nstep count (default 10 dt)',
    aliases: ['sample-every'],
  },
  {
    name: 'snapshots',
    kind: 'text',
    value: 'FILE',
    help: 'write gridded snapshots (q, zeta, psi, u, v) to a NetCDF file',
  },
  {
    name: 'snapshot-every-steps',
    kind: 'count',
    value: 'K',
    help: 'a snapshot every K steps, a step count, not a time (with --snapshots)',
    aliases: ['every'],
  },
  {
    name: 'zonal',
    kind: 'text',
    value: 'FILE',
    help: 'write the zonal-mean time series (one record per sample) to a NetCDF file',
  },
  {
    name: 'save',
    kind: 'text',
    value: 'FILE',
    help: 'save the final state as a run file, to resume with stria run FILE',
  },
  {
    name: 'checkpoint',
    kind: 'text',
    value: 'FILE',
    help: 'keep a checkpoint of the run in FILE (replaced atomically), every\n--checkpoint-every-steps steps, at the end and on Ctrl-C',
  },
  {
    name: 'checkpoint-every-steps',
    kind: 'count',
    value: 'K',
    help: `steps between checkpoints, a step count: at multiples of K of the\nstep count (default ${DEFAULT_CHECKPOINT_EVERY}; also the in-memory checkpoints of\n--on-blowup retry)`,
    aliases: ['checkpoint-every'],
  },
  {
    name: 'resume',
    kind: 'text',
    value: 'FILE',
    help: 'continue the run that wrote the checkpoint FILE, bit for bit: give the\nsame command as it, plus --resume FILE',
  },
  {
    name: 'overwrite',
    kind: 'flag',
    help: 'start afresh over output files and a checkpoint that already exist\n(without it, or --resume, the run refuses to replace them)',
  },
  {
    name: 'on-blowup',
    kind: 'text',
    value: 'stop|retry',
    help: 'on a blow-up, stop with its report (default), or go back to the last\ncheckpoint with half the time step (and half the CFL target)',
  },
  {
    name: 'max-retries',
    kind: 'number',
    value: 'N',
    help: `most retries in the run with --on-blowup retry (default ${DEFAULT_MAX_RETRIES})`,
  },
  {
    name: 'memory-budget',
    kind: 'text',
    value: 'SIZE',
    help: 'refuse a run whose memory estimate exceeds SIZE, e.g. 512MiB, 4GiB\n(default 2GiB)',
  },
  {
    name: 'json',
    kind: 'flag',
    help: 'print the run summary as JSON (the summary object, stable keys,\nthen retries and blow_up)',
  },
  THREADS_OPTION,
];

/** Option name of each RunPlan field, for error messages. */
const OPTION_OF: Record<string, string> = {
  steps: '--steps',
  until: '--until',
  untilSteady: '--until-steady',
  steadyTolerance: '--steady-tol',
  steadyWindow: '--steady-window',
  maxTime: '--max-time',
  average: '--average',
  sampleEvery: '--sample-interval',
  length: '--steps, --until or --until-steady',
};

export const runCommand: Command = {
  name: 'run',
  summary: 'one run of the model, measured: summary, NetCDF snapshots and zonal means',
  usage: 'stria run [FILE] [--preset ID] [--set KEY=VALUE]... (--steps N | --until T | --until-steady) [options]',
  description: `
Runs the model from rest (or from the saved state in FILE) and prints the run summary: energy,
u_rms, k_rhines, k_beta, zonostrophy_index, jet_count, jet_spacing, ... (model units), averaged over
the last --average time units. FILE is a JSON object of parameters or a run file written by --save.
Parameters are layered: the defaults, then --preset, then FILE, then each --set. Hyperviscosity
follows the grid: when nx or ny changes and --set does not give nu, nu is rescaled so that its
damping rate at the largest kept wavenumber stays the same (said on standard error).

Steady criterion (--until-steady): time from the start is cut into consecutive windows of length W
(--steady-window, default 1/(2 mu)); at the end of each window its time-mean energy is compared with
the previous window's, and the run is steady when they differ by at most --steady-tol (default 5%)
of their mean. From rest that first happens about 5 windows in (t = 2.5/mu), when the energy is
within 1% of its steady value. If --max-time comes first, the run stops there and says it did not
become steady. The default --average, 1/mu, is then the last two windows.

NetCDF files grow one record at a time and are readable while the run goes on. A progress bar
shows on standard error when it is a terminal. Ctrl-C stops at the next step boundary, closes the
files, saves (--save) and prints the summary of what was run.

Long runs: --checkpoint FILE keeps the state and the measurement so far, replaced atomically (a
kill at any moment leaves the previous checkpoint whole); after a crash or a kill, the same command
plus --resume FILE continues bit for bit, the NetCDF files included. A blow-up (non-finite state or
CFL number past its limit) stops with its report (exit 1), or with --on-blowup retry goes back to
the last checkpoint with half the time step, at most --max-retries times. A grid whose memory
estimate exceeds --memory-budget is refused before anything is allocated.`,
  examples: `
  # the demo jets on a 64 x 64 grid until t = 200, zonal means every 0.5, summary as JSON
  stria run --preset jets --set nx=64 --set ny=64 --set kf=16 --until 200 \\
      --sample-interval 0.5 --zonal jets-zonal.nc --json

  # run until steady, snapshots every 500 steps, then continue the saved run to t = 800
  stria run --preset jets --until-steady --snapshots jets.nc --snapshot-every-steps 500 --save jets-run.json
  stria run jets-run.json --until 800

  # an hour-long run that survives being killed: checkpoint every 2000 steps, then resume
  stria run --preset jets --until 5000 --zonal z.nc --checkpoint ck.json --checkpoint-every-steps 2000
  stria run --preset jets --until 5000 --zonal z.nc --checkpoint ck.json --checkpoint-every-steps 2000 --resume ck.json`,
  options,
  run,
};

async function run(args: ParsedArgs, io: CommandIO): Promise<number> {
  const o = args.options;
  if (args.positionals.length > 1)
    throw new UsageError(`expected at most one FILE, got ${args.positionals.map((p) => `"${p}"`).join(', ')}`);
  if ((o.snapshots === undefined) !== (o['snapshot-every-steps'] === undefined))
    throw new UsageError(
      o.snapshots === undefined
        ? '--snapshot-every-steps needs --snapshots FILE'
        : '--snapshots needs --snapshot-every-steps K (steps between snapshots)',
    );
  const policy = blowUpPolicy(o);
  const budget = memoryBudget(o);
  const checkpointEvery = (o['checkpoint-every-steps'] as number | undefined) ?? DEFAULT_CHECKPOINT_EVERY;
  const start = resolveRunStart({
    file: args.positionals[0],
    preset: o.preset as string | undefined,
    sets: o.set as string[] | undefined,
  });
  if (start.rescaledNu)
    io.err.write(
      `stria run: hyperviscosity nu rescaled from ${start.rescaledNu.from} to ${start.rescaledNu.to} for the ${start.params.nx} × ${start.params.ny} grid, so its damping rate at k_max stays the same (--set nu=VALUE keeps a nu of your own)\n`,
    );
  if (start.units.kind === 'physical' && (o.snapshots !== undefined || o.zonal !== undefined))
    io.err.write(
      `stria run: NetCDF in physical units from ${args.positionals[0]}: one model length is ${lengthText(start.units.metresPerLength)}, one model time ${timeText(start.units.secondsPerTime)}\n`,
    );
  if (o.resume !== undefined && o.overwrite)
    throw new UsageError(
      '--resume and --overwrite exclude each other: continue the run that wrote the checkpoint, or start afresh',
    );
  const resumed = o.resume === undefined ? null : readCheckpoint(o.resume as string);
  // Before anything is written: every output a file of its own, none replaced unasked.
  guardRunOutputs(o, args.positionals[0], resumed?.progress ?? null);
  // The run as the command asks for it: its parameters, where it starts, and its plan.
  const origin: RunOrigin = resumed
    ? resumed.progress.origin
    : { time: start.checkpoint?.time ?? 0, steps: start.checkpoint?.steps ?? 0 };
  const plan = runPlanOf(start.params, o, origin);
  if (resumed) checkSameRun(o.resume as string, start.params, plan, resumed.progress);
  const params = resumed ? resumed.checkpoint.params : start.params;
  checkMemory(params, budget, {
    snapshots: o.snapshots !== undefined,
    zonal: o.zonal !== undefined,
    retry: policy.kind === 'retry',
    checkpointFile: o.checkpoint !== undefined,
  });

  // Every core by default (docs/threads.md); the bits do not depend on the number.
  const threadCount = threadsFor(o, params);
  const helpers = threadCount > 1 ? await startStepThreads(threadCount) : null;
  const threads = helpers?.threads ?? null;
  let ran: Awaited<ReturnType<typeof runOnThreads>>;
  try {
    ran = await runOnThreads();
  } finally {
    await helpers?.close();
  }
  const { outcome, monitored, outputs, driver, store } = ran;

  async function runOnThreads() {
    let model: Model;
    if (resumed) model = Model.restore(resumed.checkpoint, threads);
    else if (start.checkpoint)
      model = Object.keys(start.changes).length
        ? Model.restore(start.checkpoint, threads).reconfigure(start.changes)
        : Model.restore(start.checkpoint, threads);
    else model = new Model(start.params, false, threads);
    if (model.threadCount < threadCount)
      io.err.write(`stria run: the step threads could not start: stepping on ${model.threadCount} thread\n`);
    const createdAt = resumed?.progress.outputs.created_at ?? new Date().toISOString();
    // The history of the files: the command and options, files by their names only (historyCommand.ts).
    const command = resumed?.progress.outputs.command ?? historyCommand('run', io.argv.slice(1), options);
    const request = {
      snapshots: o.snapshots as string | undefined,
      every: o['snapshot-every-steps'] as number | undefined,
      zonal: o.zonal as string | undefined,
    };
    // The NetCDF files record the threads of the run that began them (a resumed run keeps its headers).
    const filesThreads = resumed ? resumed.progress.outputs.threads : model.threadCount;
    const outputs = new RunOutputs(
      start.params,
      request,
      {
        params: start.params,
        striaVersion: striaVersion(),
        createdAt,
        command,
        units: start.units,
        threads: filesThreads,
      },
      resumed ? keptRecords(resumed.progress, request, io) : {},
    );
    const monitored = new MonitoredRun(model, plan, outputs.hooks(), origin);
    if (resumed) restoreMeasurement(monitored, resumed.progress, io);
    const retries: RetryRecord[] = resumed ? resumed.progress.retries : [];
    const store =
      o.checkpoint === undefined
        ? null
        : new CheckpointStore(o.checkpoint as string, {
            id: runId(start.params, plan),
            params: start.params,
            plan,
            origin,
            createdAt,
            command,
            threads: filesThreads,
          });
    if (resumed)
      io.err.write(
        `stria run: resumed from ${o.resume} at t = ${model.time.toPrecision(6)}, step ${model.steps}${retries.length ? ` (after ${retries.length} retr${retries.length === 1 ? 'y' : 'ies'})` : ''}\n`,
      );

    const bar = 'isTTY' in io.err && io.err.isTTY ? new ProgressBar(io.err, 'stria run') : null;
    const driver = new RunDriver(
      monitored,
      outputs,
      {
        policy,
        checkpointEvery,
        store,
        threads,
        interrupted: io.interrupted,
        log: (line) => {
          bar?.done();
          io.err.write(`stria run: ${line}\n`);
        },
        onProgress: (r) => bar?.update(r.progress(), `t = ${r.model.time.toPrecision(4)}, step ${r.model.steps}`),
      },
      retries,
    );
    let outcome;
    try {
      outcome = await driver.drive();
    } finally {
      bar?.done();
      outputs.close();
    }
    return { outcome, monitored, outputs, driver, store };
  }
  const model = monitored.model;
  if (o.save) writeFileSync(o.save as string, encodeRunFile(model.checkpoint(), new Date(), model.threadCount));
  const blowUp = outcome.kind === 'blew-up' ? blowUpReport(outcome.error) : null;
  io.out.write(runReport(monitored.summary(), driver.retries, blowUp, o.json === true));
  const written = [
    outputs.describe(),
    o.save ? `state saved to ${o.save}` : '',
    store?.written ? `checkpoint in ${store.path} at step ${model.steps}` : '',
  ]
    .filter(Boolean)
    .join('; ');
  if (written) io.err.write(`stria run: ${written}\n`);
  if (driver.retries.length && outcome.kind !== 'blew-up')
    io.err.write(
      `stria run: recovered after ${driver.retries.length} retr${driver.retries.length === 1 ? 'y' : 'ies'}; dt is now ${model.params.dt.toPrecision(4)}\n`,
    );
  if (outcome.kind === 'blew-up') {
    io.err.write(
      `stria run: error: ${describeBlowUp(blowUp!)}; the summary is of the last good state${store?.written ? `, and ${store.path} holds the last checkpoint before it` : ''}\n`,
    );
    return EXIT_FAILED;
  }
  if (outcome.kind === 'checkpoint-failed') {
    io.err.write(`stria run: error: ${outcome.error.message}; stopped at t = ${model.time}, step ${model.steps}\n`);
    return EXIT_FAILED;
  }
  if (outcome.kind === 'interrupted') {
    io.err.write(
      `stria run: interrupted at t = ${model.time}, step ${model.steps}${store ? `; resume with the same command plus --resume ${store.path}` : ''}\n`,
    );
    return EXIT_INTERRUPTED;
  }
  if (monitored.stopped === 'not-steady') {
    const [a, b] = monitored.steady!.lastPair;
    io.err.write(
      `stria run: not steady by t = ${model.time.toPrecision(6)}: the last two window means of the energy were ${a.toPrecision(4)} and ${b.toPrecision(4)}\n`,
    );
  }
  if (monitored.stopped === 'steady')
    io.err.write(
      `stria run: steady at t = ${monitored.steady!.steadyAt!.toPrecision(6)} (${describeStopRule(plan.stop)})\n`,
    );
  return EXIT_OK;
}

/**
 * The run's outputs through the one output guard (outputGuard.ts). A resumed run continues the
 * NetCDF files its checkpoint counted and rewrites its checkpoint and saved state; any other file
 * that exists is replaced only with --overwrite. The checkpoint may be the --resume file itself.
 */
function guardRunOutputs(o: ParsedArgs['options'], file: string | undefined, progress: RunProgress | null): void {
  const saved = progress?.outputs;
  const same = (a: string | undefined, b: string | undefined) =>
    a !== undefined && b !== undefined && identity(a) === identity(b);
  const outputs: OutputPath[] = [];
  const add = (option: string, continues: boolean) => {
    const path = o[option] as string | undefined;
    if (path !== undefined) outputs.push({ option: `--${option}`, path, kind: 'file', continues });
  };
  add('snapshots', same(o.snapshots as string | undefined, saved?.snapshots?.path));
  add('zonal', same(o.zonal as string | undefined, saved?.zonal?.path));
  add('save', progress !== null);
  add('checkpoint', same(o.checkpoint as string | undefined, o.resume as string | undefined));
  const inputs: InputPath[] = [];
  if (file !== undefined) inputs.push({ option: 'FILE', path: file });
  if (o.resume !== undefined)
    inputs.push({ option: '--resume', path: o.resume as string, sharedWith: ['--checkpoint'] });
  const checkpoint = o.checkpoint as string | undefined;
  guardOutputs(outputs, inputs, {
    overwrite: o.overwrite === true,
    choices: checkpoint
      ? `--resume ${checkpoint} to continue the run that wrote it, or --overwrite to start afresh over it`
      : '--overwrite to start afresh over it, or another name (a run kept with --checkpoint can be continued with --resume)',
  });
}

function blowUpPolicy(o: ParsedArgs['options']): BlowUpPolicy {
  const mode = (o['on-blowup'] as string | undefined) ?? 'stop';
  if (mode !== 'stop' && mode !== 'retry') throw new UsageError(`--on-blowup ${mode}: must be stop or retry`);
  const max = o['max-retries'] as number | undefined;
  if (max !== undefined && !(Number.isInteger(max) && max >= 0))
    throw new UsageError(`--max-retries needs a whole number ≥ 0, got ${max}`);
  if (max !== undefined && mode !== 'retry') throw new UsageError('--max-retries applies only with --on-blowup retry');
  return mode === 'stop' ? { kind: 'stop' } : { kind: 'retry', maxRetries: max ?? DEFAULT_MAX_RETRIES };
}

function memoryBudget(o: ParsedArgs['options']): number {
  const text = o['memory-budget'] as string | undefined;
  if (text === undefined) return DEFAULT_MEMORY_BUDGET;
  const bytes = parseByteSize(text);
  if (!Number.isFinite(bytes))
    throw new UsageError(`--memory-budget ${text}: needs a size such as 512MiB, 4GiB or 2000000000 (bytes)`);
  return bytes;
}

function checkMemory(p: ModelParams, budget: number, req: Parameters<typeof estimateRunMemory>[1]): void {
  try {
    checkMemoryBudget(
      estimateRunMemory(p, { ...req, runtimeBytes: CLI_RUNTIME_BYTES }),
      budget,
      `nx = ${p.nx}, ny = ${p.ny}: this run`,
    );
  } catch (e) {
    if (e instanceof MemoryBudgetError)
      throw new UsageError(`${e.message}; give a smaller grid, fewer outputs or a larger --memory-budget`);
    throw e;
  }
}

/** Records to keep in each file a resumed run continues: those its checkpoint counted, same file only. */
function keptRecords(
  progress: RunProgress,
  req: { snapshots?: string; every?: number; zonal?: string },
  io: CommandIO,
): Partial<OutputCounts> {
  const keep: Partial<OutputCounts> = {};
  const saved = progress.outputs;
  if (req.snapshots !== undefined && saved.snapshots && resolve(saved.snapshots.path) === resolve(req.snapshots)) {
    if (saved.snapshots.every !== req.every)
      throw new UsageError(
        `--snapshot-every-steps ${req.every}: the checkpoint's run wrote a snapshot every ${saved.snapshots.every} steps to ${req.snapshots}`,
      );
    keep.snapshots = saved.snapshots.records;
  } else if (req.snapshots !== undefined)
    io.err.write(`stria run: ${req.snapshots} is new to this run: it starts at the resume point\n`);
  if (req.zonal !== undefined && saved.zonal && resolve(saved.zonal.path) === resolve(req.zonal))
    keep.zonal = saved.zonal.records;
  else if (req.zonal !== undefined)
    io.err.write(`stria run: ${req.zonal} is new to this run: it starts at the resume point\n`);
  return keep;
}

/** The measurement saved with the checkpoint; one that does not fit is dropped, with a warning. */
function restoreMeasurement(run: MonitoredRun, progress: RunProgress, io: CommandIO): void {
  if (!progress.measurement) {
    io.err.write('stria run: the checkpoint holds no measurement: the summary covers the run from the resume point\n');
    return;
  }
  try {
    run.restoreState(progress.measurement);
  } catch (e) {
    if (!isInputError(e, 'state')) throw e;
    io.err.write(
      `stria run: the checkpoint's measurement does not fit this Stria (${e.message}): the summary covers the run from the resume point\n`,
    );
  }
}

function runPlanOf(params: ModelParams, o: ParsedArgs['options'], start: RunOrigin): RunPlan {
  const req: RunLengthRequest = {
    steps: o.steps as number | undefined,
    until: o.until as number | undefined,
    untilSteady: o['until-steady'] as boolean | undefined,
    steadyTolerance: o['steady-tol'] as number | undefined,
    steadyWindow: o['steady-window'] as number | undefined,
    maxTime: o['max-time'] as number | undefined,
    average: o.average as number | undefined,
    sampleEvery: o['sample-interval'] as number | undefined,
  };
  try {
    return resolveRunPlan(params, req, start.time, start.steps);
  } catch (e) {
    if (!isInputError(e, 'run length')) throw e;
    const option = OPTION_OF[e.field] ?? e.field;
    // Say it in the command's words: the option names, not the fields of a RunPlan.
    const message = e.message.replace(
      /\b(steps|until|untilSteady|steadyTolerance|steadyWindow|maxTime|average|sampleEvery)\b/g,
      (k) => OPTION_OF[k] ?? k,
    );
    throw new UsageError(message.includes(option) ? message : `${option}: ${message}`);
  }
}
