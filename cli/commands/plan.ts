import { writeFileSync } from 'node:fs';
import { guardOutputs, type OutputPath } from '../outputGuard';
import { extname } from 'node:path';
import type { RunSummary } from '../../lib/analysis/summary';
import { encodeParamsFile, type ParamsFile } from '../../lib/io/paramsFile';
import { Model } from '../../lib/model/model';
import { BlowUpError } from '../../lib/model/stepper';
import { analysePlan, type PlanAnalysis } from '../../lib/plan/analysePlan';
import type { MatchedRun } from '../../lib/plan/matchedRun';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { duration, fmt } from '../../lib/plan/format';
import { missingFields } from '../../lib/plan/planInput';
import { PLAN_PRESETS } from '../../lib/plan/planPresets';
import { planReportHtml, planReportMarkdown } from '../../lib/plan/planReport';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { resolveRunPlan } from '../../lib/run/runPlan';
import { isInputError } from '../../lib/inputError';
import { UsageError, type OptionSpec, type ParsedArgs } from '../args';
import { EXIT_FAILED, EXIT_INTERRUPTED, EXIT_OK, type Command, type CommandIO } from '../command';
import { planInputFrom } from '../planInputArgs';
import { keyedComparisonText, matchedComparisonText, planJson, planText } from '../planOutput';
import { DEFAULT_PROGRESS_SECONDS, ProgressLines } from '../progressLines';
import { Breather } from '../breather';
import { ProgressBar } from '../progressBar';

const options: OptionSpec[] = [
  {
    name: 'preset',
    kind: 'text',
    value: 'ID',
    help: `start from a plan preset: ${PLAN_PRESETS.map((p) => p.id).join(', ')}`,
  },
  {
    name: 'set',
    kind: 'list',
    value: 'PATH=VALUE',
    help: 'set a field of the plan input (repeatable), e.g. drive.eps=0.02,\ngrid.nx=512, rotation.latitudeDeg=30; setting a kind clears its part.\nOr model-unit keys as stria run takes them (beta, kd, mu, nu, nu_order,\nkf, dkf, eps, Lx, Ly, nx, ny, cfl): a model-unit plan, the rest defaulted',
  },
  { name: 'json', kind: 'flag', help: 'print the predictions, checks, cost and matched run as JSON' },
  {
    name: 'matched',
    kind: 'flag',
    help: 'also run the matched cheap run and print its measured summary\nbeside its predictions',
  },
  { name: 'target-seconds', kind: 'number', value: 'S', help: 'wall-time target of the matched run (default 600)' },
  {
    name: 'progress-seconds',
    kind: 'number',
    value: 'S',
    help: `with --matched and standard error not a terminal: a progress line\nat most every S seconds (default ${DEFAULT_PROGRESS_SECONDS})`,
  },
  {
    name: 'matched-params',
    kind: 'text',
    value: 'FILE',
    help: "write the matched run's parameters as a parameter file for stria run\n(with the plan's physical units, so its NetCDF files are in them)",
  },
  {
    name: 'report',
    kind: 'text',
    value: 'FILE',
    help: 'write the printable plan report: FILE.md (Markdown) or FILE.html',
  },
  {
    name: 'overwrite',
    kind: 'flag',
    help: 'replace a report or parameter file that already exists\n(without it the command refuses to)',
  },
];

export const planCommand: Command = {
  name: 'plan',
  summary: 'what a planned run will give: predictions, checks, cost, and a matched cheap run',
  usage: 'stria plan [PLANFILE | --preset ID] [--set PATH=VALUE]... [--json] [--matched] [--report FILE]',
  description: `
Reads a plan (a plan file saved by the app, a preset, fields given with --set, or model-unit
parameters as stria run takes them, --set beta=3, the rest from the model defaults), and prints what
it predicts (U, Rhines and transitional wavenumbers, zonostrophy index and regime, jet spacing and
count, spin-up time, time step, steps), the checks with their fixes, the cost with Stria's model,
and the matched cheap run that keeps the plan's ratios on a grid that runs here. Units and
formulas: docs/plan.md. With --matched, the matched run is run (from rest, for its planned length,
averaging its second half) and its measured summary is printed beside its predictions: the plan is
printed at once, the run's progress goes to standard error (a bar on a terminal, else a line every
--progress-seconds), and the comparison follows when it ends. --json prints one object at the end.`,
  examples: `
  stria plan --preset jupiter --set grid.nx=1024 --set grid.ny=512 --report jupiter-plan.html
  stria plan --set beta=3 --set eps=2e-4 --set mu=5e-3 --set nx=256 --set ny=256
  stria plan my-plan.json --matched --target-seconds 60 --json`,
  options,
  run,
};

