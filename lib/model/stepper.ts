import { closeReport, emptyReport, type QuadraticBudget, type StepReport } from './budget';
import type { Forcing } from './forcing';
import type { Grid } from './grid';
import type { LinearOperator } from './linearOperator';
import { ModeSlabs } from './modeSlabs';
import type { NonlinearTerm } from './nonlinearTerm';
import type { ModelParams } from './params';
import type { RandomStream } from './randomStream';
import { plainFloat64, type Float64Alloc } from './sharedArena';
import { MAX_THREADS, slabRange, SoloTeam, type PhasedStep, type StepTeam } from './stepTeam';

/**
 * Above this CFL number, dt·(max|u|/dx + max|v|/dy), the step is refused: RK4 is stable for
 * advection by a spectral derivative only while dt·|u|·k_max ≤ 2√2, and with the 2/3 rule
 * k_max = (2π/3)/dx, which allows about 1.35; the stop leaves a margin for the speeds not being
 * at their maxima in both directions at once.
 */
export const CFL_LIMIT = 1.5;

/** The smallest adaptive step, as a fraction of the largest (2^−40). */
export const MIN_STEP_FRACTION = 2 ** -40;

/** The run stopped: a non-finite state or a CFL number above the limit. */
export class BlowUpError extends Error {
  readonly report: { time: number; steps: number; dt: number; cfl: number; maxU: number; maxV: number; reason: string };
  constructor(reason: string, r: StepReport) {
    super(
      `run stopped at t = ${r.time.toPrecision(6)}, step ${r.steps}: ${reason} ` +
        `(dt = ${r.dt.toPrecision(4)}, CFL = ${r.cfl.toPrecision(4)}, max|u| = ${r.maxU.toPrecision(4)}, max|v| = ${r.maxV.toPrecision(4)})`,
    );
    this.name = 'BlowUpError';
    this.report = { time: r.time, steps: r.steps, dt: r.dt, cfl: r.cfl, maxU: r.maxU, maxV: r.maxV, reason };
  }
}

/** The phases of a one-layer step (stepTeam.ts); 0 is the team's own. */
const GRID_Q = 1;
const PRODUCTS = 2;
const TENDENCY_A = 3;
const STAGE_2 = 4;
const STAGE_3 = 5;
const STAGE_4 = 6;
const COMBINE = 7;

/**
 * Integrating-factor RK4 (the linear terms, waves and damping, are integrated exactly):
 *   a = N(q),  b = N(E½(q + ½dt·a)),  c = N(E½q + ½dt·b),  d = N(E q + dt·E½c),
 *   q ← E q + dt/6·(E a + 2E½(b + c) + d),   E = e^{L dt}, E½ = e^{L dt/2},
 * N = −J(ψ, q) + F_steady; then the stochastic kick q̂ += √dt ξ. Fourth order in dt for the
 * deterministic part. One step allocates nothing. `report` is overwritten by every step.
 *
 * A step is a sequence of phases (stepTeam.ts, docs/threads.md) that the `team` runs: the three
 * passes of each evaluation of N (nonlinearTerm.ts), with each stage's update folded into the pass
 * on kx columns that ends the evaluation before it. Between phases the calling thread alone takes
 * the budgets, the energy of the new state (both in one fixed order of the modes), the adaptive
 * step and the random kick, so the bits do not depend on how many threads share the phases. The
 * arrays threads share are `alloc`ated (sharedArena.ts).
 */
export class Stepper implements PhasedStep {
  readonly grid: Grid;
  readonly qHat: Float64Array;
  time = 0;
  steps = 0;
  /** The step in use (fixed, or the last adaptive choice). */
  dt: number;
  readonly report: StepReport = emptyReport();
  /** Who runs the phases; the calling thread alone unless threads are given (Model.useThreads). */
  team: StepTeam = new SoloTeam(this);
  readonly lin: LinearOperator;
  readonly nl: NonlinearTerm;
  readonly forcing: Forcing;
  private readonly dtMax: number;
  private readonly cfl: number;
  private readonly rng: RandomStream;
  /** Where the stage spectra a, b, c, d, w keep their modes (modeSlabs.ts: by column slab). */
  private readonly modes: ModeSlabs;
  private readonly a: Float64Array;
  private readonly b: Float64Array;
  private readonly c: Float64Array;
  private readonly d: Float64Array;
  private readonly w: Float64Array;
  /** What the calling thread tells the others for a phase: dt, and 1 when the propagators change. */
  private readonly args: Float64Array;
  /** max|u|, max|v| of each row slab in the last `products` pass. */
  private readonly speeds: Float64Array;
  /** The slabs a member runs (slabRange); each thread builds its own Stepper, so its own. */
  private readonly slabsOfMember = new Int32Array(2);
  private readonly kick = new Float64Array(2);

