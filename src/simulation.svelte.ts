import { transfer, type Remote } from 'comlink';
import type { Checkpoint } from '../lib/model/checkpoint';
import type { FieldName } from '../lib/model/fields';
import type { LayerView } from '../lib/model/layerFields';
import type { ModelParams } from '../lib/model/params';
import type { RunSummary } from '../lib/analysis/summary';
import type { DiagnosticNeeds, MonitorStatus, SamplingOptions } from '../workers/diagnosticsApi';
import type { ExportedFile } from '../workers/runExports';
import type { ExportKind, ReconfigureResult, SimulationApi, Snapshot, SnapshotRequest } from '../workers/simulationApi';
import { BudgetHistory } from './budgetHistory';
import { DiagnosticsState } from './diagnostics.svelte';
import { copyCheckpoint, KeptCheckpoint } from './keep/keptCheckpoint';
import { WorkerLink, WorkerStoppedError } from './keep/workerLink';
import { RateMeter } from './rateMeter';
import { defaultThreads } from './threadCount';

/** How the last worker death was met: the run went on from the kept state at `time`, step `steps`. */
export interface Recovery {
  reason: string;
  time: number;
  steps: number;
  /** Nothing had been kept yet, so the run started again from t = 0 with its parameters. */
  fromStart: boolean;
}

/** More deaths than this within RESTART_WINDOW_MS and no new worker is started: something is wrong beyond one crash. */
const MAX_RESTARTS = 3;
const RESTART_WINDOW_MS = 10 * 60_000;
/** How often the kept copy is looked at (it is taken every KEEP_EVERY_MS, and at once for a new run). */
const KEEP_TICK_MS = 2000;

/**
 * The UI's side of the simulation worker: it holds only the latest snapshot and the budget history
 * it was sent, never the model. Snapshots are pulled once per animation frame at most (one request in
 * flight, the next made from requestAnimationFrame); the buffers of a replaced snapshot go back to the
 * worker with the next request, so playing allocates no arrays.
 *
 * It also keeps a checkpoint of the run (keptCheckpoint.ts, every ~10 s and at once for a new run or
 * new parameters). Should the worker die (workerLink.ts notices), a new worker resumes from that
 * copy with the same field, views' needs and sampling, playing if the run was, and `recovery` says so.
 */
export class SimulationClient {
  /** The latest snapshot: raw state (its arrays are never proxied), replaced whole. */
  snapshot = $state.raw<Snapshot | null>(null);
  /** Snapshots received so far: the signal views redraw on. */
  received = $state(0);
  /** Bumped whenever the budget history changed (the history itself is not reactive). */
  budgetVersion = $state(0);
  stepsPerSecond = $state(0);
  error = $state<string | null>(null);
  /** The user set ν by hand in this run: a new grid then keeps it instead of rescaling it (controls/gridChange.ts). */
  nuByHand = $state(false);
  /** The last time the worker died and the run was resumed in a new one, for the page to say; null otherwise. */
  recovery = $state.raw<Recovery | null>(null);
  readonly budget = new BudgetHistory();
  readonly diag = new DiagnosticsState();

  private link: WorkerLink;
  private readonly meter = new RateMeter();
  private readonly kept = new KeptCheckpoint();
  private readonly keepTimer: ReturnType<typeof setInterval>;
  private spareField: Float64Array | null = null;
  private spareBudget: Float64Array | null = null;
  private frame = 0;
  private pullingOn: WorkerLink | null = null;
  private closed = false;
  // What the worker was told, to tell a new one the same.
  private field: FieldName = 'u';
  private layerView: LayerView = 'barotropic';
  private needs: DiagnosticNeeds | null = null;
  private sampling: SamplingOptions = {};
  /** Threads the step is asked to run on (every core by default); told to every new worker first. */
  private threadsAsked = defaultThreads();
  /** The parameters of the last start, for a worker that dies before anything was kept. */
  private begun: Partial<ModelParams> | null = null;
  // A new worker counts epochs from 1 again: these offsets keep them rising across workers.
  private epochBase = 0;
  private diagEpochBase = 0;
  private lastEpoch = 0;
  private lastDiagEpoch = 0;
  private deaths: number[] = [];

  constructor() {
    this.link = this.newLink();
    this.keepTimer = setInterval(() => this.keepIfDue(), KEEP_TICK_MS);
  }

  /** Start a new run from `params` (validated by the caller) and, when asked, play it. */
  async start(params: Partial<ModelParams>, autoplay = true, sampling?: SamplingOptions): Promise<void> {
    this.begun = { ...params };
    this.sampling = { ...sampling };
    this.nuByHand = false;
    this.kept.forget();
    await this.guard(async (link) => {
      await link.call((api) => api.init(params, sampling), true);
      if (autoplay) await link.call((api) => api.play());
    });
    this.keepIfDue();
    this.ensurePulling();
  }