async function run(args: ParsedArgs, io: CommandIO): Promise<number> {
  const o = args.options;
  if (args.positionals.length > 1)
    throw new UsageError(`expected at most one PLANFILE, got ${args.positionals.length}`);
  const report = o.report as string | undefined;
  if (report !== undefined && !['.md', '.html'].includes(extname(report).toLowerCase()))
    throw new UsageError(`--report ${report}: the file name must end in .md or .html`);
  // Before anything is written: the report and the parameter file are files of their own, none replaced unasked.
  const outputs: OutputPath[] = [];
  if (report !== undefined) outputs.push({ option: '--report', path: report, kind: 'file' });
  const paramsFile = o['matched-params'] as string | undefined;
  if (paramsFile !== undefined) outputs.push({ option: '--matched-params', path: paramsFile, kind: 'file' });
  guardOutputs(outputs, args.positionals[0] ? [{ option: 'PLANFILE', path: args.positionals[0] }] : [], {
    overwrite: o.overwrite === true,
    choices: '--overwrite to replace it, or another file name',
  });
  const target = o['target-seconds'] as number | undefined;
  if (target !== undefined && !(target > 0)) throw new UsageError(`--target-seconds must be > 0, got ${target}`);
  const { input, setPaths, defaulted } = planInputFrom(
    args.positionals[0],
    o.preset as string | undefined,
    (o.set as string[] | undefined) ?? [],
  );
  if (defaulted?.length)
    io.err.write(
      `stria plan: a model-unit plan; from the model defaults: ${defaulted.map((k) => `${k} = ${fmt(DEFAULT_PARAMS[k])}`).join(', ')}${setPaths.includes('runLength') ? '' : `; run length ${fmt(input.runLength as number)} (5/μ: spin-up, then as long again; --set runLength=T to choose)`}\n`,
    );
  let analysis: PlanAnalysis;
  try {
    analysis = analysePlan(input, target === undefined ? {} : { targetWallSeconds: target });
  } catch (e) {
    if (!isInputError(e, 'plan input')) throw e;
    const missing = missingFields(e.issues);
    if (missing.length === e.issues.length)
      throw new UsageError(
        `the plan is incomplete: it needs ${missing.join(', ')}. Start from a preset (--preset ${PLAN_PRESETS[0].id}), a PLANFILE, or model-unit keys (--set beta=3 --set eps=2e-4 --set mu=5e-3, the rest from the defaults)`,
      );
    throw new UsageError(
      `plan refused: ${e.issues.map((i) => `${i.field}: ${i.message}${setPaths.includes(i.field) ? ` (from --set ${i.field})` : ''}`).join('; ')}`,
    );
  }
  if (report)
    writeFileSync(
      report,
      extname(report).toLowerCase() === '.html' ? planReportHtml(analysis) : planReportMarkdown(analysis),
    );
  const progressSeconds = (o['progress-seconds'] as number | undefined) ?? DEFAULT_PROGRESS_SECONDS;
  if (!(progressSeconds >= 0)) throw new UsageError(`--progress-seconds must be ≥ 0, got ${progressSeconds}`);
  if (report) io.err.write(`stria plan: report written to ${report}\n`);
  const paramsOut = o['matched-params'] as string | undefined;
  const twoLayer = analysis.baroclinic?.matched;
  if (paramsOut !== undefined && analysis.baroclinic) {
    if (!twoLayer) throw new Error(`no matched run can be made for this plan: ${analysis.baroclinic.matchedError}`);
    writeFileSync(paramsOut, encodeParamsFile(baroclinicParamsFile(analysis)));
    io.err.write(
      `stria plan: the matched two-layer run's parameters written to ${paramsOut}; run it with stria run ${paramsOut} --until ${twoLayer.runLength}\n`,
    );
  } else if (paramsOut !== undefined) {
    if (!analysis.matched) throw new Error(`no matched run can be made for this plan: ${analysis.matchedError}`);
    writeFileSync(paramsOut, encodeParamsFile(matchedParamsFile(analysis)));
    io.err.write(
      `stria plan: the matched run's parameters written to ${paramsOut}; run it with stria run ${paramsOut} --until ${analysis.matched.plan.runLength}\n`,
    );
  }
  // The predictions and checks first, at once: the matched run may take minutes.
  if (!o.json) io.out.write(planText(analysis));
  let measured: RunSummary | null = null;
  let status = EXIT_OK;
  if (o.matched && analysis.baroclinic) {
    if (!twoLayer) throw new Error(`no matched run can be made for this plan: ${analysis.baroclinic.matchedError}`);
    const result = await runMatched(
      { params: twoLayer.params, runLength: twoLayer.runLength, cost: twoLayer.cost },
      io,
      progressSeconds,
    );
    measured = result.summary;
    status = result.status;
    if (!o.json) io.out.write(keyedComparisonText(twoLayer.predicted, measured));
  } else if (o.matched) {
    if (!analysis.matched) throw new Error(`no matched run can be made for this plan: ${analysis.matchedError}`);
    const m = analysis.matched;
    const result = await runMatched(
      { params: m.params, runLength: m.plan.runLength, cost: m.cost },
      io,
      progressSeconds,
    );
    measured = result.summary;
    status = result.status;
    if (!o.json) io.out.write(matchedComparisonText(analysis.matched, measured));
  }
  if (o.json) io.out.write(`${JSON.stringify(planJson(analysis, measured), null, 2)}\n`);
  return status;
}

