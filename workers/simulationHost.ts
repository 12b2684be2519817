import { transfer } from 'comlink';
import { copyReport, type StepReport } from '../lib/model/budget';
import type { Checkpoint } from '../lib/model/checkpoint';
import type { FieldName } from '../lib/model/fields';
import { LAYER_VIEWS, type LayerView } from '../lib/model/layerFields';
import { Model } from '../lib/model/model';
import { reachedTime } from '../lib/model/clock';
import type { ModelParams } from '../lib/model/params';
import { BlowUpError } from '../lib/model/stepper';
import { ThreadTeamError } from '../lib/model/threadTeam';
import { validateParams } from '../lib/model/validateParams';
import type { RunSummary } from '../lib/analysis/summary';
import { blowUpReport, retryCheckpoint, retryRecord } from '../lib/run/blowUpRetry';
import { runSweepJob } from '../lib/sweep/runSweepJob';
import type { SweepRecord } from '../lib/sweep/sweepRecord';
import type { SweepJob } from '../lib/sweep/sweepRuns';
import { BudgetRowBuffer } from './budgetRows';
import type { DiagnosticNeeds, MonitorStatus, SamplingOptions } from './diagnosticsApi';
import { DiagnosticsPublisher } from './diagnosticsPublisher';
import { snapshotExport, zonalCsvExport, zonalNetcdfExport, type ExportedFile } from './runExports';
import { macrotask } from './macrotask';
import { RescuePoint } from './rescuePoint';
import { ThreadChoice, type ThreadsInfo } from './threadChoice';
import { stateReport } from './stateReport';
import type {
  BlowUpStop,
  ExportKind,
  InitInfo,
  ParamChange,
  ReconfigureResult,
  SimulationApi,
  Snapshot,
  SnapshotRequest,
} from './simulationApi';
import { stateChecksum } from '../lib/io/digest';
import { isInputError } from '../lib/inputError';

/** Stepping time per slice before the host yields to its message queue (ms): short enough that
 * pause and snapshot requests are answered within a frame, long enough that yielding costs little. */
export const SLICE_MS = 12;

interface PendingRequest {
  after: number;
  resolve: (s: Snapshot) => void;
  reject: (e: Error) => void;
}

/**
 * The simulation worker's object, apart from the worker so that Node tests can drive it directly.
 * It owns the model and answers the verbs of `SimulationApi` (see there for the snapshot protocol).
 */
export class SimulationHost implements SimulationApi {
  private model: Model | null = null;
  private playing = false;
  private until: number | null = null;
  private stopped: string | null = null;
  private blowUp: BlowUpStop | null = null;
  /** The checkpoint `restartHalved` resumes: the rescue point with the step halved, made at the blow-up. */
  private retry: Checkpoint | null = null;
  /** The last good state, every RESCUE_EVERY steps and at every new run or change of parameters. */
  private readonly rescue = new RescuePoint();
  private version = 0;
  private epoch = 0;
  /** The opening field is u: eastward jets show directly as bands of u > 0. */
  private field: FieldName = 'u';
  /** Two layers: which view of the state the field is of (layerFields.ts); the barotropic flow by default. */
  private layerView: LayerView = 'barotropic';
  private pending: PendingRequest | null = null;
  /** A field buffer handed back by the UI, reused for the next snapshot. */
  private spareField: Float64Array | null = null;
  private spareBudget: Float64Array | null = null;
  private readonly rows = new BudgetRowBuffer();
  private readonly diagnostics = new DiagnosticsPublisher();
  /** The threads the step runs on (docs/threads.md): one until setThreads asks for more. */
  private readonly threads = new ThreadChoice();
  /** The changes of parameters within this run (epoch), for the views to mark on their time axes. */
  private changes: ParamChange[] = [];
  /** The readouts of the state while this model has taken no step yet (a loaded run, new parameters). */
  private unstepped: StepReport | null = null;
  /** The next slice of play, queued behind whatever messages are waiting. */
  private readonly nextSlice = macrotask(() => this.slice());

  async init(params: Partial<ModelParams>, sampling?: SamplingOptions): Promise<InitInfo> {
    const model = new Model({ ...params });
    this.diagnostics.resetOptions(sampling ?? {});
    return this.begin(model);
  }

  async restore(cp: Checkpoint): Promise<InitInfo> {
    // A loaded run is shown at once: its readouts and a first sample of its diagnostics.
    return this.begin(Model.restore(cp), true);
  }

  async restartHalved(): Promise<InitInfo> {
    this.requireModel();
    const cp = this.retry;
    if (!this.blowUp || !cp) throw new RangeError('restartHalved: the run has not blown up, or no checkpoint is kept');
    if (this.blowUp.refused) throw new RangeError(`restartHalved: ${this.blowUp.refused}`);
    const info = this.begin(Model.restore(cp));
    await this.play();
    return info;
  }

  async setThreads(count: number): Promise<ThreadsInfo> {
    const info = await this.threads.set(count, () => this.model);
    if (this.model) this.changed();
    return info;
  }

  async ping(): Promise<void> {}

