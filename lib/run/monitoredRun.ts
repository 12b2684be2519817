import { RunMonitor } from '../analysis/runMonitor';
import { summarize, type RunSummary } from '../analysis/summary';
import type { LayerZonalMeans } from '../analysis/layerZonalMean';
import type { ZonalMeans } from '../analysis/zonalMean';
import { reachedTime } from '../model/clock';
import type { Model } from '../model/model';
import type { ModelParams } from '../model/params';
import { InputError } from '../inputError';
import { barotropicParams } from '../analysis/layerSnapshot';
import { captureState, restoreState, type CapturedState } from './dataState';
import type { RunPlan } from './runPlan';
import type { SteadyCriterion } from '../analysis/steadyCriterion';

/** Why a run stopped: its rule was met, the steady cap was reached first, or the caller stopped it. */
export type StopReason = 'steps' | 'until' | 'steady' | 'not-steady';

export interface RunHooks {
  /** After every step (the model holds the new state). */
  onStep?(model: Model): void;
  /**
   * After every sample of the zonal means, at the sample's time: those of the flow (two layers: the
   * barotropic flow's) and, with two layers, the layers' own (else null).
   */
  onSample?(time: number, steps: number, zonal: ZonalMeans, layers: LayerZonalMeans | null): void;
}

/** Where a run began: a resumed run keeps the sample times, steady windows and step count of the original. */
export interface RunOrigin {
  time: number;
  steps: number;
}

/**
 * Everything a MonitoredRun has measured, as plain data (dataState.ts): the sample clock, the steady
 * criterion and the monitor's accumulators. `restoreState` of it continues the measurement exactly.
 */
export interface MonitoredRunState {
  run: CapturedState;
  steady: CapturedState | null;
  monitor: {
    self: CapturedState;
    budget: CapturedState;
    hovmoller: CapturedState;
    means: CapturedState;
    /** Two layers: the energy cycle series and the layers' time means. */
    layers?: { cycle: CapturedState; means: CapturedState };
  };
}

/** Stored bins of the summary's time means (RunMonitor's window cap): bounded memory for any run length. */
export const TIME_MEAN_CAP = 256;

// Fields that are configuration or plan objects rebuilt identically by the constructor, not state.
const RUN_CONFIG = ['current', 'plan', 'monitor', 'hooks', 'startTime', 'startSteps'];
const MONITOR_CONFIG = [
  'params',
  'layers',
  'snap',
  'zonal',
  'budget',
  'hovmoller',
  'means',
  'window',
  'steady',
  'detector',
  'latest',
  'mean',
  'fields',
];

/**
 * A model driven to the end of its RunPlan with a RunMonitor watching: every step's budget goes to
 * the monitor, the zonal means are sampled every `sampleEvery` time units from the start (at the
 * first step ending on or after each sample time, to the clock's tolerance (lib/model/clock.ts), so with a step no longer than the interval the
 * samples are equally spaced to within one step), and the summary averages the last `average` time
 * units. `advance` takes a bounded number of steps, so a caller can show progress or stop between
 * calls. Throws the model's BlowUpError, leaving the last good state and a summary of it.
 *
 * The start (`origin`) may lie before the model's present: a run resumed from a checkpoint passes the
 * original start and then `restoreState`, and goes on sampling, counting steps and testing for the
 * steady state exactly as the uninterrupted run would have. `rollBack` swaps in a model restored from
 * an earlier checkpoint together with the measurement taken there (a blow-up retry).
 */
export class MonitoredRun {
  readonly plan: RunPlan;
  readonly monitor: RunMonitor;
  readonly startTime: number;
  readonly startSteps: number;
  private current: Model;
  private readonly hooks: RunHooks;
  private nextSample: number;
  private samplesTaken = 0;
  private reason: StopReason | null = null;

