import { writeFileSync } from 'node:fs';
import { encodeRunFile } from '../../lib/io/runFile';
import { Model } from '../../lib/model/model';
import { BlowUpError } from '../../lib/model/stepper';
import { MonitoredRun } from '../../lib/sweep/monitoredRun';
import { describeStopRule, resolveRunPlan, RunPlanError, type RunLengthRequest, type RunPlan } from '../../lib/sweep/runPlan';
import { UsageError, type OptionSpec, type ParsedArgs } from '../args';
import { EXIT_FAILED, EXIT_INTERRUPTED, EXIT_OK, type Command, type CommandIO } from '../command';
import { resolveRunStart } from '../paramInput';
import { Breather } from '../breather';
import { ProgressBar } from '../progressBar';
import { RunOutputs } from '../runOutputs';
import { summaryText } from '../summaryText';
import { striaVersion } from '../version';

const options: OptionSpec[] = [
  { name: 'preset', kind: 'text', value: 'ID', help: 'start from a demo scenario: jets, few-jets, many-jets, deformation, isotropic' },
  { name: 'set', kind: 'list', value: 'KEY=VALUE', help: 'set a parameter (repeatable): beta, kd, mu, nu, nu_order, kf, dkf, eps,\nLx, Ly, nx, ny, dt, cfl, seed, forcing, force_zonal, mu_ls, k_ls, init_energy' },
  { name: 'steps', kind: 'count', value: 'N', help: 'take N steps' },
  { name: 'until', kind: 'number', value: 'T', help: 'step until model time T (absolute: a saved run resumed stops at T too)' },
  { name: 'until-steady', kind: 'flag', help: 'step until statistically steady (criterion below), at most until --max-time' },
  { name: 'steady-tol', kind: 'number', value: 'X', help: 'relative tolerance of the steady criterion (default 0.05)' },
  { name: 'steady-window', kind: 'number', value: 'T', help: 'window of the steady criterion (default 1/(2 mu), the spin-up time)' },
  { name: 'max-time', kind: 'number', value: 'T', help: 'give up on steadiness at time T (default start + 20 windows)' },
  { name: 'average', kind: 'number', value: 'T', help: 'average the summary over the last T time units\n(default 1/mu, or 50 if mu = 0, at most the length of the run)' },
  { name: 'sample-every', kind: 'number', value: 'T', help: 'sample the zonal means every T time units (default 10 dt)' },
  { name: 'snapshots', kind: 'text', value: 'FILE', help: 'write gridded snapshots (q, zeta, psi, u, v) to a NetCDF file' },
  { name: 'every', kind: 'count', value: 'K', help: 'a snapshot every K steps (with --snapshots)' },
  { name: 'zonal', kind: 'text', value: 'FILE', help: 'write the zonal-mean time series (one record per sample) to a NetCDF file' },
  { name: 'save', kind: 'text', value: 'FILE', help: 'save the final state as a run file, to resume with stria run FILE' },
  { name: 'json', kind: 'flag', help: 'print the run summary as JSON (the summary object, stable keys)' },
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
  sampleEvery: '--sample-every',
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
Parameters are layered: the defaults, then --preset, then FILE, then each --set.

Steady criterion (--until-steady): time from the start is cut into consecutive windows of length W
(--steady-window, default 1/(2 mu)); at the end of each window its time-mean energy is compared with
the previous window's, and the run is steady when they differ by at most --steady-tol (default 5%)
of their mean. From rest that first happens about 5 windows in (t = 2.5/mu), when the energy is
within 1% of its steady value. If --max-time comes first, the run stops there and says it did not
become steady. The default --average, 1/mu, is then the last two windows.

NetCDF files grow one record at a time and are readable while the run goes on. A progress bar
shows on standard error when it is a terminal. Ctrl-C stops at the next step boundary, closes the
files, saves (--save) and prints the summary of what was run.`,
  examples: `
  # the demo jets on a 64 x 64 grid until t = 200, zonal means every 0.5, summary as JSON
  stria run --preset jets --set nx=64 --set ny=64 --set kf=16 --until 200 \\
      --sample-every 0.5 --zonal jets-zonal.nc --json

  # run until steady, snapshots every 500 steps, then continue the saved run to t = 800
  stria run --preset jets --until-steady --snapshots jets.nc --every 500 --save jets-run.json
  stria run jets-run.json --until 800`,
  options,
  run,
};

async function run(args: ParsedArgs, io: CommandIO): Promise<number> {
  const o = args.options;
  if (args.positionals.length > 1) throw new UsageError(`expected at most one FILE, got ${args.positionals.map((p) => `"${p}"`).join(', ')}`);
  if ((o.snapshots === undefined) !== (o.every === undefined)) throw new UsageError(o.snapshots === undefined ? '--every needs --snapshots FILE' : '--snapshots needs --every K (steps between snapshots)');
  const start = resolveRunStart({ file: args.positionals[0], preset: o.preset as string | undefined, sets: o.set as string[] | undefined });
  let model = start.checkpoint ? Model.restore(start.checkpoint) : new Model(start.params);
  if (start.checkpoint && Object.keys(start.changes).length) model = model.reconfigure(start.changes);
  const plan = runPlanOf(model, o);
  const outputs = new RunOutputs(model, { snapshots: o.snapshots as string | undefined, every: o.every as number | undefined, zonal: o.zonal as string | undefined }, {
    params: model.params,
    striaVersion: striaVersion(),
    createdAt: new Date().toISOString(),
    command: ['stria', ...io.argv].join(' '),
  });
  const monitored = new MonitoredRun(model, plan, outputs.hooks());
  const bar = 'isTTY' in io.err && io.err.isTTY ? new ProgressBar(io.err, 'stria run') : null;
  let failure: BlowUpError | null = null;
  try {
    const breather = new Breather();
    while (!monitored.advance(25)) {
      bar?.update(monitored.progress(), `t = ${model.time.toPrecision(4)}, step ${model.steps}`);
      await breather.breathe();
      if (io.interrupted()) break;
    }
  } catch (e) {
    if (!(e instanceof BlowUpError)) throw e;
    failure = e;
  } finally {
    bar?.done();
    outputs.close();
  }
  if (o.save) writeFileSync(o.save as string, encodeRunFile(model.checkpoint()));
  const summary = monitored.summary();
  io.out.write(o.json ? `${JSON.stringify(summary)}\n` : summaryText(summary));
  const written = [outputs.describe(), o.save ? `state saved to ${o.save}` : ''].filter(Boolean).join('; ');
  if (written) io.err.write(`stria run: ${written}\n`);
  if (failure) {
    io.err.write(`stria run: error: ${failure.message}; the summary is of the last good state\n`);
    return EXIT_FAILED;
  }
  if (monitored.stopped === null) {
    io.err.write(`stria run: interrupted at t = ${model.time}, step ${model.steps}\n`);
    return EXIT_INTERRUPTED;
  }
  if (monitored.stopped === 'not-steady') {
    const [a, b] = monitored.steady!.lastPair;
    io.err.write(`stria run: not steady by t = ${model.time.toPrecision(6)}: the last two window means of the energy were ${a.toPrecision(4)} and ${b.toPrecision(4)}\n`);
  }
  if (monitored.stopped === 'steady') io.err.write(`stria run: steady at t = ${monitored.steady!.steadyAt!.toPrecision(6)} (${describeStopRule(plan.stop)})\n`);
  return EXIT_OK;
}

function runPlanOf(model: Model, o: ParsedArgs['options']): RunPlan {
  const req: RunLengthRequest = {
    steps: o.steps as number | undefined,
    until: o.until as number | undefined,
    untilSteady: o['until-steady'] as boolean | undefined,
    steadyTolerance: o['steady-tol'] as number | undefined,
    steadyWindow: o['steady-window'] as number | undefined,
    maxTime: o['max-time'] as number | undefined,
    average: o.average as number | undefined,
    sampleEvery: o['sample-every'] as number | undefined,
  };
  try {
    return resolveRunPlan(model.params, req, model.time);
  } catch (e) {
    if (!(e instanceof RunPlanError)) throw e;
    const option = OPTION_OF[e.field] ?? e.field;
    // Say it in the command's words: the option names, not the fields of a RunPlan.
    const message = e.message.replace(/\b(steps|until|untilSteady|steadyTolerance|steadyWindow|maxTime|average|sampleEvery)\b/g, (k) => OPTION_OF[k] ?? k);
    throw new UsageError(message.includes(option) ? message : `${option}: ${message}`);
  }
}
