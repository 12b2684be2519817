import { transfer, wrap, type Remote } from 'comlink';
import type { ModelParams } from '../lib/model/params';
import type { SimulationApi, Snapshot } from '../workers/simulationApi';

/**
 * The UI's side of the simulation worker: it holds only the latest snapshot, never the model.
 * Snapshots are pulled once per animation frame at most (one request in flight, the next made from
 * requestAnimationFrame), and each snapshot's field buffer goes back to the worker once a newer one
 * has replaced it, so playing allocates no field arrays.
 */
export class SimulationClient {
  /** The latest snapshot: raw state (its field array is never proxied), replaced whole. */
  snapshot = $state.raw<Snapshot | null>(null);
  /** Snapshots received so far: the signal views redraw on. */
  received = $state(0);
  error = $state<string | null>(null);

  private readonly worker: Worker;
  private readonly api: Remote<SimulationApi>;
  private spare: Float64Array | null = null;
  private frame = 0;
  private closed = false;

  constructor() {
    this.worker = new Worker(new URL('../workers/simulation.worker.ts', import.meta.url), { type: 'module' });
    this.api = wrap<SimulationApi>(this.worker);
    this.worker.addEventListener('error', (e) => this.fail(e.message || 'the simulation worker failed to start'));
  }

  /** Build the model from `params` (completed with the defaults) and, when asked, start playing. */
  async start(params: Partial<ModelParams>, autoplay = true): Promise<void> {
    try {
      await this.api.init(params);
      if (autoplay) await this.api.play();
      void this.pull(0);
    } catch (e) {
      this.fail(e);
    }
  }

  play = (): Promise<void> => this.api.play().catch((e: unknown) => this.fail(e));
  pause = (): Promise<void> => this.api.pause().catch((e: unknown) => this.fail(e));
  stepOnce = (): Promise<void> => this.api.stepOnce().then(() => undefined, (e: unknown) => this.fail(e));

  /** Stop pulling, release the model and end the worker. */
  dispose(): void {
    this.closed = true;
    cancelAnimationFrame(this.frame);
    this.api.dispose().catch(() => undefined).finally(() => this.worker.terminate());
  }

  /** Wait for a snapshot newer than `after`, keep it, and ask again on the next frame. */
  private async pull(after: number): Promise<void> {
    if (this.closed) return;
    const spare = this.spare;
    this.spare = null;
    let snap: Snapshot;
    try {
      snap = await (spare ? this.api.nextSnapshot(after, transfer(spare, [spare.buffer])) : this.api.nextSnapshot(after));
    } catch (e) {
      if (!this.closed) this.fail(e);
      return;
    }
    if (this.closed) return;
    // The replaced snapshot has been drawn; its buffer can go back with the next request.
    this.spare = this.snapshot?.zeta ?? null;
    this.snapshot = snap;
    this.received++;
    this.frame = requestAnimationFrame(() => void this.pull(snap.version));
  }

  private fail(e: unknown): void {
    this.error = e instanceof Error ? e.message : String(e);
  }
}
