import { describe, expect, it } from 'vitest';
import { encodeZonalMeanFile, zonalMeanFrame } from '../../lib/io/cfStriaWriter';
import { memorySource } from '../../lib/io/byteSource';
import { Model } from '../../lib/model/model';
import { verdicts } from '../../lib/plan/verdict';
import { planInputFromModelParams } from '../../lib/plan/modelPlanInput';
import { predictPlan } from '../../lib/plan/predictions';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { resolveRunPlan } from '../../lib/run/runPlan';
import { runSweepJob } from '../../lib/sweep/runSweepJob';
import type { StriaFrame } from '../../lib/io/cfStriaWriter';
import { analyzeFile } from '../../lib/userfile/analyzeFile';
import { RunDiagnostics } from '../../workers/runDiagnostics';

// One number, one answer: the jets of one run's time mean, over one window, through every path that
// shows them — the command line's run and the sweep (MonitoredRun), the plan comparison (its
// verdicts read that summary), the app's worker (RunDiagnostics: readouts, Zonal, Compare) and
// `stria analyze` on the zonal-mean file the run wrote — come from the one detector and agree.
// A half-width channel stirred at k_f = 12 on β = 20 holds three significant jets over t = 60–120 at
// this seed (seen when the test was written); fixed dt so that the samples fall at exact multiples
// of the interval.
const PARAMS = {
  nx: 32,
  ny: 64,
  Lx: Math.PI,
  Ly: 2 * Math.PI,
  beta: 20,
  kf: 12,
  dkf: 1.5,
  eps: 0.04,
  mu: 0.03,
  nu: 1e-10,
  nu_order: 4,
  cfl: 0,
  dt: 0.02,
  seed: 2,
};
const [UNTIL, AVERAGE, EVERY] = [120, 60, 0.5];

describe('the jets of a run through every path', () => {
  it('are the same count, spacing and staircase in the run, the sweep, the worker, the plan comparison and analyze', () => {
    const frames: StriaFrame[] = [];
    const model = new Model(PARAMS);
    const plan = resolveRunPlan(model.params, { until: UNTIL, average: AVERAGE, sampleEvery: EVERY });
    const run = new MonitoredRun(model, plan, {
      // The monitor reuses its buffers: a frame kept past the sample needs its own copies (the command line writes at once).
      onSample: (t, steps, z) => frames.push(zonalMeanFrame(t, steps, structuredClone(z))),
    });
    run.advance();
    const cli = run.summary();
    expect(cli.jet_verdict).toBe('jets');
    expect(cli.jet_count).toBeGreaterThanOrEqual(2);

    // The sweep runs the same job through the same code.
    const sweep = runSweepJob(
      { id: 'r0000000000000000', index: 0, point: {}, replica: 0, seed: PARAMS.seed, params: model.params, plan },
      { seconds: () => 0, iso: () => '2026-01-01T00:00:00Z' },
    ).summary;
    expect(sweep).toEqual(cli);

    // The app's worker, fed the same steps, over the same window.
    const twin = new Model(PARAMS);
    const diag = new RunDiagnostics(twin.params, 0, { sampleEvery: EVERY, meanSpan: AVERAGE, spectralAverage: 16 });
    while (twin.steps < model.steps) {
      twin.step();
      diag.afterStep(twin, { spectra: false, spectra2d: false, flux: false });
    }
    const app = diag.summary(twin);
    for (const k of ['jet_count', 'jet_spacing', 'jet_verdict', 'staircase_index', 'regime'] as const)
      expect(app[k], k).toEqual(cli[k]);
    expect(app.window_start).toBe(cli.window_start);

    // The plan comparison judges that very summary.
    const predicted = predictPlan(resolvePlan(planInputFromModelParams(model.params, UNTIL).input));
    const rows = verdicts(predicted, cli);
    expect(rows.find((r) => r.key === 'jet_count')!.measured).toBe(cli.jet_count);

    // `stria analyze` on the zonal-mean file, over the same records.
    const window = frames.filter((f) => f.time >= (cli.window_start as number));
    expect(window.length).toBe(cli.window_samples);
    const file = encodeZonalMeanFile(
      { params: model.params, striaVersion: '0.1.0', createdAt: '2026-01-01T00:00:00Z' },
      window,
    );
    const a = analyzeFile(memorySource(file)).analysis;
    expect(a.jets!.verdict).toBe('jets');
    expect(a.jets!.count).toBe(cli.jet_count);
    expect(Math.abs(a.jets!.meanSpacing! - cli.jet_spacing!)).toBeLessThan(1e-12);
    expect(Math.abs(a.jets!.spacingStderr! - cli.jet_spacing_stderr!)).toBeLessThan(1e-9);
  });
});
