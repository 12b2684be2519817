import type { StepReport } from './budget';
import { CHECKPOINT_FORMAT, CHECKPOINT_VERSION, type Checkpoint } from './checkpoint';
import { fieldSpectrum, type FieldName } from './fields';
import { Forcing } from './forcing';
import { Grid } from './grid';
import { LinearOperator } from './linearOperator';
import { NonlinearTerm } from './nonlinearTerm';
import type { ModelParams } from './params';
import { RandomStream, type RandomState } from './randomStream';
import { RealTransform2D } from './realTransform2D';
import { regridSpectrum } from './regrid';
import { Stepper } from './stepper';
import { validateParams } from './validateParams';

/**
 * A running model: validated parameters, the plan objects built once for its grid, and the state.
 * Same parameters, seed and number of steps give the same bits.
 */
export class Model {
  params: ModelParams;
  readonly grid: Grid;
  /** Transforms on kept modes only (the state never holds others). */
  readonly transform: RealTransform2D;
  private lin: LinearOperator;
  private forcing: Forcing;
  private rng: RandomStream;
  private stepper: Stepper;
  private readonly spec: Float64Array;

  /** `blank` skips the initial random field (for restoring a state). */
  constructor(input: unknown, blank = false) {
    const p = validateParams(input);
    this.params = p;
    this.grid = new Grid(p);
    this.transform = new RealTransform2D(this.grid, true);
    this.rng = new RandomStream(p.seed);
    this.lin = new LinearOperator(this.grid, p);
    this.forcing = new Forcing(this.grid, p, this.lin);
    this.stepper = this.buildStepper(p);
    this.spec = new Float64Array(2 * this.grid.spectralSize);
    if (p.init_energy > 0 && !blank) this.seedInitialField(p);
  }

  private buildStepper(p: ModelParams): Stepper {
    const nl = new NonlinearTerm(this.grid, this.lin, this.transform);
    return new Stepper(this.grid, p, this.lin, nl, this.forcing, this.rng);
  }

  /** A random field on the forcing annulus with energy init_energy, from its own seeded stream. */
  private seedInitialField(p: ModelParams): void {
    const init = new RandomStream((p.seed ^ 0x9e3779b9) >>> 0);
    const q = this.stepper.qHat;
    const f = this.forcing.modes.length
      ? this.forcing
      : new Forcing(this.grid, { ...p, forcing: 'stochastic' }, this.lin);
    let e = 0;
    const cs = new Float64Array(2);
    for (let i = 0; i < f.modes.length; i++) {
      const m = f.modes[i];
      init.phase(cs);
      q[2 * m] = cs[0];
      q[2 * m + 1] = cs[1];
      e += this.lin.invK2[m];
      const mm = f.mirrors[i];
      if (mm >= 0) {
        q[2 * mm] = q[2 * m];
        q[2 * mm + 1] = -q[2 * m + 1];
      }
    }
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
  /** The random stream's state now (four numbers): with qHat, time, steps and dt, a checkpoint without copying the spectrum. */
  randomState(): RandomState {
    return this.rng.getState();
  }
  /** Number of independent forced modes on the annulus. */
  get forcedModes(): number {
    return this.forcing.count;
  }
  /** The linear operator (damping rates, 1/K²) for diagnostics that need them. */
  get linear(): LinearOperator {
    return this.lin;
  }

  /** Advance n steps; returns the last step's report. Throws BlowUpError, leaving the last good state. */
  step(n = 1): StepReport {
    for (let i = 0; i < n; i++) this.stepper.step();
    return this.stepper.report;
  }

  /** Replace the state by a spectrum (half-plane layout); modes the model does not keep are dropped. */
  setState(qHat: Float64Array): void {
    const q = this.stepper.qHat;
    if (qHat.length !== q.length) throw new RangeError(`setState: expected ${q.length} values, got ${qHat.length}`);
    const kept = this.lin.kept;
    for (let m = 0; m < kept.length; m++) {
      q[2 * m] = kept[m] ? qHat[2 * m] : 0;
      q[2 * m + 1] = kept[m] ? qHat[2 * m + 1] : 0;
    }
  }

  /** Spectrum of a field (half-plane layout) into out, or a new array. */
  spectrum(name: FieldName, out: Float64Array = new Float64Array(2 * this.grid.spectralSize)): Float64Array {
    fieldSpectrum(name, this.stepper.qHat, this.grid, this.lin, out);
    return out;
  }

  /** A field on the grid (row-major, y slow) into out, or a new array. */
  field(name: FieldName, out: Float64Array = new Float64Array(this.grid.size)): Float64Array {
    fieldSpectrum(name, this.stepper.qHat, this.grid, this.lin, this.spec);
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
  static restore(cp: Checkpoint): Model {
    if (cp.format !== CHECKPOINT_FORMAT || cp.version !== CHECKPOINT_VERSION) {
      throw new RangeError(`not a ${CHECKPOINT_FORMAT} version ${CHECKPOINT_VERSION} checkpoint`);
    }
    const m = new Model(cp.params, true);
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
   * returns a new Model started afresh.
   */
  reconfigure(changes: Partial<ModelParams>): Model {
    const next = validateParams({ ...this.params, ...changes });
    const old = this.params;
    if (next.Lx !== old.Lx || next.Ly !== old.Ly) return new Model(next);
    const rng = next.seed === old.seed ? this.rng.getState() : new RandomStream(next.seed).getState();
    if (next.nx !== old.nx || next.ny !== old.ny) {
      const m = new Model(next, true);
      m.stepper.qHat.set(regridSpectrum(this.stepper.qHat, this.grid, m.grid));
      m.stepper.time = this.stepper.time;
      m.stepper.steps = this.stepper.steps;
      m.rng.setState(rng);
      return m;
    }
    const cp = this.checkpoint();
    this.params = next;
    this.rng.setState(rng);
    this.lin = new LinearOperator(this.grid, next);
    this.forcing = new Forcing(this.grid, next, this.lin);
    this.stepper = this.buildStepper(next);
    this.stepper.qHat.set(cp.qHat);
    this.stepper.time = cp.time;
    this.stepper.steps = cp.steps;
    this.stepper.dt = Math.min(cp.dt, next.dt);
    return this;
  }
}