/** The matched run from rest for its planned length, averaged over its second half. */
async function runMatched(
  m: { params: MatchedRun['params']; runLength: number; cost: MatchedRun['cost'] },
  io: CommandIO,
  progressSeconds: number,
): Promise<{ summary: RunSummary; status: number }> {
  const model = new Model(m.params);
  const length = m.runLength;
  const run = new MonitoredRun(
    model,
    resolveRunPlan(model.params, {
      until: length,
      average: length / 2,
      sampleEvery: Math.max(model.params.dt, Math.min(10 * model.params.dt, length / 200)),
    }),
  );
  const bar = 'isTTY' in io.err && io.err.isTTY ? new ProgressBar(io.err, 'matched run') : null;
  const lines = bar ? null : new ProgressLines(io.err, 'stria plan: matched run', progressSeconds);
  io.err.write(
    `stria plan: running the matched run, ${m.params.nx} × ${m.params.ny} to t = ${fmt(length)} (${m.cost.steps} steps, about ${duration(m.cost.wallSeconds)})\n`,
  );
  try {
    const breather = new Breather();
    while (!run.advance(25)) {
      const status = `t = ${fmt(model.time)} of ${fmt(length)}, step ${model.steps}`;
      bar?.update(run.progress(), status);
      lines?.update(run.progress(), status);
      await breather.breathe();
      if (io.interrupted()) return { summary: run.summary(), status: EXIT_INTERRUPTED };
    }
  } catch (e) {
    if (!(e instanceof BlowUpError)) throw e;
    io.err.write(`stria plan: the matched run stopped: ${e.message}\n`);
    return { summary: run.summary(), status: EXIT_FAILED };
  } finally {
    bar?.done();
  }
  return { summary: run.summary(), status: EXIT_OK };
}

/**
 * The matched run as a parameter file: its parameters, and for a physical plan the physical size of
 * its model units. The matched run keeps the plan's domain (Lx = 2π) and rms velocity (U = 1), so its
 * model units are the plan's own scaling (planScaling: ℓ = Lx/2π, t = ℓ/U).
 */
export function matchedParamsFile(a: PlanAnalysis): ParamsFile {
  const m = a.matched!;
  return {
    title: m.input.title,
    params: { ...m.params },
    units:
      a.plan.units === 'physical'
        ? { kind: 'physical', metresPerLength: a.scaling.length, secondsPerTime: a.scaling.time }
        : { kind: 'model' },
  };
}

/**
 * The matched two-layer run of a baroclinic plan as a parameter file. Its model units keep L_d/dy and
 * take U = (U₁ − U₂)/2 = 1 (baroclinicPlan.ts), so one length unit is the planned L_d over the matched
 * one, and one time unit that length over the planned U.
 */
export function baroclinicParamsFile(a: PlanAnalysis): ParamsFile {
  const b = a.baroclinic!;
  const m = b.matched!;
  const metres = a.plan.Ld * m.params.kd;
  return {
    title: `matched two-layer run of ${a.plan.input.title ?? 'the plan'}`.slice(0, 200),
    params: { ...m.params },
    units:
      a.plan.units === 'physical'
        ? { kind: 'physical', metresPerLength: metres, secondsPerTime: metres / (b.shear / 2) }
        : { kind: 'model' },
  };
}