  /** Resume a saved run; plays when asked. Rejects (with the reason) when the worker refuses it. */
  async restore(cp: Checkpoint, autoplay = false): Promise<void> {
    const link = this.link;
    this.kept.forget();
    this.begun = { ...cp.params };
    this.nuByHand = false;
    await link.call((api) => api.restore(transfer(cp, [cp.qHat.buffer])), true);
    if (autoplay) await link.call((api) => api.play());
    this.error = null;
    this.keepIfDue();
    this.ensurePulling();
  }

  /** After a blow-up: back to the worker's last checkpoint with the step halved, playing (SimulationApi.restartHalved). */
  restartHalved = async (): Promise<void> => {
    this.kept.forget();
    await this.guard((link) => link.call((api) => api.restartHalved(), true).then(() => undefined));
    this.keepIfDue();
  };

  /** The current run from t = 0 with its current parameters and seed, playing if it was. */
  reset = (): Promise<void> => {
    const snap = this.snapshot;
    return snap ? this.start(snap.params, snap.playing) : Promise.resolve();
  };

  play = (): Promise<void> => this.guard((link) => link.call((api) => api.play()));
  pause = (): Promise<void> => this.guard((link) => link.call((api) => api.pause()));
  stepOnce = (): Promise<void> => this.guard(async (link) => void (await link.call((api) => api.stepOnce())));
  runUntil = (time: number): Promise<void> => this.guard((link) => link.call((api) => api.runUntil(time)));
  togglePlay = (): Promise<void> => (this.snapshot?.playing ? this.pause() : this.play());

  setField = (name: FieldName): Promise<void> => {
    this.field = name;
    return this.guard((link) => link.call((api) => api.setField(name)));
  };

  /** Threads asked for, the simulation worker included. */
  get threads(): number {
    return this.threadsAsked;
  }

  /** Step on `count` threads from now on (the bits do not depend on it; docs/threads.md). */
  setThreads = (count: number): Promise<void> => {
    this.threadsAsked = count;
    return this.guard((link) => link.call((api) => api.setThreads(count), true).then(() => undefined));
  };

  /** Two layers: which view of the state the Field shows (upper, lower, barotropic, baroclinic). */
  setLayerView = (view: LayerView): Promise<void> => {
    this.layerView = view;
    return this.guard((link) => link.call((api) => api.setLayerView(view)));
  };

  /** Tell the worker what the shown view needs (it computes nothing else). */
  setNeeds = (needs: DiagnosticNeeds): Promise<void> => {
    this.needs = { ...needs };
    return this.guard((link) => link.call((api) => api.setDiagnostics(needs)));
  };

  /** Change sampling or averaging; rejects with the reason (RangeError) when refused. */
  async setSampling(options: SamplingOptions): Promise<MonitorStatus> {
    const status = await this.link.call((api) => api.setSampling(options));
    this.sampling = { ...this.sampling, ...options };
    return { ...status, epoch: status.epoch + this.diagEpochBase };
  }

  /** Start the time means again from the next sample (the rest of the diagnostics' record stays). */
  async restartMeans(): Promise<MonitorStatus> {
    const status = await this.link.call((api) => api.restartMeans());
    return { ...status, epoch: status.epoch + this.diagEpochBase };
  }

  summary(): Promise<RunSummary> {
    return this.link.call((api) => api.summary(), true);
  }

  exportFile(kind: ExportKind): Promise<ExportedFile> {
    return this.link.call((api) => api.exportFile(kind), true);
  }

  reconfigure(changes: Partial<ModelParams>): Promise<ReconfigureResult> {
    return this.link.call<ReconfigureResult>((api) => api.reconfigure(changes), true);
  }

  /** A checkpoint of the run now (a copy, the caller's). A save's checkpoint also refreshes the kept copy. */
  async checkpoint(): Promise<Checkpoint> {
    const asked = this.kept.generation;
    const cp = await this.link.call((api) => api.checkpoint(), true);
    this.kept.offer(cp, asked, this.lastEpoch, performance.now());
    return cp;
  }

  /**
   * For the browser tests of recovery only (reached through src/keep/testHooks.ts): end the worker
   * as a crash would, telling nothing, so that the watchdog has to find out.
   */
  killWorker(): void {
    this.link.kill();
  }

  /** Stop pulling, release the model and end the worker. */
  dispose(): void {
    this.closed = true;
    cancelAnimationFrame(this.frame);
    clearInterval(this.keepTimer);
    this.link.close();
  }

  private newLink(): WorkerLink {
    const link: WorkerLink = new WorkerLink((reason) => void this.recover(link, reason));
    // The threads first: a run the worker starts or resumes then steps on them from its first step.
    const count = this.threadsAsked;
    void link.call((api) => api.setThreads(count), true).catch(() => undefined);
    return link;
  }

