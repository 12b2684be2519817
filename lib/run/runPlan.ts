import { InputError } from '../inputError';
import type { ModelParams } from '../model/params';

/**
 * How long a run goes and how it is measured, resolved to numbers (model time units), so that the
 * same plan always means the same run: `stria run`, every run of a sweep, and a run's id use it.
 *
 *   steps   take this many more steps
 *   until   step until the model time reaches `time` (absolute, so a resumed run stops at the same t)
 *   steady  step until the statistical steady state (steadyCriterion.ts) or `maxTime`, whichever first
 */
export type StopRule =
  | { kind: 'steps'; steps: number }
  | { kind: 'until'; time: number }
  | { kind: 'steady'; window: number; tolerance: number; maxTime: number };

export interface RunPlan {
  stop: StopRule;
  /** Length of the averaging window of the summary: the last `average` time units of the run. */
  average: number;
  /** Time between samples of the zonal means (equal intervals, so their means are time means). */
  sampleEvery: number;
}

/** What a person asks for; everything left out gets the default stated beside it. */
export interface RunLengthRequest {
  steps?: number;
  until?: number;
  untilSteady?: boolean;
  /** Steady criterion: relative tolerance (default 0.05), window (default 1/(2μ)), cap (default start + 20 windows). */
  steadyTolerance?: number;
  steadyWindow?: number;
  maxTime?: number;
  /** Default: 1/μ (the two windows the steady criterion compares), or 50 when μ = 0; at most the run's length. */
  average?: number;
  /** Default: 10 dt. */
  sampleEvery?: number;
}

export const DEFAULT_STEADY_TOLERANCE = 0.05;
/** The steady-state cap, in steady windows after the start. */
export const STEADY_CAP_WINDOWS = 20;
/** Samples per time step dt when none is asked for: one per 10 dt keeps sampling to a few % of the cost. */
export const DEFAULT_SAMPLE_STEPS = 10;

/**
 * The most steps a run may count, 2³¹ − 1: Stria's NetCDF files store the step count as a 32-bit
 * integer (`step`), and a run that needs more would not end in any useful time anyway (at a few
 * microseconds a step on the smallest grid, 2³¹ steps take hours; on a 256² grid, weeks).
 */
export const MAX_RUN_STEPS = 2 ** 31 - 1;

const positive = (x: number | undefined) => x === undefined || (Number.isFinite(x) && x > 0);

/** A step count as people read it: whole up to 10⁹, else three digits and an exponent (1e+300). */
const stepsText = (n: number) => (n < 1e9 ? String(n) : Number(n.toPrecision(3)).toExponential());

/** The steady window 1/(2μ), the e-folding time of the energy's spin-up from rest (E ∝ 1 − e^{−2μt}). */
export function spinUpTime(mu: number): number {
  return mu > 0 ? 1 / (2 * mu) : Infinity;
}

/**
 * Resolve a request into a RunPlan for a run of these parameters starting at model time `start`
 * after `startSteps` steps. Throws an InputError of source 'run length' whose field is the request's
 * key (`steps`, `until`, `average`, …, or `length`) when the request is not exactly one of steps,
 * until and untilSteady, a value is out of range, or the run would count more than MAX_RUN_STEPS
 * steps: at least (end − start)/dt of them, dt being the largest step the run takes.
 */
