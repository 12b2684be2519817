import type { StepReport } from './budget';
import { CHECKPOINT_FORMAT, CHECKPOINT_VERSION, type Checkpoint } from './checkpoint';
import { fieldSpectrum, type FieldName } from './fields';
import { Forcing } from './forcing';
import { Grid } from './grid';
import { layerFieldSpectrum, type LayerView } from './layerFields';
import { LinearOperator } from './linearOperator';
import { ONE_LAYER_VALUES, type ModelParams } from './params';
import { RandomStream, type RandomState } from './randomStream';
import { RealTransform2D } from './realTransform2D';
import { regridSpectrum } from './regrid';
import { plainFloat64, SharedArena } from './sharedArena';
import { buildStepParts } from './stepParts';
import type { Stepper } from './stepper';
import type { StepThreads } from './threadTeam';
import type { TwoLayerLinearOperator } from './twoLayerLinear';
import type { TwoLayerStepper } from './twoLayerStepper';
import { validateParams } from './validateParams';

/**
 * A running model: validated parameters, the plan objects built once for its grid, and the state.
 * Same parameters, seed and number of steps give the same bits.
 *
 * One layer (layers = 1) or two (layers = 2, the Phillips model: docs/two-layer.md). The two-layer
 * state is one array, q̂₁ then q̂₂; its fields are read per view (`LayerView`: a layer, the barotropic
 * or the baroclinic flow), the barotropic one by default.
 *
 * Threads: with `StepThreads` from its host (the command line's or the app's helper threads), the
 * step runs on all of them, its arrays in shared memory (threadTeam.ts, docs/threads.md); the bits
 * are those of one thread. Without, the calling thread steps alone.
 */
export class Model {
  params: ModelParams;
  readonly grid: Grid;
  /** Transforms on kept modes only (the state never holds others). */
  transform!: RealTransform2D;
  /** One layer: the model's linear operator; two layers: that of the barotropic mode (k_d = 0). */
  private lin!: LinearOperator;
  /** Two layers: the coupled linear operator; null in one layer. */
  private lin2: TwoLayerLinearOperator | null = null;
  private forcing!: Forcing;
  private rng: RandomStream;
  private stepper!: Stepper | TwoLayerStepper;
  private readonly spec: Float64Array;
  private threads: StepThreads | null;

  /**
   * `blank` skips the initial random field (for restoring a state); `threads`, when given, are the
   * threads the step runs on (see `useThreads`).
   */
  constructor(input: unknown, blank = false, threads: StepThreads | null = null) {
    const p = validateParams(input);
    this.params = p;
    this.grid = new Grid(p);
    this.rng = new RandomStream(p.seed);
    this.threads = threads;
    this.build(p);
    this.spec = new Float64Array(2 * this.grid.spectralSize);
    if (p.init_energy > 0 && !blank) this.seedInitialField(p);
  }

  /**
   * Build the step for p (stepParts.ts), in shared memory with the helper threads joined when
   * there are threads, and the operators the model's other verbs use.
   */
  private build(p: ModelParams): void {
    const threads = this.threads && this.threads.count > 1 && !this.threads.failed ? this.threads : null;
    const arena = threads ? new SharedArena() : null;
    const parts = buildStepParts(
      this.grid,
      p,
      this.rng,
      arena ? arena.alloc : plainFloat64,
      threads ? threads.count : 1,
    );
    this.stepper = parts.stepper;
    this.forcing = parts.forcing;
    this.lin2 = parts.lin2;
    // Two layers: the barotropic operator (k_d = 0) for the diagnostics, and a transform of its own.
    this.lin = parts.lin ?? new LinearOperator(this.grid, { ...p, ...ONE_LAYER_VALUES, kd: 0, mu: 0 });
    this.transform = parts.transform ?? new RealTransform2D(this.grid, true);
    if (threads && arena) this.stepper.team = threads.join(this.stepper, p, arena.buffers);
  }

  /** A forcing of another kind on this model's annulus (for the initial field of an unforced run). */
  private buildForcing(p: ModelParams): Forcing {
    return new Forcing(this.grid, p, this.lin2 ? { invK2: this.lin2.invK2Barotropic } : this.lin);
  }

  /**
   * Step on these threads from now on (null: on the calling thread alone). The step is rebuilt, in
   * shared memory for threads, with its state, time, step count, dt and random stream kept: the
   * next steps have the same bits either way. Throws ThreadTeamError (threadTeam.ts) when a helper
   * could not join; the model then steps on the calling thread.
   */
  useThreads(threads: StepThreads | null): void {
    if (threads === this.threads && this.threadCount === (threads?.count ?? 1)) return;
    const old = this.stepper;
    this.threads?.release();
    this.threads = threads;
    try {
      this.build(this.params);
    } catch (e) {
      this.threads = null;
      this.build(this.params);
      throw e;
    } finally {
      this.stepper.qHat.set(old.qHat);
      this.stepper.time = old.time;
      this.stepper.steps = old.steps;
      this.stepper.dt = old.dt;
    }
  }