  constructor(
    grid: Grid,
    p: ModelParams,
    lin: LinearOperator,
    nl: NonlinearTerm,
    forcing: Forcing,
    rng: RandomStream,
    alloc: Float64Alloc = plainFloat64,
  ) {
    this.grid = grid;
    this.lin = lin;
    this.nl = nl;
    this.forcing = forcing;
    this.rng = rng;
    this.dtMax = p.dt;
    this.cfl = p.cfl;
    this.dt = p.dt;
    const ns = 2 * grid.spectralSize;
    this.qHat = alloc(ns);
    // Stage buffers: only kept modes are ever written, so the rest stay zero (evaluateKept relies on it).
    this.a = alloc(ns);
    this.b = alloc(ns);
    this.c = alloc(ns);
    this.d = alloc(ns);
    this.w = alloc(ns);
    this.modes = new ModeSlabs(grid, nl.transform.columns);
    this.args = alloc(2);
    this.speeds = alloc(2 * MAX_THREADS);
  }

  /**
   * The adaptive step for `speed` = max|u|/dx + max|v|/dy: the largest rung dtMax·2^(−j/8) with
   * dt·speed ≤ cfl. dt moves down at once but up only by two rungs or more, so it does not flicker
   * (each change rebuilds the propagators).
   */
  private chooseStep(speed: number): number {
    return adaptiveStep(this.dtMax, this.cfl, this.dt, speed);
  }

  /** Advance one step. Throws BlowUpError (state unchanged) on a non-finite result or CFL > CFL_LIMIT. */
  step(): StepReport {
    const { w, qHat: q, team } = this;
    const { nkx, Kx, keptRows, dx, dy } = this.grid;
    const lin = this.lin;
    const r = this.report;
    team.run(GRID_Q);
    team.run(PRODUCTS);
    // The largest speeds of the members' rows: a maximum is exact, so any grouping gives the same.
    let maxU = 0;
    let maxV = 0;
    for (let j = 0; j < this.nl.transform.slabs.length; j++) {
      maxU = Math.max(maxU, this.speeds[2 * j]);
      maxV = Math.max(maxV, this.speeds[2 * j + 1]);
    }
    this.nl.maxU = maxU;
    this.nl.maxV = maxV;
    team.run(TENDENCY_A);
    const speed = maxU / dx + maxV / dy;
    // Budgets at the start of the step (fused with adding the steady forcing to a).
    this.startBudget(q, this.a);
    const dt = this.chooseStep(speed);
    r.dt = dt;
    r.cfl = dt * speed;
    r.maxU = maxU;
    r.maxV = maxV;
    r.time = this.time;
    r.steps = this.steps;
    // Refuse before anything changes: the state, the step in use and the propagators stay as they were.
    if (!Number.isFinite(speed)) throw new BlowUpError('non-finite velocity', r);
    // An adaptive step 2^40 below its maximum means speeds beyond any flow the grid can carry.
    if (!(dt >= this.dtMax * MIN_STEP_FRACTION) || this.time + dt === this.time)
      throw new BlowUpError('time step collapsed: too small to advance the clock', r);
    if (!(r.cfl <= CFL_LIMIT)) throw new BlowUpError(`CFL number above ${CFL_LIMIT}`, r);
    this.dt = dt;
    this.args[0] = dt;
    this.args[1] = lin.step === dt ? 0 : 1;
    team.run(STAGE_2);
    lin.builtFor(dt);
    team.run(PRODUCTS);
    team.run(STAGE_3);
    team.run(PRODUCTS);
    team.run(STAGE_4);
    team.run(PRODUCTS);
    team.run(COMBINE);
    // The energy and enstrophy of the new state w, mode by mode in storage order.
    const invK2 = lin.invK2;
    const { at, rowStep } = this.modes;
    let eNew = 0;
    let zNew = 0;
    for (let k = 0; k < keptRows.length; k++) {
      const ky = keptRows[k];
      const row = ky * nkx;
      for (let ix = 0; ix <= Kx; ix++) {
        const m = row + ix;
        const sm = at[ix] + ky * rowStep[ix];
        const nr = w[sm];
        const ni = w[sm + 1];
        const sq = (ix === 0 ? 0.5 : 1) * (nr * nr + ni * ni);
        eNew += sq * invK2[m];
        zNew += sq;
      }
    }
    if (!Number.isFinite(eNew + zNew)) throw new BlowUpError('non-finite state', r);
    this.modes.toPlain(w, q, this.grid);
    this.kick[0] = this.kick[1] = 0;
    if (this.forcing.kind === 'stochastic') this.forcing.kick(q, dt, this.rng, this.kick);
    this.time += dt;
    this.steps += 1;
    closeReport(r, this.time, this.steps, eNew, zNew, this.kick, dt);
    return r;
  }