  constructor(
    model: Model,
    plan: RunPlan,
    hooks: RunHooks = {},
    origin: RunOrigin = { time: model.time, steps: model.steps },
  ) {
    this.current = model;
    this.plan = plan;
    this.hooks = hooks;
    this.startTime = origin.time;
    this.startSteps = origin.steps;
    // The monitor's steady-state test is the stop rule's when the run stops at the steady state.
    const test = plan.stop.kind === 'steady' ? { window: plan.stop.window, tolerance: plan.stop.tolerance } : undefined;
    this.monitor = new RunMonitor(model.params, {
      window: { kind: 'last', span: plan.average, cap: TIME_MEAN_CAP },
      steady: test,
      start: origin.time,
    });
    this.nextSample = origin.time + plan.sampleEvery;
  }

  /** The model being run (a new object after `rollBack`). */
  get model(): Model {
    return this.current;
  }

  /** The reason the run stopped, or null while it goes on. */
  get stopped(): StopReason | null {
    return this.reason;
  }

  /** Take at most `maxSteps` steps; returns true when the run is over. */
  advance(maxSteps = Infinity): boolean {
    for (let i = 0; i < maxSteps && this.reason === null; i++) {
      const m = this.current;
      const before = m.time;
      const report = m.step();
      // A clock that no longer moves (dt below the resolution of t) would never reach its stop time.
      if (!(m.time > before))
        throw new RangeError(
          `the model clock no longer advances: t = ${before}, dt = ${report.dt} is below its resolution`,
        );
      this.monitor.step(report);
      this.hooks.onStep?.(m);
      if (reachedTime(m.time, this.nextSample, report.dt)) {
        this.samplesTaken++;
        this.nextSample = this.startTime + (this.samplesTaken + 1) * this.plan.sampleEvery;
        const z = this.monitor.sample(m.qHat, m.time);
        this.hooks.onSample?.(m.time, m.steps, z, this.monitor.layers?.latest ?? null);
      }
      this.reason = this.stopNow();
    }
    return this.reason !== null;
  }

  /** The steady-state test (the monitor's: with a steady stop rule, that rule's window and tolerance). */
  get steady(): SteadyCriterion {
    return this.monitor.steady;
  }

  /** The stop rule tested at the present state, without recording a step. */
  private stopNow(): StopReason | null {
    const s = this.plan.stop;
    const m = this.current;
    if (s.kind === 'steps') return m.steps - this.startSteps >= s.steps ? 'steps' : null;
    if (s.kind === 'until') return reachedTime(m.time, s.time, m.dt) ? 'until' : null;
    if (this.steady.steadyAt !== null) return 'steady';
    return reachedTime(m.time, s.maxTime, m.dt) ? 'not-steady' : null;
  }

  /** Fraction of the run done, in [0, 1] (for a steady run, of the way to its cap). */
  progress(): number {
    const s = this.plan.stop;
    const m = this.current;
    if (this.reason !== null) return 1;
    const f =
      s.kind === 'steps'
        ? (m.steps - this.startSteps) / s.steps
        : (m.time - this.startTime) / ((s.kind === 'until' ? s.time : s.maxTime) - this.startTime);
    return Math.min(1, Math.max(0, f));
  }

  /** The run summary so far (lib/analysis/summary.ts, stable keys). */
  summary(): RunSummary {
    return summarize(this.monitor, this.current.time, this.current.steps);
  }

  /** A copy of the measurement so far (to pair with `model.checkpoint()`). */
  saveState(): MonitoredRunState {
    const mon = this.monitor;
    return {
      run: captureState(this, RUN_CONFIG, 'run'),
      steady: captureState(this.steady, [], 'steady'),
      monitor: {
        self: captureState(mon, MONITOR_CONFIG, 'monitor'),
        budget: captureState(mon.budget, [], 'monitor.budget'),
        hovmoller: captureState(mon.hovmoller, [], 'monitor.hovmoller'),
        means: captureState(mon.means, [], 'monitor.means'),
        ...(mon.layers
          ? {
              layers: {
                cycle: captureState(mon.layers.cycle, [], 'monitor.layers.cycle'),
                means: captureState(mon.layers.means, [], 'monitor.layers.means'),
              },
            }
          : {}),
      },
    };
  }