  /** Threads the step runs on (1: the calling thread alone). Not part of the bits. */
  get threadCount(): number {
    return this.stepper.team.members;
  }

  /**
   * A random field on the forcing annulus with energy init_energy, from its own seeded stream. Two
   * layers: each layer its own random phases (layer 1 draws first), so the field has barotropic and
   * baroclinic parts, scaled to the two-layer energy.
   */
  private seedInitialField(p: ModelParams): void {
    const init = new RandomStream((p.seed ^ 0x9e3779b9) >>> 0);
    const q = this.stepper.qHat;
    const f = this.forcing.modes.length ? this.forcing : this.buildForcing({ ...p, forcing: 'stochastic' });
    let e = 0;
    const cs = new Float64Array(2);
    const layers = this.lin2 ? 2 : 1;
    const n = 2 * this.grid.spectralSize;
    for (let layer = 0; layer < layers; layer++) {
      const o = layer * n;
      for (let i = 0; i < f.modes.length; i++) {
        const m = f.modes[i];
        init.phase(cs);
        q[o + 2 * m] = cs[0];
        q[o + 2 * m + 1] = cs[1];
        if (!this.lin2) e += this.lin.invK2[m];
        const mm = f.mirrors[i];
        if (mm >= 0) {
          q[o + 2 * mm] = q[o + 2 * m];
          q[o + 2 * mm + 1] = -q[o + 2 * m + 1];
        }
      }
    }
    if (this.lin2) e = twoLayerEnergy(q, this.grid, this.lin2);
    const scale = e > 0 ? Math.sqrt(p.init_energy / e) : 0;
    for (let i = 0; i < q.length; i++) q[i] *= scale;
  }

  get time(): number {
    return this.stepper.time;
  }
  get steps(): number {
    return this.stepper.steps;
  }
  /** The step in use (the last adaptive choice when cfl > 0). */
  get dt(): number {
    return this.stepper.dt;
  }
  /** The report of the last step (overwritten by the next). */
  get report(): StepReport {
    return this.stepper.report;
  }
  /** The PV anomaly spectrum, the model's state (half-plane layout). Read it; do not write it. */
  get qHat(): Float64Array {
    return this.stepper.qHat;
  }
  /** Number of layers, 1 or 2. */
  get layers(): 1 | 2 {
    return this.lin2 ? 2 : 1;
  }
  /** The random stream's state now (four numbers): with qHat, time, steps and dt, a checkpoint without copying the spectrum. */
  randomState(): RandomState {
    return this.rng.getState();
  }
  /** Number of independent forced modes on the annulus. */
  get forcedModes(): number {
    return this.forcing.count;
  }
  /**
   * The linear operator (damping rates, 1/K²) for diagnostics that need them; with two layers, that
   * of the barotropic mode (1/k², the damping of q in both layers, no drag: see `twoLayerLinear`).
   */
  get linear(): LinearOperator {
    return this.lin;
  }
  /** The two-layer linear operator (coefficients, inversions, propagators); null in one layer. */
  get twoLayerLinear(): TwoLayerLinearOperator | null {
    return this.lin2;
  }

  /** Advance n steps; returns the last step's report. Throws BlowUpError, leaving the last good state. */
  step(n = 1): StepReport {
    for (let i = 0; i < n; i++) this.stepper.step();
    return this.stepper.report;
  }

  /**
   * Replace the state by a spectrum (half-plane layout; two layers: q̂₁ then q̂₂); modes the model does
   * not keep are dropped.
   */
  setState(qHat: Float64Array): void {
    const q = this.stepper.qHat;
    if (qHat.length !== q.length) throw new RangeError(`setState: expected ${q.length} values, got ${qHat.length}`);
    const kept = this.lin.kept;
    for (let o = 0; o < q.length; o += 2 * kept.length) {
      for (let m = 0; m < kept.length; m++) {
        q[o + 2 * m] = kept[m] ? qHat[o + 2 * m] : 0;
        q[o + 2 * m + 1] = kept[m] ? qHat[o + 2 * m + 1] : 0;
      }
    }
  }

  /**
   * Spectrum of a field (half-plane layout) into out, or a new array. Two layers: of the view asked
   * for (default the barotropic flow; layerFields.ts); one layer: `view` is ignored.
   */
  spectrum(
    name: FieldName,
    out: Float64Array = new Float64Array(2 * this.grid.spectralSize),
    view: LayerView = 'barotropic',
  ): Float64Array {
    if (this.lin2) layerFieldSpectrum(name, view, this.stepper.qHat, this.grid, this.lin2, out);
    else fieldSpectrum(name, this.stepper.qHat, this.grid, this.lin, out);
    return out;
  }

