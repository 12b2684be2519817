import type { StepReport } from '../lib/model/budget';
import type { ModelParams } from '../lib/model/params';

/**
 * The verbs of the simulation worker. The UI imports these types only; the worker owns the model.
 *
 * Snapshot protocol (one per animation frame at most, never one message per step):
 *  - the UI keeps at most one `nextSnapshot` call in flight and makes the next one from its
 *    requestAnimationFrame callback, so requests come no faster than frames;
 *  - the worker answers a request as soon as its state is newer than `after` (at once if it
 *    already is, else after the next step or slice of steps), so many steps coalesce into one reply;
 *  - the field buffer is transferred to the UI, and the UI hands a buffer it no longer needs back
 *    with a later request (`recycle`), so steady play allocates nothing on either side.
 */
export interface SimulationApi {
  /** Build a new model (parameters completed with the defaults and validated; throws ParamError). Leaves it paused. */
  init(params: Partial<ModelParams>): Promise<InitInfo>;
  /** Step continuously, in slices that leave room for messages, until `pause` or a blow-up. */
  play(): Promise<void>;
  pause(): Promise<void>;
  /** Pause, then advance one step; returns its report. */
  stepOnce(): Promise<StepReport>;
  /** The next snapshot whose `version` exceeds `after` (see the protocol above). */
  nextSnapshot(after: number, recycle?: Float64Array): Promise<Snapshot>;
  /** Stop stepping, drop the model and answer nothing more; call before terminating the worker. */
  dispose(): Promise<void>;
}

/** What `init` settled on. */
export interface InitInfo {
  params: ModelParams;
  /** Independent forced modes on the annulus (0 for unforced runs). */
  forcedModes: number;
}

/** One view of the model state, sent by transfer. */
export interface Snapshot {
  /** Increases with every change of state (steps, a new model, a stop); starts at 1 after `init`. */
  version: number;
  /** Relative vorticity ζ on the grid (model units, 1/time), row-major with y slow: ζ[jy·nx + ix]. */
  zeta: Float64Array;
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
  time: number;
  steps: number;
  /** The report of the last step (all zeros before the first step). */
  report: StepReport;
  playing: boolean;
  /** Why the run stopped (a blow-up), or null while it can go on. */
  stopped: string | null;
}