export function resolveRunPlan(p: ModelParams, req: RunLengthRequest, start = 0, startSteps = 0): RunPlan {
  const given = (['steps', 'until', 'untilSteady'] as const).filter((k) => req[k] !== undefined && req[k] !== false);
  if (given.length !== 1)
    throw new InputError(
      'run length',
      'length',
      given.length
        ? `give one run length, not ${given.join(' and ')}`
        : 'give a run length: steps, until or untilSteady',
    );
  for (const k of ['steadyTolerance', 'steadyWindow', 'maxTime', 'average', 'sampleEvery', 'until'] as const) {
    if (!positive(req[k])) throw new InputError('run length', k, `${k} must be a finite number > 0, got ${req[k]}`);
  }
  if (!req.untilSteady) {
    for (const k of ['steadyTolerance', 'steadyWindow', 'maxTime'] as const)
      if (req[k] !== undefined) throw new InputError('run length', k, `${k} applies only with untilSteady`);
  }
  let stop: StopRule;
  if (req.steps !== undefined) {
    if (!(Number.isInteger(req.steps) && req.steps > 0))
      throw new InputError('run length', 'steps', `steps must be a positive integer, got ${req.steps}`);
    stop = { kind: 'steps', steps: req.steps };
  } else if (req.until !== undefined) {
    if (!(req.until > start))
      throw new InputError(
        'run length',
        'until',
        `until = ${req.until} must lie after the start of the run, t = ${start}`,
      );
    stop = { kind: 'until', time: req.until };
  } else {
    const window = req.steadyWindow ?? spinUpTime(p.mu);
    if (!Number.isFinite(window))
      throw new InputError(
        'run length',
        'steadyWindow',
        'with no drag (μ = 0) the steady window 1/(2μ) is infinite: give steadyWindow',
      );
    const maxTime = req.maxTime ?? start + STEADY_CAP_WINDOWS * window;
    if (!(maxTime >= start + 2 * window))
      throw new InputError(
        'run length',
        'maxTime',
        `maxTime = ${maxTime} leaves less than the two steady windows (2 × ${window}) after t = ${start}`,
      );
    stop = { kind: 'steady', window, tolerance: req.steadyTolerance ?? DEFAULT_STEADY_TOLERANCE, maxTime };
  }
  checkStepCount(stop, p.dt, start, startSteps);
  // The default window shrinks to a run that is shorter; a window asked for must fit.
  const span = stop.kind === 'until' ? stop.time - start : Infinity;
  const average = req.average ?? Math.min(p.mu > 0 ? 1 / p.mu : 50, span);
  if (average > span)
    throw new InputError('run length', 'average', `average = ${average} is longer than the run (${span} time units)`);
  const sampleEvery = req.sampleEvery ?? DEFAULT_SAMPLE_STEPS * p.dt;
  // Samples must come at equal intervals; a step longer than the interval would skip some.
  if (sampleEvery < p.dt)
    throw new InputError(
      'run length',
      'sampleEvery',
      `sampleEvery = ${sampleEvery} is shorter than the time step dt = ${p.dt}: samples would not be equally spaced`,
    );
  if (sampleEvery > average)
    throw new InputError(
      'run length',
      'sampleEvery',
      `sampleEvery = ${sampleEvery} is longer than the averaging window ${average}`,
    );
  return { stop, average, sampleEvery };
}

/** Refuses a stop rule that would take the run past MAX_RUN_STEPS, naming the estimate. */
function checkStepCount(stop: StopRule, dt: number, start: number, startSteps: number): void {
  // Worded without the bare names of other request keys: the command line puts its options there.
  const room = MAX_RUN_STEPS - startSteps;
  const limit = `beyond the most a run may count, ${MAX_RUN_STEPS}${startSteps > 0 ? `, from its start at step ${startSteps}` : ''}`;
  if (stop.kind === 'steps') {
    if (stop.steps > room) throw new InputError('run length', 'steps', `steps ${stepsText(stop.steps)} is ${limit}`);
    return;
  }
  const key = stop.kind === 'until' ? 'until' : 'maxTime';
  const end = stop.kind === 'until' ? stop.time : stop.maxTime;
  const least = Math.ceil((end - start) / dt);
  if (least > room)
    throw new InputError(
      'run length',
      key,
      `${key} ${end} means a step count of at least ${stepsText(least)} at dt = ${dt}, ${limit}: give a larger dt or a shorter run`,
    );
}

/** The stop rule in words, for messages and help. */
export function describeStopRule(s: StopRule): string {
  if (s.kind === 'steps') return `${s.steps} steps`;
  if (s.kind === 'until') return `until t = ${s.time}`;
  return `until steady (energy means over consecutive windows of ${s.window} agree within ${s.tolerance * 100}%), at most until t = ${s.maxTime}`;
}
