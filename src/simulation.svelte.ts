import { transfer, wrap, type Remote } from 'comlink';
import type { Checkpoint } from '../lib/model/checkpoint';
import type { FieldName } from '../lib/model/fields';
import type { ModelParams } from '../lib/model/params';
import type { RunSummary } from '../lib/analysis/summary';
import type { DiagnosticNeeds, MonitorStatus, SamplingOptions } from '../workers/diagnosticsApi';
import type { ExportedFile } from '../workers/runExports';
import type { ExportKind, ReconfigureResult, SimulationApi, Snapshot, SnapshotRequest } from '../workers/simulationApi';
import { BudgetHistory } from './budgetHistory';
import { DiagnosticsState } from './diagnostics.svelte';
import { RateMeter } from './rateMeter';

/**
 * The UI's side of the simulation worker: it holds only the latest snapshot and the budget history
 * it was sent, never the model. Snapshots are pulled once per animation frame at most (one request in
 * flight, the next made from requestAnimationFrame); the buffers of a replaced snapshot go back to the
 * worker with the next request, so playing allocates no arrays.
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
  readonly budget = new BudgetHistory();
  readonly diag = new DiagnosticsState();

  private readonly worker: Worker;
  private readonly api: Remote<SimulationApi>;
  private readonly meter = new RateMeter();
  private spareField: Float64Array | null = null;
  private spareBudget: Float64Array | null = null;
  private frame = 0;
  private pulling = false;
  private closed = false;

  constructor() {
    this.worker = new Worker(new URL('../workers/simulation.worker.ts', import.meta.url), { type: 'module' });
    this.api = wrap<SimulationApi>(this.worker);
    this.worker.addEventListener('error', (e) => this.fail(e.message || 'the simulation worker failed to start'));
  }

  /** Start a new run from `params` (validated by the caller) and, when asked, play it. */
  async start(params: Partial<ModelParams>, autoplay = true, sampling?: SamplingOptions): Promise<void> {
    await this.guard(async () => {
      await this.api.init(params, sampling);
      if (autoplay) await this.api.play();
    });
    this.ensurePulling();
  }

  /** Resume a saved run; plays when asked. Rejects (with the reason) when the worker refuses it. */
  async restore(cp: Checkpoint, autoplay = false): Promise<void> {
    await this.api.restore(transfer(cp, [cp.qHat.buffer]));
    if (autoplay) await this.api.play();
    this.error = null;
    this.ensurePulling();
  }

  /** The current run from t = 0 with its current parameters and seed, playing if it was. */
  reset = (): Promise<void> => {
    const snap = this.snapshot;
    return snap ? this.start(snap.params, snap.playing) : Promise.resolve();
  };

  play = (): Promise<void> => this.guard(() => this.api.play());
  pause = (): Promise<void> => this.guard(() => this.api.pause());
  stepOnce = (): Promise<void> => this.guard(async () => void (await this.api.stepOnce()));
  runUntil = (time: number): Promise<void> => this.guard(() => this.api.runUntil(time));
  togglePlay = (): Promise<void> => (this.snapshot?.playing ? this.pause() : this.play());
  setField = (name: FieldName): Promise<void> => this.guard(() => this.api.setField(name));

  /** Tell the worker what the shown view needs (it computes nothing else). */
  setNeeds = (needs: DiagnosticNeeds): Promise<void> => this.guard(() => this.api.setDiagnostics(needs));

  /** Change sampling or averaging; rejects with the reason (RangeError) when refused. */
  setSampling(options: SamplingOptions): Promise<MonitorStatus> {
    return this.api.setSampling(options);
  }

  summary(): Promise<RunSummary> {
    return this.api.summary();
  }

  exportFile(kind: ExportKind): Promise<ExportedFile> {
    return this.api.exportFile(kind);
  }

  reconfigure(changes: Partial<ModelParams>): Promise<ReconfigureResult> {
    return this.api.reconfigure(changes);
  }

  checkpoint(): Promise<Checkpoint> {
    return this.api.checkpoint();
  }

  /** Stop pulling, release the model and end the worker. */
  dispose(): void {
    this.closed = true;
    cancelAnimationFrame(this.frame);
    this.api.dispose().catch(() => undefined).finally(() => this.worker.terminate());
  }

  private ensurePulling(): void {
    if (this.pulling || this.closed) return;
    this.pulling = true;
    void this.pull(0);
  }

  /** Wait for a snapshot newer than `after`, keep it, and ask again on the next frame. */
  private async pull(after: number): Promise<void> {
    if (this.closed) return;
    const request: SnapshotRequest = { after };
    const buffers: ArrayBuffer[] = [];
    if (this.spareField) buffers.push((request.recycleField = this.spareField).buffer as ArrayBuffer);
    if (this.spareBudget) buffers.push((request.recycleBudget = this.spareBudget).buffer as ArrayBuffer);
    this.spareField = this.spareBudget = null;
    let snap: Snapshot;
    try {
      snap = await this.api.nextSnapshot(transfer(request, buffers));
    } catch (e) {
      if (!this.closed) this.fail(e);
      this.pulling = false;
      return;
    }
    if (this.closed) return;
    if (this.budget.ingest(snap.epoch, snap.budget)) this.budgetVersion++;
    this.diag.ingest(snap.diagnostics);
    this.stepsPerSecond = snap.playing ? this.meter.sample(snap.steps, performance.now()) : 0;
    // The replaced snapshot has been drawn; its buffers go back with the next request.
    this.spareField = this.snapshot?.values ?? null;
    this.spareBudget = snap.budget.data;
    this.snapshot = snap;
    this.received++;
    this.frame = requestAnimationFrame(() => void this.pull(snap.version));
  }

  private async guard(run: () => Promise<void>): Promise<void> {
    try {
      await run();
    } catch (e) {
      this.fail(e);
    }
  }

  private fail(e: unknown): void {
    this.error = e instanceof Error ? e.message : String(e);
  }
}
