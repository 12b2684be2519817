import { transfer } from 'comlink';
import { copyReport, type StepReport } from '../lib/model/budget';
import { Model } from '../lib/model/model';
import type { ModelParams } from '../lib/model/params';
import { macrotask } from './macrotask';
import type { InitInfo, SimulationApi, Snapshot } from './simulationApi';

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
  private stopped: string | null = null;
  private version = 0;
  private pending: PendingRequest | null = null;
  /** A field buffer handed back by the UI, reused for the next snapshot. */
  private spare: Float64Array | null = null;
  /** The next slice of play, queued behind whatever messages are waiting. */
  private readonly nextSlice = macrotask(() => this.slice());

  async init(params: Partial<ModelParams>): Promise<InitInfo> {
    const model = new Model({ ...params });
    this.model = model;
    this.playing = false;
    this.stopped = null;
    this.spare = null;
    this.changed();
    return { params: { ...model.params }, forcedModes: model.forcedModes };
  }

  async play(): Promise<void> {
    this.requireModel();
    if (this.stopped !== null || this.playing) return;
    this.playing = true;
    this.changed();
    this.nextSlice.queue();
  }

  async pause(): Promise<void> {
    if (!this.playing) return;
    this.playing = false;
    this.changed();
  }

  async stepOnce(): Promise<StepReport> {
    const model = this.requireModel();
    this.playing = false;
    if (this.stopped === null) this.advance(() => model.step(1));
    this.changed();
    return copyReport(model.report);
  }

  nextSnapshot(after: number, recycle?: Float64Array): Promise<Snapshot> {
    if (recycle) this.spare = recycle;
    if (this.pending) return Promise.reject(new Error('nextSnapshot: a request is already waiting; keep one in flight'));
    return new Promise<Snapshot>((resolve, reject) => {
      this.pending = { after, resolve, reject };
      this.answer();
    });
  }

  async dispose(): Promise<void> {
    this.playing = false;
    this.model = null;
    this.nextSlice.close();
    const p = this.pending;
    this.pending = null;
    p?.reject(new Error('simulation disposed'));
  }

  /** One slice of continuous play: step until the slice time is used, then publish and yield. */
  private slice(): void {
    const model = this.model;
    if (!this.playing || !model) return;
    const t0 = performance.now();
    this.advance(() => {
      do model.step(1);
      while (performance.now() - t0 < SLICE_MS);
    });
    this.changed();
    if (this.playing) this.nextSlice.queue();
  }

  /** Run steps; a blow-up stops play and is kept for the snapshots (the model keeps its last good state). */
  private advance(run: () => void): void {
    try {
      run();
    } catch (e) {
      this.playing = false;
      this.stopped = e instanceof Error ? e.message : String(e);
    }
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

  /** Fill a field buffer (the spare when it fits) and mark it for transfer, not copy. */
  private snapshot(model: Model): Snapshot {
    const { nx, ny, Lx, Ly } = model.params;
    const zeta = this.spare && this.spare.length === nx * ny ? this.spare : new Float64Array(nx * ny);
    this.spare = null;
    model.field('zeta', zeta);
    const snap: Snapshot = {
      version: this.version,
      zeta,
      nx,
      ny,
      Lx,
      Ly,
      time: model.time,
      steps: model.steps,
      report: copyReport(model.report),
      playing: this.playing,
      stopped: this.stopped,
    };
    return transfer(snap, [zeta.buffer]);
  }

  private requireModel(): Model {
    if (!this.model) throw new Error('no model: call init(params) first');
    return this.model;
  }
}