  /** The worker died: resume the run in a new one from the kept copy (or from t = 0 if none was kept yet). */
  private async recover(dead: WorkerLink, reason: string): Promise<void> {
    if (this.closed || dead !== this.link) return;
    const now = performance.now();
    this.deaths = this.deaths.filter((t) => now - t < RESTART_WINDOW_MS);
    this.deaths.push(now);
    const last = this.snapshot;
    if (this.deaths.length > MAX_RESTARTS) {
      this.stepsPerSecond = 0;
      this.error = `The simulation worker stopped (${reason}) ${this.deaths.length} times in ten minutes and was not started again. Reload the page to go on from the state last saved in this browser.`;
      return;
    }
    this.epochBase = this.lastEpoch;
    this.diagEpochBase = this.lastDiagEpoch;
    const link = (this.link = this.newLink());
    const cp = this.kept.checkpoint;
    const { begun, sampling, field, layerView, needs } = this;
    const until = last?.until ?? null;
    try {
      if (cp) {
        // A copy goes: the kept one must outlive this worker too.
        const copy = copyCheckpoint(cp);
        await link.call((api) => api.restore(transfer(copy, [copy.qHat.buffer])), true);
        if (Object.keys(sampling).length > 0) await link.call((api) => api.setSampling(sampling));
      } else if (begun) await link.call((api) => api.init(begun, sampling), true);
      else return;
      await link.call((api) => api.setField(field));
      await link.call((api) => api.setLayerView(layerView));
      if (needs) await link.call((api) => api.setDiagnostics(needs));
      if (until !== null) await link.call((api) => api.runUntil(until));
      else if (last?.playing) await link.call((api) => api.play());
    } catch (e) {
      if (!(e instanceof WorkerStoppedError)) this.fail(e);
      return;
    }
    this.recovery = { reason, time: cp?.time ?? 0, steps: cp?.steps ?? 0, fromStart: !cp };
    this.ensurePulling();
  }

  private keepIfDue(): void {
    const link = this.link;
    if (this.closed || !link.alive || !this.kept.due(this.snapshot, performance.now())) return;
    void this.kept
      .refresh(
        () => link.call((api) => api.checkpoint()),
        () => this.lastEpoch,
        () => performance.now(),
      )
      .catch(() => undefined);
  }

  private ensurePulling(): void {
    if (this.pullingOn === this.link || this.closed) return;
    this.pullingOn = this.link;
    void this.pull(this.link, 0);
  }

  /** Wait for a snapshot newer than `after`, keep it, and ask again on the next frame. */
  private async pull(link: WorkerLink, after: number): Promise<void> {
    if (this.closed || link !== this.link) return;
    const request: SnapshotRequest = { after };
    const buffers: ArrayBuffer[] = [];
    if (this.spareField) buffers.push((request.recycleField = this.spareField).buffer as ArrayBuffer);
    if (this.spareBudget) buffers.push((request.recycleBudget = this.spareBudget).buffer as ArrayBuffer);
    this.spareField = this.spareBudget = null;
    let snap: Snapshot;
    try {
      snap = await link.call((api: Remote<SimulationApi>) => api.nextSnapshot(transfer(request, buffers)));
    } catch (e) {
      if (this.pullingOn === link) this.pullingOn = null;
      if (!this.closed && link === this.link && !(e instanceof WorkerStoppedError)) this.fail(e);
      return;
    }
    if (this.closed || link !== this.link) return;
    snap.epoch += this.epochBase;
    snap.diagnostics.status.epoch += this.diagEpochBase;
    this.lastEpoch = snap.epoch;
    this.lastDiagEpoch = snap.diagnostics.status.epoch;
    if (this.budget.ingest(snap.epoch, snap.budget)) this.budgetVersion++;
    this.diag.ingest(snap.diagnostics);
    this.stepsPerSecond = snap.playing ? this.meter.sample(snap.steps, performance.now()) : 0;
    // The replaced snapshot has been drawn; its buffers go back with the next request.
    this.spareField = this.snapshot?.values ?? null;
    this.spareBudget = snap.budget.data;
    this.snapshot = snap;
    this.received++;
    this.keepIfDue();
    this.frame = requestAnimationFrame(() => void this.pull(link, snap.version));
  }

  private async guard(run: (link: WorkerLink) => Promise<void>): Promise<void> {
    try {
      await run(this.link);
    } catch (e) {
      // A dead worker's calls fail; the recovery says what happened.
      if (!(e instanceof WorkerStoppedError)) this.fail(e);
    }
  }

  private fail(e: unknown): void {
    this.error = e instanceof Error ? e.message : String(e);
  }
}
