import type { RunSummary } from '../lib/analysis/summary';
import type { BlowUpReport } from '../lib/run/blowUpRetry';
import type { SweepRecord } from '../lib/sweep/sweepRecord';
import type { SweepJob } from '../lib/sweep/sweepRuns';
import type { StepReport } from '../lib/model/budget';
import type { Checkpoint } from '../lib/model/checkpoint';
import type { FieldName } from '../lib/model/fields';
import type { LayerView } from '../lib/model/layerFields';
import type { ModelParams } from '../lib/model/params';
import type { InputIssue } from '../lib/inputError';
import type { BudgetRows } from './budgetRows';
import type { DiagnosticNeeds, DiagnosticsPayload, MonitorStatus, SamplingOptions } from './diagnosticsApi';
import type { ExportedFile } from './runExports';
import type { ThreadsInfo } from './threadChoice';

/**
 * The verbs of the simulation worker. The UI imports these types only; the worker owns the model.
 *
 * Snapshot protocol (one per animation frame at most, never one message per step):
 *  - the UI keeps at most one `nextSnapshot` call in flight and makes the next one from its
 *    requestAnimationFrame callback, so requests come no faster than frames;
 *  - the worker answers a request as soon as its state is newer than `after` (at once if it
 *    already is, else after the next step or slice of steps), so many steps coalesce into one reply;
 *  - each snapshot carries the selected field (`setField`) and the budget rows of every step taken
 *    since the previous snapshot (see budgetRows.ts), both transferred; the UI hands buffers it no
 *    longer needs back with a later request, so steady play allocates nothing on either side;
 *  - each snapshot carries the diagnostics status and the payloads the shown views asked for with
 *    `setDiagnostics`, when they changed, at most a few times per second (diagnosticsApi.ts).
 */
export interface SimulationApi {
  /**
   * Build a new model (parameters completed with the defaults and validated; throws an InputError),
   * sampled as `sampling` says (what it leaves out at the defaults, whatever was set before). Leaves it paused.
   */
  init(params: Partial<ModelParams>, sampling?: SamplingOptions): Promise<InitInfo>;
  /** Step continuously, in slices that leave room for messages, until `pause` or a blow-up. */
  play(): Promise<void>;
  /** Stop stepping (also cancels a `runUntil`). */
  pause(): Promise<void>;
  /** Pause, then advance one step; returns its report. */
  stepOnce(): Promise<StepReport>;
  /** Play until the model time reaches `time` (the first step ending at or after it), then pause. */
  runUntil(time: number): Promise<void>;
  /**
   * Change parameters without stopping: physical ones in place, and the diagnostics go on with their
   * history (the change is listed in `Snapshot.changes`; the time means then span it until
   * `restartMeans`); a new grid carries the state over, truncated or padded, and restarts the
   * diagnostics; a new domain starts afresh. Refused changes leave the run as it was.
   */
  reconfigure(changes: Partial<ModelParams>): Promise<ReconfigureResult>;
  /** Start the time means again from the next sample (after a change of parameters, say); the rest of the record stays. */
  restartMeans(): Promise<MonitorStatus>;
  /** Which field the snapshots carry (u by default); answers a waiting request with it at once. */
  setField(name: FieldName): Promise<void>;
  /** Two layers: which view of the state the field is of (upper, lower, barotropic, baroclinic); ignored in one layer. */
  setLayerView(view: LayerView): Promise<void>;
  /** Which diagnostics the shown views need (computed only then); answers a waiting request at once. */
  setDiagnostics(needs: DiagnosticNeeds): Promise<void>;
  /** Change the sample interval (restarts the diagnostics), the averaging window or the spectral average; throws RangeError. */
  setSampling(options: SamplingOptions): Promise<MonitorStatus>;
  /** The run summary (lib/analysis/summary.ts) over the monitor's window, now. */
  summary(): Promise<RunSummary>;
  /** A file of the run: the current state as NetCDF, or the zonal-mean samples as NetCDF or CSV; transferred. */
  exportFile(kind: ExportKind): Promise<ExportedFile>;
  /** Everything needed to resume bit for bit; its spectrum is a copy, transferred. */
  checkpoint(): Promise<Checkpoint>;
  /** Replace the run by one resumed from a checkpoint (throws on a bad one). Leaves it paused. */
  restore(cp: Checkpoint): Promise<InitInfo>;
  /**
   * After a blow-up (`Snapshot.blowUp`): go back to the last in-memory checkpoint (kept every
   * RESCUE_EVERY steps, rescuePoint.ts) with dt, and with an adaptive step the CFL target, halved
   * (lib/run/blowUpRetry.ts `retryCheckpoint`, the command line's rule), and play. A new epoch.
   * Throws when the run has not blown up or the halved parameters are refused.
   */
  restartHalved(): Promise<InitInfo>;
  /**
   * Step on `count` threads, this worker included, with helper web workers (docs/threads.md); the
   * bits do not depend on it. Runs on one, and says why, when the page is not cross-origin isolated
   * or the helpers cannot start. Kept for later runs of this worker. Throws RangeError on a bad count.
   */
  setThreads(count: number): Promise<ThreadsInfo>;
  /** Answers at once (between slices of play): the UI's watchdog asks it to learn the worker is alive. */
  ping(): Promise<void>;
  /** The next snapshot whose `version` exceeds `request.after` (see the protocol above). */
  nextSnapshot(request: SnapshotRequest): Promise<Snapshot>;
  /**
   * Run one sweep job from rest to its end with the command line's per-run code (runSweepJob) and
   * return its record. It has nothing to do with the live model: the sweep pool uses simulation
   * workers so that the model's code ships once. Blocks this worker until the run ends.
   */
  runSweepJob(job: SweepJob): Promise<SweepRecord>;
  /** Stop stepping, drop the model and answer nothing more; call before terminating the worker. */
  dispose(): Promise<void>;
}