  async play(): Promise<void> {
    this.requireModel();
    this.until = null;
    if (this.stopped !== null || this.playing) return;
    this.playing = true;
    this.changed();
    this.nextSlice.queue();
  }

  async pause(): Promise<void> {
    const was = this.playing;
    this.playing = false;
    this.until = null;
    if (was) this.changed();
  }

  async stepOnce(): Promise<StepReport> {
    const model = this.requireModel();
    this.playing = false;
    this.until = null;
    if (this.stopped === null) this.advance(() => this.stepAndRecord(model));
    this.changed();
    return copyReport(model.report);
  }

  async runUntil(time: number): Promise<void> {
    const model = this.requireModel();
    if (!Number.isFinite(time)) throw new RangeError(`runUntil: the time must be a finite number, got ${time}`);
    if (reachedTime(model.time, time, model.dt) || this.stopped !== null) return;
    this.until = time;
    this.playing = true;
    this.changed();
    this.nextSlice.queue();
  }

  async reconfigure(changes: Partial<ModelParams>): Promise<ReconfigureResult> {
    const model = this.requireModel();
    try {
      validateParams({ ...model.params, ...changes });
    } catch (e) {
      if (isInputError(e, 'parameters')) return { applied: false, issues: e.issues };
      throw e;
    }
    const old = { ...model.params };
    const next = model.reconfigure(changes);
    // A new domain or number of layers is a new run from t = 0 (Model.reconfigure builds it afresh).
    const fresh = next.params.Lx !== old.Lx || next.params.Ly !== old.Ly || next.params.layers !== old.layers;
    const how = next === model ? 'inPlace' : fresh ? 'fresh' : 'regrid';
    this.model = next;
    // A new grid may cross the size below which the step runs on one thread.
    this.threads.apply(next);
    this.rescue.take(next);
    let diagnostics: 'kept' | 'restarted' = 'restarted';
    if (how === 'fresh') {
      this.newEpoch();
      this.diagnostics.restart(next);
    } else {
      const keys = (Object.keys(next.params) as (keyof ModelParams)[]).filter((k) => next.params[k] !== old[k]);
      // Same domain: the history goes on (a new grid restarts the profiles, which change length).
      if (how === 'inPlace' && (keys.length === 0 || this.diagnostics.retune(next))) diagnostics = 'kept';
      else this.diagnostics.restart(next, true);
      if (keys.length > 0) this.changes.push({ time: next.time, steps: next.steps, keys, how, diagnostics });
    }
    this.unstepped = this.stateReport(next);
    // New parameters may well cure a blow-up (a smaller dt, more hyperviscosity): let it try again.
    this.clearStop();
    this.changed();
    return { applied: true, how, params: { ...next.params }, diagnostics };
  }

  async restartMeans(): Promise<MonitorStatus> {
    this.requireModel();
    this.diagnostics.restartMeans();
    this.changed();
    return this.diagnostics.status();
  }

  async setField(name: FieldName): Promise<void> {
    if (name === this.field) return;
    this.field = name;
    this.changed();
  }

  async setLayerView(view: LayerView): Promise<void> {
    if (!LAYER_VIEWS.includes(view)) throw new RangeError(`setLayerView: no view ${String(view)}`);
    if (view === this.layerView) return;
    this.layerView = view;
    this.changed();
  }

  async setDiagnostics(needs: DiagnosticNeeds): Promise<void> {
    this.diagnostics.setNeeds(needs, this.model);
    if (this.model) this.changed();
  }

  async setSampling(options: SamplingOptions): Promise<MonitorStatus> {
    this.diagnostics.setSampling(options, this.model);
    if (this.model) this.changed();
    return this.diagnostics.status();
  }

  async summary(): Promise<RunSummary> {
    const model = this.requireModel();
    return this.diagnostics.current.summary(model);
  }

  async exportFile(kind: ExportKind): Promise<ExportedFile> {
    const model = this.requireModel();
    const d = this.diagnostics.current;
    const file =
      kind === 'snapshot'
        ? snapshotExport(model, d)
        : kind === 'zonal-netcdf'
          ? zonalNetcdfExport(model, d)
          : zonalCsvExport(model, d);
    return transfer(file, [file.bytes.buffer]);
  }

  async checkpoint(): Promise<Checkpoint> {
    const cp = this.requireModel().checkpoint();
    return transfer(cp, [cp.qHat.buffer]);
  }

  nextSnapshot(request: SnapshotRequest): Promise<Snapshot> {
    if (request.recycleField) this.spareField = request.recycleField;
    if (request.recycleBudget) this.spareBudget = request.recycleBudget;
    if (this.pending)
      return Promise.reject(new Error('nextSnapshot: a request is already waiting; keep one in flight'));
    return new Promise<Snapshot>((resolve, reject) => {
      this.pending = { after: request.after, resolve, reject };
      this.answer();
    });
  }

  async runSweepJob(job: SweepJob): Promise<SweepRecord> {
    return runSweepJob(job, { seconds: () => performance.now() / 1000, iso: () => new Date().toISOString() });
  }