  /**
   * One member's share of a phase of `step` (stepTeam.ts): the column slabs or the row slabs of the
   * transform (realTransform2D.ts) that are its own (slabRange).
   */
  runPhase(phase: number, member: number, members: number): void {
    const xf = this.nl.transform;
    const mine = this.slabsOfMember;
    slabRange(member, members, xf.columns.length, mine);
    for (let k = mine[0]; k < mine[1]; k++) {
      if (phase === PRODUCTS) this.nl.products(k, this.speeds, 2 * k);
      else this.runColumnPhase(phase, k, xf.columns[k].i0, xf.columns[k].i1);
    }
  }

  /** A phase on kx columns: column slab k, columns i0..i1 − 1. */
  private runColumnPhase(phase: number, k: number, i0: number, i1: number): void {
    const nl = this.nl;
    switch (phase) {
      case GRID_Q:
        nl.toGrid(this.qHat, k);
        return;
      case TENDENCY_A:
        nl.tendency(this.a, k, this.modes);
        return;
      case STAGE_2:
        if (this.args[1] === 1) this.lin.setStepColumns(this.args[0], i0, i1);
        this.stage2(k, i0, i1);
        nl.toGrid(this.w, k, this.modes);
        return;
      case STAGE_3:
        this.tendency(this.b, k, i0, i1);
        this.stage3(k, i0, i1);
        nl.toGrid(this.w, k, this.modes);
        return;
      case STAGE_4:
        this.tendency(this.c, k, i0, i1);
        this.stage4(k, i0, i1);
        nl.toGrid(this.w, k, this.modes);
        return;
      case COMBINE:
        this.tendency(this.d, k, i0, i1);
        this.combine(k, i0, i1);
        return;
      default:
        throw new RangeError(`Stepper: no phase ${phase}`);
    }
  }

  /** N = −J + F_steady on column slab k (columns i0..i1 − 1) of out, the last pass of an evaluation. */
  private tendency(out: Float64Array, k: number, i0: number, i1: number): void {
    this.nl.tendency(out, k, this.modes);
    if (this.forcing.kind !== 'steady') return;
    const f = this.forcing.steady;
    const { keptRows, nkx } = this.grid;
    const { origin, stride } = this.modes;
    for (let r = 0; r < keptRows.length; r++) {
      const ky = keptRows[r];
      const row = 2 * ky * nkx;
      const d = origin[k] + 2 * ky * stride[k] - row; // from the ordinary layout to the slab's
      for (let t = row + 2 * i0; t < row + 2 * i1; t++) out[t + d] += f[t];
    }
  }

  /** Stage 2 on columns i0..i1 − 1: w = E½(q + ½dt a). */
  private stage2(k: number, i0: number, i1: number): void {
    const { a, w, qHat: q } = this;
    const { nkx, keptRows } = this.grid;
    const e1 = this.lin.halfStep;
    const h = 0.5 * this.args[0];
    const { origin, stride } = this.modes;
    for (let r = 0; r < keptRows.length; r++) {
      const ky = keptRows[r];
      const row = 2 * ky * nkx;
      const o = origin[k] + 2 * ky * stride[k] - row; // a..d and w sit at t + o (modeSlabs.ts)
      for (let t = row + 2 * i0; t < row + 2 * i1; t += 2) {
        const xr = q[t] + h * a[t + o];
        const xi = q[t + 1] + h * a[t + o + 1];
        w[t + o] = e1[t] * xr - e1[t + 1] * xi;
        w[t + o + 1] = e1[t] * xi + e1[t + 1] * xr;
      }
    }
  }

