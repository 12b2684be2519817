import { CHECKPOINT_FORMAT, CHECKPOINT_VERSION, type Checkpoint } from '../lib/model/checkpoint';
import type { Model } from '../lib/model/model';
import type { ModelParams } from '../lib/model/params';
import type { RandomState } from '../lib/model/randomStream';

/**
 * Steps between two in-memory checkpoints of a playing run. A multiple of the step count, not of
 * the wall clock, so the state a blow-up goes back to depends on the run alone and a restart is as
 * reproducible as the run. At the default 128² grid (about 5 ms a step) that is about a second of
 * play; the copy is one `set` of the spectrum, far cheaper than the 200 steps between.
 */
export const RESCUE_EVERY = 200;

/**
 * The worker's last good state, kept in memory so that a blown-up run can go back to it
 * (simulationHost.ts `restartHalved`). The spectrum is copied into a buffer allocated once per grid
 * size, so keeping it costs no allocation beyond the four numbers of the random state and, when the
 * parameters changed since the last copy, a copy of them.
 */
export class RescuePoint {
  private qHat = new Float64Array(0);
  private params: ModelParams | null = null;
  /** The model's own parameter object the copy was made from: a new one means new parameters. */
  private paramsSource: ModelParams | null = null;
  private time = 0;
  private steps = 0;
  private dt = 0;
  private rng: RandomState = [0, 0, 0, 0];

  /** Copy the model's state now. */
  take(model: Model): void {
    const q = model.qHat;
    if (this.qHat.length !== q.length) this.qHat = new Float64Array(q.length);
    this.qHat.set(q);
    if (model.params !== this.paramsSource) {
      this.paramsSource = model.params;
      this.params = { ...model.params };
    }
    this.time = model.time;
    this.steps = model.steps;
    this.dt = model.dt;
    this.rng = model.randomState();
  }

  /** Take the copy when the step count is a multiple of RESCUE_EVERY (call after every step). */
  afterStep(model: Model): void {
    if (model.steps % RESCUE_EVERY === 0) this.take(model);
  }

  /** Where the kept state stands, or null before the first copy. */
  get at(): { time: number; steps: number; params: ModelParams } | null {
    return this.params ? { time: this.time, steps: this.steps, params: this.params } : null;
  }

  /** The kept state as a checkpoint. Its spectrum is this object's buffer: copy it before changing it. */
  checkpoint(): Checkpoint | null {
    if (!this.params) return null;
    return {
      format: CHECKPOINT_FORMAT,
      version: CHECKPOINT_VERSION,
      params: this.params,
      time: this.time,
      steps: this.steps,
      dt: this.dt,
      rng: this.rng,
      qHat: this.qHat,
    };
  }

  clear(): void {
    this.params = this.paramsSource = null;
  }
}