  async dispose(): Promise<void> {
    this.playing = false;
    this.model = null;
    this.threads.close();
    this.rescue.clear();
    this.clearStop();
    this.nextSlice.close();
    const p = this.pending;
    this.pending = null;
    p?.reject(new Error('simulation disposed'));
  }

  private begin(model: Model, sampleNow = false): InitInfo {
    this.threads.apply(model);
    this.model = model;
    this.playing = false;
    this.until = null;
    this.clearStop();
    this.rescue.take(model);
    this.newEpoch();
    this.diagnostics.restart(model, sampleNow);
    this.unstepped = this.stateReport(model);
    this.changed();
    return { params: { ...model.params }, forcedModes: model.forcedModes };
  }

  private newEpoch(): void {
    this.epoch++;
    this.rows.clear();
    this.changes = [];
  }

  /** The readouts of the state as it stands (stateReport.ts), or null where they cannot be formed. */
  private stateReport(model: Model): StepReport | null {
    return stateReport(model, this.diagnostics.current.monitor.snap);
  }

  private stepAndRecord(model: Model): void {
    this.unstepped = null;
    model.step(1);
    this.rescue.afterStep(model);
    this.rows.push(model.report);
    this.diagnostics.afterStep(model);
  }

  /** One slice of continuous play: step until the slice time is used (or the target time is reached), then publish and yield. */
  private slice(): void {
    const model = this.model;
    if (!this.playing || !model) return;
    const t0 = performance.now();
    const until = this.until;
    this.advance(() => {
      do this.stepAndRecord(model);
      while (performance.now() - t0 < SLICE_MS && (until === null || !reachedTime(model.time, until, model.dt)));
    });
    if (until !== null && reachedTime(model.time, until, model.dt)) {
      this.playing = false;
      this.until = null;
    }
    this.changed();
    if (this.playing) this.nextSlice.queue();
  }

  /** Run steps; a blow-up stops play and is kept for the snapshots (the model keeps its last good state). */
  private advance(run: () => void): void {
    try {
      run();
    } catch (e) {
      // A helper thread failed: the step left the state as it was and the model goes on alone.
      if (e instanceof ThreadTeamError) {
        this.threads.failed(e.message);
        return;
      }
      this.playing = false;
      this.until = null;
      this.stopped = e instanceof Error ? e.message : String(e);
      if (e instanceof BlowUpError) this.offerRestart(e);
    }
  }

  /** Prepare the way back from a blow-up: the rescue point with the step halved, and whether its parameters pass. */
  private offerRestart(e: BlowUpError): void {
    const kept = this.rescue.checkpoint();
    this.retry = kept ? retryCheckpoint(kept) : null;
    let refused: string | null = null;
    if (this.retry) {
      try {
        validateParams(this.retry.params);
      } catch (err) {
        if (!isInputError(err, 'parameters')) throw err;
        refused = `with the step halved, ${err.message}`;
      }
    }
    const r = kept ? retryRecord(1, e, kept) : null;
    this.blowUp = {
      report: blowUpReport(e),
      restart: r ? { time: r.restarted_at.time, steps: r.restarted_at.steps, dt: r.dt, cfl: r.cfl } : null,
      refused,
    };
  }

  private clearStop(): void {
    this.stopped = null;
    this.blowUp = null;
    this.retry = null;
  }

  /** The state changed: bump the version and answer a waiting request. */
  private changed(): void {
    this.version++;
    this.answer();
  }

  private answer(): void {
    const p = this.pending;
    const model = this.model;
    if (!p || !model || this.version <= p.after) return;
    this.pending = null;
    p.resolve(this.snapshot(model));
  }

  /** Fill a field buffer (the spare when it fits), hand over the budget rows, and mark both for transfer. */
  private snapshot(model: Model): Snapshot {
    const { nx, ny, Lx, Ly } = model.params;
    const values = this.spareField && this.spareField.length === nx * ny ? this.spareField : new Float64Array(nx * ny);
    this.spareField = null;
    model.field(this.field, values, this.layerView);
    const budget = this.rows.take(this.spareBudget);
    this.spareBudget = null;
    const diag = this.diagnostics.payload(performance.now(), this.playing);
    const snap: Snapshot = {
      version: this.version,
      epoch: this.epoch,
      field: this.field,
      layerView: this.layerView,
      values,
      nx,
      ny,
      Lx,
      Ly,
      params: { ...model.params },
      time: model.time,
      steps: model.steps,
      report: this.unstepped ? copyReport(this.unstepped) : copyReport(model.report),
      changes: this.changes.map((c) => ({ ...c, keys: [...c.keys] })),
      budget,
      checksum: stateChecksum(model.qHat),
      threads: this.threads.info(model),
      playing: this.playing,
      until: this.until,
      stopped: this.stopped,
      blowUp: this.blowUp,
      diagnostics: diag.payload,
    };
    return transfer(snap, [values.buffer, budget.data.buffer, ...diag.buffers]);
  }

  private requireModel(): Model {
    if (!this.model) throw new Error('no model: call init(params) first');
    return this.model;
  }
}