  /** Stage 3 on columns i0..i1 − 1: w = E½ q + ½dt b. */
  private stage3(k: number, i0: number, i1: number): void {
    const { b, w, qHat: q } = this;
    const { nkx, keptRows } = this.grid;
    const e1 = this.lin.halfStep;
    const h = 0.5 * this.args[0];
    const { origin, stride } = this.modes;
    for (let r = 0; r < keptRows.length; r++) {
      const ky = keptRows[r];
      const row = 2 * ky * nkx;
      const o = origin[k] + 2 * ky * stride[k] - row; // a..d and w sit at t + o (modeSlabs.ts)
      for (let t = row + 2 * i0; t < row + 2 * i1; t += 2) {
        w[t + o] = e1[t] * q[t] - e1[t + 1] * q[t + 1] + h * b[t + o];
        w[t + o + 1] = e1[t] * q[t + 1] + e1[t + 1] * q[t] + h * b[t + o + 1];
      }
    }
  }

  /** Stage 4 on columns i0..i1 − 1: w = E q + dt E½ c. */
  private stage4(k: number, i0: number, i1: number): void {
    const { c, w, qHat: q } = this;
    const { nkx, keptRows } = this.grid;
    const e1 = this.lin.halfStep;
    const e2 = this.lin.fullStep;
    const dt = this.args[0];
    const { origin, stride } = this.modes;
    for (let r = 0; r < keptRows.length; r++) {
      const ky = keptRows[r];
      const row = 2 * ky * nkx;
      const o = origin[k] + 2 * ky * stride[k] - row; // a..d and w sit at t + o (modeSlabs.ts)
      for (let t = row + 2 * i0; t < row + 2 * i1; t += 2) {
        w[t + o] = e2[t] * q[t] - e2[t + 1] * q[t + 1] + dt * (e1[t] * c[t + o] - e1[t + 1] * c[t + o + 1]);
        w[t + o + 1] = e2[t] * q[t + 1] + e2[t + 1] * q[t] + dt * (e1[t] * c[t + o + 1] + e1[t + 1] * c[t + o]);
      }
    }
  }

  /** The combination into w on columns i0..i1 − 1 (the state is replaced once it is known to be finite). */
  private combine(k: number, i0: number, i1: number): void {
    const { a, b, c, d, w, qHat: q } = this;
    const { nkx, keptRows } = this.grid;
    const e1 = this.lin.halfStep;
    const e2 = this.lin.fullStep;
    const s = this.args[0] / 6;
    const { origin, stride } = this.modes;
    for (let r = 0; r < keptRows.length; r++) {
      const ky = keptRows[r];
      const row = 2 * ky * nkx;
      const o = origin[k] + 2 * ky * stride[k] - row; // a..d and w sit at t + o (modeSlabs.ts)
      for (let t = row + 2 * i0; t < row + 2 * i1; t += 2) {
        const ar = e2[t] * a[t + o] - e2[t + 1] * a[t + o + 1];
        const ai = e2[t] * a[t + o + 1] + e2[t + 1] * a[t + o];
        const br = b[t + o] + c[t + o];
        const bi = b[t + o + 1] + c[t + o + 1];
        const mr = 2 * (e1[t] * br - e1[t + 1] * bi);
        const mi = 2 * (e1[t] * bi + e1[t + 1] * br);
        w[t + o] = e2[t] * q[t] - e2[t + 1] * q[t + 1] + s * (ar + mr + d[t + o]);
        w[t + o + 1] = e2[t] * q[t + 1] + e2[t + 1] * q[t] + s * (ai + mi + d[t + o + 1]);
      }
    }
  }