  /** A field on the grid (row-major, y slow) into out, or a new array; `view` as for `spectrum`. */
  field(
    name: FieldName,
    out: Float64Array = new Float64Array(this.grid.size),
    view: LayerView = 'barotropic',
  ): Float64Array {
    this.spectrum(name, this.spec, view);
    this.transform.inverse(this.spec, out);
    return out;
  }

  /** A copy of everything needed to resume bit for bit. */
  checkpoint(): Checkpoint {
    return {
      format: CHECKPOINT_FORMAT,
      version: CHECKPOINT_VERSION,
      params: { ...this.params },
      time: this.stepper.time,
      steps: this.stepper.steps,
      dt: this.stepper.dt,
      rng: this.rng.getState(),
      qHat: this.stepper.qHat.slice(),
    };
  }

  /** A model resumed from a checkpoint: the next step is the one the original would have taken. */
  static restore(cp: Checkpoint, threads: StepThreads | null = null): Model {
    if (cp.format !== CHECKPOINT_FORMAT || cp.version !== CHECKPOINT_VERSION) {
      throw new RangeError(`not a ${CHECKPOINT_FORMAT} version ${CHECKPOINT_VERSION} checkpoint`);
    }
    const m = new Model(cp.params, true, threads);
    if (cp.qHat.length !== m.stepper.qHat.length) throw new RangeError('checkpoint spectrum does not match its grid');
    m.stepper.qHat.set(cp.qHat);
    m.stepper.time = cp.time;
    m.stepper.steps = cp.steps;
    m.stepper.dt = cp.dt;
    m.rng.setState(cp.rng);
    return m;
  }

  /**
   * The model with some parameters changed. Physical parameters change in place, keeping time,
   * steps, state and random stream (a new seed starts a new stream). A new grid (nx, ny) returns a new
   * Model carrying the state over, truncated or padded (`regridSpectrum`); a new domain (Lx, Ly)
   * returns a new Model started afresh. A new Model takes over this one's threads.
   */
  reconfigure(changes: Partial<ModelParams>): Model {
    const next = validateParams({ ...this.params, ...changes });
    const old = this.params;
    if (next.Lx !== old.Lx || next.Ly !== old.Ly || next.layers !== old.layers)
      return new Model(next, false, this.threads);
    const rng = next.seed === old.seed ? this.rng.getState() : new RandomStream(next.seed).getState();
    if (next.nx !== old.nx || next.ny !== old.ny) {
      const m = new Model(next, true, this.threads);
      const from = 2 * this.grid.spectralSize;
      const to = 2 * m.grid.spectralSize;
      for (let layer = 0; layer < next.layers; layer++) {
        const q = this.stepper.qHat.subarray(layer * from, (layer + 1) * from);
        m.stepper.qHat.set(regridSpectrum(q, this.grid, m.grid), layer * to);
      }
      m.stepper.time = this.stepper.time;
      m.stepper.steps = this.stepper.steps;
      m.rng.setState(rng);
      return m;
    }
    const cp = this.checkpoint();
    this.params = next;
    this.rng.setState(rng);
    this.build(next);
    this.stepper.qHat.set(cp.qHat);
    this.stepper.time = cp.time;
    this.stepper.steps = cp.steps;
    this.stepper.dt = Math.min(cp.dt, next.dt);
    return this;
  }
}

/** The two-layer energy ½Σ(|h₁q̂₁ + h₂q̂₂|²/k² + h₁h₂|q̂₁ − q̂₂|²/(k² + k_d²)) of a state (full plane). */
function twoLayerEnergy(q: Float64Array, grid: Grid, lin: TwoLayerLinearOperator): number {
  const { h1, h2 } = lin.coefficients;
  const n = 2 * grid.spectralSize;
  let e = 0;
  for (let m = 0; m < grid.spectralSize; m++) {
    if (!lin.kept[m]) continue;
    const t = 2 * m;
    const br = h1 * q[t] + h2 * q[n + t];
    const bi = h1 * q[t + 1] + h2 * q[n + t + 1];
    const cr = q[t] - q[n + t];
    const ci = q[t + 1] - q[n + t + 1];
    const w = m % grid.nkx === 0 ? 0.5 : 1;
    e += w * ((br * br + bi * bi) * lin.invK2Barotropic[m] + h1 * h2 * (cr * cr + ci * ci) * lin.invK2Baroclinic[m]);
  }
  return e;
}
