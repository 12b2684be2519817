import { RunMonitor } from '../lib/analysis/runMonitor';
import { summarize, type RunSummary } from '../lib/analysis/summary';
import { Model } from '../lib/model/model';
import type { ModelParams } from '../lib/model/params';
import type { StepThreads } from '../lib/model/threadTeam';
import { DEFAULT_SCENARIO_ID, scenarioById } from '../lib/plan/demoScenarios';

/**
 * Jets are "on screen" when the one jet detector (lib/analysis/jetDetector.ts, docs/significance.md)
 * finds at least MIN_JETS significant eastward jets in the time-mean zonal flow of the last window
 * (below). The detector judges no window shorter than the flow's memory 1/μ, so the earliest time
 * to jets is 1/μ (50 in the default scenario); the staircase index is reported, not required.
 */
export const MIN_JETS = 3;
/**
 * The time-mean window: at least 20 time units, and at least the flow's memory 1/μ, below which the
 * jet detector's significance test does not judge (lib/analysis/jetDetector.ts).
 */
const MIN_WINDOW = 20;
const SAMPLE_EVERY = 0.5;
const CHECK_EVERY = 5;
const GIVE_UP = 400;

export interface TimeToJets {
  n: number;
  /** Threads the run stepped on, the calling one included. */
  threads: number;
  wall_seconds: number;
  model_time: number;
  steps: number;
  summary: RunSummary;
  /** The step in use at the end, and the relative error of a fixed-step deterministic stretch. */
  dt: number;
  accuracy: { span: number; error_dt: number; error_half: number; observed_order: number };
}

/**
 * The default scenario at n × n on `threads` (null: the calling thread alone), run from rest until
 * jets show (or GIVE_UP time units).
 */
export function timeToJets(
  n = 256,
  log: (s: string) => void = () => {},
  threads: StepThreads | null = null,
): TimeToJets {
  const scenario = scenarioById(DEFAULT_SCENARIO_ID);
  if (!scenario) throw new Error('no default scenario');
  const model = new Model({ ...scenario.params, nx: n, ny: n }, false, threads);
  const mu = model.params.mu;
  const window = Math.max(MIN_WINDOW, mu > 0 ? 1 / mu : MIN_WINDOW);
  const monitor = new RunMonitor(model.params, {
    window: { kind: 'last', span: window, cap: Math.ceil(window / SAMPLE_EVERY) + 8 },
  });
  const t0 = performance.now();
  let nextSample = 0;
  let nextCheck = CHECK_EVERY;
  let summary = summarize(monitor, 0, 0);
  while (model.time < GIVE_UP) {
    monitor.step(model.step());
    if (model.time >= nextSample) {
      monitor.sample(model.qHat, model.time);
      nextSample += SAMPLE_EVERY;
    }
    if (model.time >= nextCheck) {
      nextCheck += CHECK_EVERY;
      summary = summarize(monitor, model.time, model.steps);
      log(
        `  t = ${model.time.toFixed(1)}: ${summary.jet_verdict ?? '—'}, ${summary.jet_count ?? '—'} jets, staircase index ${summary.staircase_index?.toFixed(3) ?? '—'}`,
      );
      if (summary.jet_verdict === 'jets' && (summary.jet_count ?? 0) >= MIN_JETS) break;
    }
  }
  const wall = (performance.now() - t0) / 1000;
  const count = model.threadCount;
  model.useThreads(null);
  return {
    n,
    threads: count,
    wall_seconds: wall,
    model_time: model.time,
    steps: model.steps,
    summary,
    dt: model.dt,
    accuracy: stepAccuracy(model, threads),
  };
}

/**
 * Accuracy of the scheme at the step the run used: from its final state, integrate the deterministic
 * part (forcing off, so every run sees the same equation) over `span` time units with dt, dt/2 and
 * dt/4, and return the relative differences |q_dt − q_dt/2|/|q| and |q_dt/2 − q_dt/4|/|q|. Their
 * ratio gives the observed order (4 for RK4 in its asymptotic range).
 */
function stepAccuracy(model: Model, threads: StepThreads | null, span = 2): TimeToJets['accuracy'] {
  const cp = model.checkpoint();
  const dt = model.dt;
  const steps = Math.max(1, Math.round(span / dt));
  const run = (k: number) => {
    const p: ModelParams = { ...cp.params, forcing: 'none', cfl: 0, dt: dt / k };
    const m = Model.restore({ ...cp, params: p, dt: dt / k }, threads);
    m.step(steps * k);
    const q = Float64Array.from(m.qHat);
    m.useThreads(null);
    return q;
  };
  const a = run(1);
  const b = run(2);
  const c = run(4);
  const rel = (x: Float64Array, y: Float64Array) => {
    let d = 0;
    let s = 0;
    for (let i = 0; i < x.length; i++) {
      d += (x[i] - y[i]) ** 2;
      s += y[i] ** 2;
    }
    return Math.sqrt(d / s);
  };
  const e1 = rel(a, b);
  const e2 = rel(b, c);
  return { span: steps * dt, error_dt: e1, error_half: e2, observed_order: Math.log2(e1 / e2) };
}