  /** Energy, enstrophy and their rates at state q with nonlinear term a (in `modes`); adds F_steady to a. */
  private startBudget(q: Float64Array, a: Float64Array): void {
    const { nkx, Kx, keptRows } = this.grid;
    const lin = this.lin;
    const { invK2, dragRate, hyperRate, lsRate } = lin;
    const steady = this.forcing.kind === 'steady' ? this.forcing.steady : null;
    let e = 0;
    let ke = 0;
    let z = 0;
    let eDrag = 0;
    let eHyper = 0;
    let eLs = 0;
    let eTr = 0;
    let eInj = 0;
    let zDrag = 0;
    let zHyper = 0;
    let zLs = 0;
    let zTr = 0;
    let zInj = 0;
    const kd2Free = this.grid.k2;
    const { at, rowStep } = this.modes;
    for (let k = 0; k < keptRows.length; k++) {
      const ky = keptRows[k];
      const row = ky * nkx;
      for (let ix = 0; ix <= Kx; ix++) {
        const m = row + ix;
        const t = 2 * m;
        const sa = at[ix] + ky * rowStep[ix]; // a's place (modeSlabs.ts)
        // Full-plane weight: the conjugate of a kx > 0 mode is not stored; ½ of the ½·2 is folded in.
        const wgt = ix === 0 ? 0.5 : 1;
        const qr = q[t];
        const qi = q[t + 1];
        const sq = wgt * (qr * qr + qi * qi); // this mode's share of Z
        const em = sq * invK2[m]; // its share of E
        e += em;
        ke += em * kd2Free[m] * invK2[m];
        z += sq;
        const dr = 2 * dragRate[m];
        const hr = 2 * hyperRate[m];
        const lr = 2 * lsRate[m];
        eDrag += dr * em;
        eHyper += hr * em;
        eLs += lr * em;
        zDrag += dr * sq;
        zHyper += hr * sq;
        zLs += lr * sq;
        const tr = 2 * wgt * (qr * a[sa] + qi * a[sa + 1]);
        eTr += tr * invK2[m];
        zTr += tr;
        if (steady) {
          const fr = steady[t];
          const fi = steady[t + 1];
          const inj = 2 * wgt * (qr * fr + qi * fi);
          eInj += inj * invK2[m];
          zInj += inj;
          a[sa] += fr;
          a[sa + 1] += fi;
        }
      }
    }
    if (this.forcing.kind === 'stochastic') {
      // Ensemble-mean rates of white-in-time forcing: ε = σ² Σ_list 1/K², η = σ² N_list.
      eInj = this.forcing.variance * sumOver(this.forcing.modes, invK2);
      zInj = this.forcing.variance * this.forcing.count;
    }
    const r = this.report;
    r.kinetic = ke;
    fill(r.energy, e, eInj, eDrag, eHyper, eLs, eTr);
    fill(r.enstrophy, z, zInj, zDrag, zHyper, zLs, zTr);
  }
}

/**
 * The adaptive step (Stepper.chooseStep, shared with the two-layer stepper): dtMax when cfl = 0, else
 * the largest rung dtMax·2^(−j/8) with dt·speed ≤ cfl, kept at dtNow unless it must fall or can rise
 * by two rungs or more; NaN for a non-finite speed (the caller refuses the step).
 */
export function adaptiveStep(dtMax: number, cfl: number, dtNow: number, speed: number): number {
  if (cfl <= 0) return dtMax;
  const target = speed > 0 ? cfl / speed : Infinity;
  if (!(target > 0)) return NaN; // non-finite speed: step() refuses it
  // Rungs below MIN_STEP_FRACTION are refused by step(); no need to count further.
  const j = target >= dtMax ? 0 : Math.min(8 * 41, firstRungBelow(dtMax, target));
  const rung = dtMax * ladderFactor(j);
  return rung < dtNow || rung > dtNow * 1.18 ? rung : dtNow;
}

/** 2^(−r/8), r = 0..7, as literals: the same bits on every engine (unlike Math.pow). */
const EIGHTH_POWERS = [
  1, 0.9170040432046712, 0.8408964152537145, 0.7711054127039704, 0.7071067811865476, 0.6484197773255048,
  0.5946035575013605, 0.5452538663326288,
];

/**
 * The least j ≥ 0 with dtMax·2^(−j/8) ≤ target (for target < dtMax), found by halving (exact) and
 * comparing with the tabulated eighth powers: the same j on every engine, which ⌈8 log₂(dtMax/target)⌉
 * is not (Math.log2 differs between engines in the last bit). Stops at 8·41 + 7.
 */
function firstRungBelow(dtMax: number, target: number): number {
  let octave = 0;
  let top = dtMax;
  while (top * 0.5 > target && octave < 41) {
    top *= 0.5;
    octave++;
  }
  let r = 0;
  while (r < 8 && top * EIGHTH_POWERS[r] > target) r++;
  return 8 * octave + r;
}

/** 2^(−j/8) for an integer j ≥ 0: a power of two (exact) times a tabulated eighth power. */
function ladderFactor(j: number): number {
  let f = EIGHTH_POWERS[j % 8];
  for (let k = 0; k < j >> 3; k++) f *= 0.5;
  return f;
}

function sumOver(idx: Int32Array, values: Float64Array): number {
  let s = 0;
  for (let i = 0; i < idx.length; i++) s += values[idx[i]];
  return s;
}

function fill(
  bud: QuadraticBudget,
  value: number,
  inj: number,
  drag: number,
  hyper: number,
  ls: number,
  tr: number,
): void {
  bud.value = value;
  bud.injection = inj;
  bud.drag = drag;
  bud.hyper = hyper;
  bud.largeScale = ls;
  bud.transfer = tr;
  bud.tendency = inj - drag - hyper - ls + tr;
}
