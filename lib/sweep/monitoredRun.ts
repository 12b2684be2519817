import { RunMonitor } from '../analysis/runMonitor';
import { summarize, type RunSummary } from '../analysis/summary';
import type { ZonalMeans } from '../analysis/zonalMean';
import type { Model } from '../model/model';
import type { RunPlan } from './runPlan';
import { SteadyCriterion } from './steadyCriterion';

/** Why a run stopped: its rule was met, the steady cap was reached first, or the caller stopped it. */
export type StopReason = 'steps' | 'until' | 'steady' | 'not-steady';

export interface RunHooks {
  /** After every step (the model holds the new state). */
  onStep?(model: Model): void;
  /** After every sample of the zonal means, at the sample's time. */
  onSample?(time: number, steps: number, zonal: ZonalMeans): void;
}

/**
 * A model driven to the end of its RunPlan with a RunMonitor watching: every step's budget goes to
 * the monitor, the zonal means are sampled every `sampleEvery` time units from the start (at the
 * first step ending on or after each sample time, so with a step no longer than the interval the
 * samples are equally spaced to within one step), and the summary averages the last `average` time
 * units. `advance` takes a bounded number of steps, so a caller can show progress or stop between
 * calls. Throws the model's BlowUpError, leaving the last good state and a summary of it.
 */
export class MonitoredRun {
  readonly model: Model;
  readonly plan: RunPlan;
  readonly monitor: RunMonitor;
  readonly startTime: number;
  readonly startSteps: number;
  readonly steady: SteadyCriterion | null;
  private readonly hooks: RunHooks;
  private nextSample: number;
  private samplesTaken = 0;
  private reason: StopReason | null = null;

  constructor(model: Model, plan: RunPlan, hooks: RunHooks = {}) {
    this.model = model;
    this.plan = plan;
    this.hooks = hooks;
    this.startTime = model.time;
    this.startSteps = model.steps;
    this.monitor = new RunMonitor(model.params, { window: { kind: 'last', span: plan.average, cap: 256 } });
    this.steady = plan.stop.kind === 'steady' ? new SteadyCriterion(model.time, plan.stop.window, plan.stop.tolerance) : null;
    this.nextSample = model.time + plan.sampleEvery;
  }

  /** The reason the run stopped, or null while it goes on. */
  get stopped(): StopReason | null {
    return this.reason;
  }

  /** Take at most `maxSteps` steps; returns true when the run is over. */
  advance(maxSteps = Infinity): boolean {
    const m = this.model;
    for (let i = 0; i < maxSteps && this.reason === null; i++) {
      const report = m.step();
      this.monitor.step(report);
      this.hooks.onStep?.(m);
      if (m.time >= this.nextSample) {
        this.samplesTaken++;
        this.nextSample = this.startTime + (this.samplesTaken + 1) * this.plan.sampleEvery;
        const z = this.monitor.sample(m.qHat, m.time);
        this.hooks.onSample?.(m.time, m.steps, z);
      }
      this.reason = this.checkStop(report.time - report.dt, report.dt, report.energy.value);
    }
    return this.reason !== null;
  }

  private checkStop(stepStart: number, dt: number, energy: number): StopReason | null {
    const s = this.plan.stop;
    const m = this.model;
    if (s.kind === 'steps') return m.steps - this.startSteps >= s.steps ? 'steps' : null;
    if (s.kind === 'until') return m.time >= s.time ? 'until' : null;
    if (this.steady!.add(stepStart, dt, energy)) return 'steady';
    return m.time >= s.maxTime ? 'not-steady' : null;
  }

  /** Fraction of the run done, in [0, 1] (for a steady run, of the way to its cap). */
  progress(): number {
    const s = this.plan.stop;
    const m = this.model;
    if (this.reason !== null) return 1;
    const f = s.kind === 'steps' ? (m.steps - this.startSteps) / s.steps : (m.time - this.startTime) / ((s.kind === 'until' ? s.time : s.maxTime) - this.startTime);
    return Math.min(1, Math.max(0, f));
  }

  /** The run summary so far (lib/analysis/summary.ts, stable keys). */
  summary(): RunSummary {
    return summarize(this.monitor, this.model.time, this.model.steps);
  }
}