export type ExportKind = 'snapshot' | 'zonal-netcdf' | 'zonal-csv';

/** What `init` or `restore` settled on. */
export interface InitInfo {
  params: ModelParams;
  /** Independent forced modes on the annulus (0 for unforced runs). */
  forcedModes: number;
}

/**
 * How a reconfiguration went: refused with the reason per field, or applied as `inPlace` (same
 * state, time and random stream), `regrid` (state carried to the new grid) or `fresh` (new domain:
 * a new run from t = 0).
 */
export type ReconfigureResult =
  | {
      applied: true;
      how: 'inPlace' | 'regrid' | 'fresh';
      params: ModelParams;
      /** Whether the diagnostics kept their history ('kept': physical parameters) or started again. */
      diagnostics: 'kept' | 'restarted';
    }
  | { applied: false; issues: InputIssue[] };

/** A change of parameters within a run, at model time `time` after `steps` steps. */
export interface ParamChange {
  time: number;
  steps: number;
  /** The parameters that changed. */
  keys: (keyof ModelParams)[];
  how: 'inPlace' | 'regrid';
  /** Whether the diagnostics kept their history across it or started again there. */
  diagnostics: 'kept' | 'restarted';
}

/** A blow-up, and the offer to go back to the last checkpoint with the step halved. */
export interface BlowUpStop {
  report: BlowUpReport;
  /** The checkpoint a restart goes back to, and dt and the CFL target before and after halving; null when none is kept. */
  restart: { time: number; steps: number; dt: { from: number; to: number }; cfl: { from: number; to: number } } | null;
  /** Why the halved parameters are refused (validateParams), or null when the restart can go ahead. */
  refused: string | null;
}

export interface SnapshotRequest {
  after: number;
  /** A field buffer of an earlier snapshot, for reuse (transferred back). */
  recycleField?: Float64Array;
  /** A budget-row buffer of an earlier snapshot, for reuse (transferred back). */
  recycleBudget?: Float64Array;
}

/** One view of the model state, sent by transfer. */
export interface Snapshot {
  /** Increases with every change of what a snapshot shows (steps, parameters, field, a new run, a stop); 1 after the first `init`. */
  version: number;
  /** Increases with every new run (init, restore, a new domain); budget history restarts with it. */
  epoch: number;
  /** The field in `values`. */
  field: FieldName;
  /** Two layers: the view of the state `values` shows (one layer: ignored, 'barotropic'). */
  layerView: LayerView;
  /** That field on the grid (model units), row-major with y slow: values[jy·nx + ix]. */
  values: Float64Array;
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
  /** The parameters in force. */
  params: ModelParams;
  time: number;
  steps: number;
  /**
   * The report of the last step; before this model's first step (a new or loaded run, new
   * parameters), the readouts of the state itself (energies and CFL number, rates zero).
   */
  report: StepReport;
  /** The changes of parameters within this run so far, oldest first. */
  changes: ParamChange[];
  /** Budget rows of the steps since the previous snapshot, oldest first. */
  budget: BudgetRows;
  /** Fingerprint of the state's bits (stateChecksum, lib/io/digest.ts). */
  checksum: string;
  /** The threads the step runs on (not part of the bits). */
  threads: ThreadsInfo;
  playing: boolean;
  /** The model time a `runUntil` is heading for, or null. */
  until: number | null;
  /** Why the run stopped (a blow-up), or null while it can go on. */
  stopped: string | null;
  /** When it stopped on a blow-up: the report and where a restart with dt halved would begin. */
  blowUp: BlowUpStop | null;
  /** The monitor's status and the payloads due (diagnosticsApi.ts). */
  diagnostics: DiagnosticsPayload;
}