  /**
   * Continue from a saved measurement (of a run with this plan and grid). Throws an InputError
   * of source 'state' and changes nothing when the state does not fit. The stop rule is tested at once, so a run resumed
   * from its final checkpoint takes no further step.
   */
  restoreState(s: MonitoredRunState): void {
    const mon = this.monitor;
    // Every part is checked by a dry run on a throwaway copy first, so a misfit changes nothing.
    const probe = this.saveState();
    restoreState(probe.run, s.run, [], 'run');
    if (s.steady && probe.steady) restoreState(probe.steady, s.steady, [], 'steady');
    restoreState(probe.monitor.self, s.monitor.self, [], 'monitor');
    restoreState(probe.monitor.budget, s.monitor.budget, [], 'monitor.budget');
    restoreState(probe.monitor.hovmoller, s.monitor.hovmoller, [], 'monitor.hovmoller');
    restoreState(probe.monitor.means, s.monitor.means, [], 'monitor.means');
    const layers = s.monitor.layers;
    if ((layers === undefined) !== (probe.monitor.layers === undefined))
      throw new InputError(
        'state',
        'monitor.layers',
        layers ? 'holds two layers, and this run has one' : 'is missing: this run has two layers',
      );
    if (layers && probe.monitor.layers) {
      restoreState(probe.monitor.layers.cycle, layers.cycle, [], 'monitor.layers.cycle');
      restoreState(probe.monitor.layers.means, layers.means, [], 'monitor.layers.means');
    }
    restoreState(this, s.run, RUN_CONFIG, 'run');
    if (s.steady) restoreState(this.steady, s.steady, [], 'steady');
    restoreState(mon, s.monitor.self, MONITOR_CONFIG, 'monitor');
    restoreState(mon.budget, s.monitor.budget, [], 'monitor.budget');
    restoreState(mon.hovmoller, s.monitor.hovmoller, [], 'monitor.hovmoller');
    restoreState(mon.means, s.monitor.means, [], 'monitor.means');
    if (layers && mon.layers) {
      restoreState(mon.layers.cycle, layers.cycle, [], 'monitor.layers.cycle');
      restoreState(mon.layers.means, layers.means, [], 'monitor.layers.means');
    }
    this.reason = this.reason ?? this.stopNow();
  }

  /** Go back to a checkpoint: `model` restored from it, `state` the measurement saved with it. */
  rollBack(model: Model, state: MonitoredRunState): void {
    const p = this.current.params;
    if (model.params.nx !== p.nx || model.params.ny !== p.ny || model.params.Lx !== p.Lx || model.params.Ly !== p.Ly)
      throw new RangeError('rollBack: the model is of another grid');
    const previous = this.current;
    this.current = model;
    try {
      this.restoreState(state);
    } catch (e) {
      this.current = previous;
      throw e;
    }
  }
}

/**
 * The barotropic flow of a run as the one-layer diagnostics see it. One layer: the run's parameters.
 * Two layers: barotropicParams (a one-layer flow with k_d = 0, its PV h₁q₁ + h₂q₂ = ζ_bt, its mean
 * PV gradient β). The run monitor knows the layers itself (RunMonitor with the run's parameters);
 * this is for the views that show one flow, with monitoredState.
 */
export function monitoredParams(p: ModelParams): ModelParams {
  return p.layers === 2 ? barotropicParams(p) : p;
}

/**
 * The spectrum the diagnostics sample (see monitoredParams): the model's state in one layer, the
 * barotropic PV in two, written into `buffer` (a new array when it is missing or of another length;
 * keep what comes back to reuse it).
 */
export function monitoredState(model: Model, buffer?: Float64Array): Float64Array {
  if (model.layers === 1) return model.qHat;
  const n = 2 * model.grid.spectralSize;
  const out = buffer?.length === n ? buffer : new Float64Array(n);
  return model.spectrum('q', out, 'barotropic');
}
