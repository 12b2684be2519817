import { closeReport, emptyReport, emptyTwoLayerTerms, type StepReport } from './budget';
import type { Forcing } from './forcing';
import type { Grid } from './grid';
import type { ModelParams } from './params';
import type { RandomStream } from './randomStream';
import { adaptiveStep, BlowUpError, CFL_LIMIT, MIN_STEP_FRACTION } from './stepper';
import { twoLayerStartBudget } from './twoLayerBudget';
import type { TwoLayerLinearOperator } from './twoLayerLinear';
import type { TwoLayerNonlinearTerm } from './twoLayerNonlinear';
import { plainFloat64, type Float64Alloc } from './sharedArena';
import { MAX_THREADS, slabRange, SoloTeam, type PhasedStep, type StepTeam } from './stepTeam';

/** The two layers of a buffer. */
type Layers = readonly [Float64Array, Float64Array];

/** The phases of a two-layer step (stepTeam.ts); 0 is the team's own. */
const GRID_Q = 1;
const PRODUCTS = 2;
const TENDENCY_A = 3;
const STAGE_2 = 4;
const STAGE_3 = 5;
const STAGE_4 = 6;
const COMBINE = 7;

/**
 * Integrating-factor RK4 for the two-layer model, the scheme of stepper.ts with the scalar factors
 * replaced by the 2 × 2 propagators of twoLayerLinear.ts (E = e^{L dt}, E½ = e^{L dt/2}, per mode):
 *   a = N(q),  b = N(E½(q + ½dt·a)),  c = N(E½q + ½dt·b),  d = N(E q + dt·E½c),
 *   q ← E q + dt/6·(E a + 2E½(b + c) + d),
 * q = (q̂₁, q̂₂), N = (−J(ψ₁, q₁), −J(ψ₂, q₂)) + F_steady (on both layers); then the stochastic kick,
 * the same increment in both layers. The linear coupling (imposed flows, mean PV gradients, interface,
 * lower-layer drag, damping) is exact; the scheme is fourth order in dt for the rest. The state is one
 * array, layer 1 then layer 2, each in the half-plane layout. The adaptive step and the blow-up rules
 * are those of one layer, the speed being max over the layers of (max|u_i| + |U_i|)/dx + max|v_i|/dy
 * (the imposed flow U_i adds to the eddies' u_i; the bound takes both at their largest). One step
 * allocates nothing. `report` is overwritten by every step. Phases, threads and the shared arrays as
 * in one layer (stepper.ts, docs/threads.md).
 */
export class TwoLayerStepper implements PhasedStep {
  readonly grid: Grid;
  /** The state: q̂₁ at [0, n), q̂₂ at [n, 2n), n = 2·spectralSize. */
  readonly qHat: Float64Array;
  time = 0;
  steps = 0;
  dt: number;
  readonly report: StepReport = emptyReport();
  /** Who runs the phases; the calling thread alone unless threads are given (Model.useThreads). */
  team: StepTeam = new SoloTeam(this);
  readonly lin: TwoLayerLinearOperator;
  readonly nl: TwoLayerNonlinearTerm;
  readonly forcing: Forcing;
  private readonly dtMax: number;
  private readonly cfl: number;
  private readonly rng: RandomStream;
  private readonly q1: Float64Array;
  private readonly q2: Float64Array;
  private readonly a: Float64Array;
  private readonly b: Float64Array;
  private readonly c: Float64Array;
  private readonly d: Float64Array;
  private readonly w: Float64Array;
  /** Each buffer's two layers as views, made once (a view per call would allocate). */
  private readonly aL: Layers;
  private readonly bL: Layers;
  private readonly cL: Layers;
  private readonly dL: Layers;
  private readonly wL: Layers;
  /** dt, and 1 when the propagators change (written by the calling thread before a phase). */
  private readonly args: Float64Array;
  /** max|u₁|, max|v₁|, max|u₂|, max|v₂| of each member's rows in the last `products` pass. */
  private readonly speeds: Float64Array;
  /** Slabs the step is cut into (one per thread it was built for) and those a member runs. */
  private readonly slabCount: number;
  private readonly slabsOfMember = new Int32Array(2);
  private readonly kick = new Float64Array(2);
  private readonly kickLayers: { h1: number; h2: number; ib: Float64Array; ic: Float64Array };
  /** Half the spectrum's length: the offset of layer 2. */
  private readonly n: number;

  constructor(
    grid: Grid,
    p: ModelParams,
    lin: TwoLayerLinearOperator,
    nl: TwoLayerNonlinearTerm,
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
    const n = 2 * grid.spectralSize;
    this.n = n;
    this.qHat = alloc(2 * n);
    this.q1 = this.qHat.subarray(0, n);
    this.q2 = this.qHat.subarray(n);
    // Stage buffers: only kept modes are ever written, so the rest stay zero (evaluateKept relies on it).
    this.a = alloc(2 * n);
    this.b = alloc(2 * n);
    this.c = alloc(2 * n);
    this.d = alloc(2 * n);
    this.w = alloc(2 * n);
    const split = (x: Float64Array): Layers => [x.subarray(0, n), x.subarray(n)];
    this.aL = split(this.a);
    this.bL = split(this.b);
    this.cL = split(this.c);
    this.dL = split(this.d);
    this.wL = split(this.w);
    this.args = alloc(2);
    this.speeds = alloc(4 * MAX_THREADS);
    this.slabCount = nl.slabCount;
    const { h1, h2 } = lin.coefficients;
    this.kickLayers = { h1, h2, ib: lin.invK2Barotropic, ic: lin.invK2Baroclinic };
    this.report.energy.generation = 0;
    this.report.enstrophy.generation = 0;
    this.report.layers = emptyTwoLayerTerms();
  }

  /** Advance one step. Throws BlowUpError (state unchanged) on a non-finite result or CFL > CFL_LIMIT. */
  step(): StepReport {
    const { w, qHat: q, n, team, speeds } = this;
    const { nkx, Kx, keptRows, dx, dy } = this.grid;
    const lin = this.lin;
    const nl = this.nl;
    const r = this.report;
    team.run(GRID_Q);
    team.run(PRODUCTS);
    // The largest speeds of the row slabs: a maximum is exact, so any grouping gives the same.
    let mu1 = 0,
      mv1 = 0,
      mu2 = 0,
      mv2 = 0;
    for (let j = 0; j < this.slabCount; j++) {
      mu1 = Math.max(mu1, speeds[4 * j]);
      mv1 = Math.max(mv1, speeds[4 * j + 1]);
      mu2 = Math.max(mu2, speeds[4 * j + 2]);
      mv2 = Math.max(mv2, speeds[4 * j + 3]);
    }
    nl.maxU1 = mu1;
    nl.maxV1 = mv1;
    nl.maxU2 = mu2;
    nl.maxV2 = mv2;
    team.run(TENDENCY_A);
    const { U1, U2 } = lin.coefficients;
    const speed = Math.max((mu1 + Math.abs(U1)) / dx + mv1 / dy, (mu2 + Math.abs(U2)) / dx + mv2 / dy);
    // Budgets at the start of the step (with nl.psi of this state; adds the steady forcing to a).
    twoLayerStartBudget(this.grid, lin, this.forcing, q, nl.psi1, nl.psi2, this.a, r);
    const dt = adaptiveStep(this.dtMax, this.cfl, this.dt, speed);
    r.dt = dt;
    r.cfl = dt * speed;
    r.maxU = Math.max(mu1, mu2);
    r.maxV = Math.max(mv1, mv2);
    r.time = this.time;
    r.steps = this.steps;
    if (!Number.isFinite(speed)) throw new BlowUpError('non-finite velocity', r);
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
    // The two-layer energy and enstrophy of the new state w, mode by mode in storage order.
    const { h1, h2 } = lin.coefficients;
    const h12 = h1 * h2;
    const ib = lin.invK2Barotropic;
    const ic = lin.invK2Baroclinic;
    let eNew = 0;
    let zNew = 0;
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let ix = 0; ix <= Kx; ix++) {
        const m = row + ix;
        const t = 2 * m;
        const u = n + t;
        const n1r = w[t],
          n1i = w[t + 1],
          n2r = w[u],
          n2i = w[u + 1];
        const wgt = ix === 0 ? 0.5 : 1;
        const btr = h1 * n1r + h2 * n2r,
          bti = h1 * n1i + h2 * n2i;
        const bcr = n1r - n2r,
          bci = n1i - n2i;
        eNew += wgt * ((btr * btr + bti * bti) * ib[m] + h12 * (bcr * bcr + bci * bci) * ic[m]);
        zNew += wgt * (h1 * (n1r * n1r + n1i * n1i) + h2 * (n2r * n2r + n2i * n2i));
      }
    }
    if (!Number.isFinite(eNew + zNew)) throw new BlowUpError('non-finite state', r);
    this.kick[0] = this.kick[1] = 0;
    if (this.forcing.kind === 'stochastic')
      this.forcing.kickBothLayers(this.wL[0], this.wL[1], dt, this.rng, this.kickLayers, this.kick);
    q.set(w);
    this.time += dt;
    this.steps += 1;
    closeReport(r, this.time, this.steps, eNew, zNew, this.kick, dt);
    return r;
  }

  /**
   * One member's share of a phase of `step` (stepTeam.ts): the column slabs or the row slabs of the
   * layers' transforms (realTransform2D.ts) that are its own (slabRange).
   */
  runPhase(phase: number, member: number, members: number): void {
    const mine = this.slabsOfMember;
    slabRange(member, members, this.slabCount, mine);
    for (let k = mine[0]; k < mine[1]; k++) {
      if (phase === PRODUCTS) this.nl.products(k, this.speeds, 4 * k);
      else this.runColumnPhase(phase, k);
    }
  }

  /** A phase on kx columns: column slab k. */
  private runColumnPhase(phase: number, k: number): void {
    const nl = this.nl;
    const { i0, i1 } = nl.columnSlab(k);
    const [w1, w2] = this.wL;
    switch (phase) {
      case GRID_Q:
        nl.invert(this.q1, this.q2, i0, i1);
        nl.toGrid(k);
        return;
      case TENDENCY_A:
        nl.tendency(this.aL[0], this.aL[1], k);
        return;
      case STAGE_2:
        if (this.args[1] === 1) this.lin.setStepColumns(this.args[0], i0, i1);
        this.stage2(i0, i1);
        break;
      case STAGE_3:
        this.tendency(this.bL, k, i0, i1);
        this.stage3(i0, i1);
        break;
      case STAGE_4:
        this.tendency(this.cL, k, i0, i1);
        this.stage4(i0, i1);
        break;
      case COMBINE:
        this.tendency(this.dL, k, i0, i1);
        this.combine(i0, i1);
        return;
      default:
        throw new RangeError(`TwoLayerStepper: no phase ${phase}`);
    }
    // Stages 2 to 4 end with the next evaluation's first pass on w.
    nl.invert(w1, w2, i0, i1);
    nl.toGrid(k);
  }

  /** N of both layers on column slab k (columns i0..i1 − 1) (the last pass of an evaluation), F_steady added to each. */
  private tendency(out: Layers, k: number, i0: number, i1: number): void {
    this.nl.tendency(out[0], out[1], k);
    if (this.forcing.kind !== 'steady') return;
    const f = this.forcing.steady;
    const [o1, o2] = out;
    const { keptRows, nkx } = this.grid;
    for (let k = 0; k < keptRows.length; k++) {
      const row = 2 * keptRows[k] * nkx;
      for (let t = row + 2 * i0; t < row + 2 * i1; t++) {
        o1[t] += f[t];
        o2[t] += f[t];
      }
    }
  }

  /** Stage 2 on columns i0..i1 − 1: w = E½(q + ½dt a). */
  private stage2(i0: number, i1: number): void {
    const { a, w, qHat: q, n } = this;
    const { nkx, keptRows } = this.grid;
    const P = this.lin.halfStep;
    const h = 0.5 * this.args[0];
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row + i0; m < row + i1; m++) {
        const t = 2 * m;
        const u = n + t;
        const o = 8 * m;
        const x1r = q[t] + h * a[t],
          x1i = q[t + 1] + h * a[t + 1];
        const x2r = q[u] + h * a[u],
          x2i = q[u + 1] + h * a[u + 1];
        w[t] = P[o] * x1r - P[o + 1] * x1i + (P[o + 2] * x2r - P[o + 3] * x2i);
        w[t + 1] = P[o] * x1i + P[o + 1] * x1r + (P[o + 2] * x2i + P[o + 3] * x2r);
        w[u] = P[o + 4] * x1r - P[o + 5] * x1i + (P[o + 6] * x2r - P[o + 7] * x2i);
        w[u + 1] = P[o + 4] * x1i + P[o + 5] * x1r + (P[o + 6] * x2i + P[o + 7] * x2r);
      }
    }
  }

  /** Stage 3 on columns i0..i1 − 1: w = E½ q + ½dt b. */
  private stage3(i0: number, i1: number): void {
    const { b, w, qHat: q, n } = this;
    const { nkx, keptRows } = this.grid;
    const P = this.lin.halfStep;
    const h = 0.5 * this.args[0];
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row + i0; m < row + i1; m++) {
        const t = 2 * m;
        const u = n + t;
        const o = 8 * m;
        const x1r = q[t],
          x1i = q[t + 1],
          x2r = q[u],
          x2i = q[u + 1];
        w[t] = P[o] * x1r - P[o + 1] * x1i + (P[o + 2] * x2r - P[o + 3] * x2i) + h * b[t];
        w[t + 1] = P[o] * x1i + P[o + 1] * x1r + (P[o + 2] * x2i + P[o + 3] * x2r) + h * b[t + 1];
        w[u] = P[o + 4] * x1r - P[o + 5] * x1i + (P[o + 6] * x2r - P[o + 7] * x2i) + h * b[u];
        w[u + 1] = P[o + 4] * x1i + P[o + 5] * x1r + (P[o + 6] * x2i + P[o + 7] * x2r) + h * b[u + 1];
      }
    }
  }

  /** Stage 4 on columns i0..i1 − 1: w = E q + dt E½ c. */
  private stage4(i0: number, i1: number): void {
    const { c, w, qHat: q, n } = this;
    const { nkx, keptRows } = this.grid;
    const P = this.lin.halfStep;
    const E = this.lin.fullStep;
    const dt = this.args[0];
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row + i0; m < row + i1; m++) {
        const t = 2 * m;
        const u = n + t;
        const o = 8 * m;
        const x1r = q[t],
          x1i = q[t + 1],
          x2r = q[u],
          x2i = q[u + 1];
        const c1r = c[t],
          c1i = c[t + 1],
          c2r = c[u],
          c2i = c[u + 1];
        w[t] =
          E[o] * x1r -
          E[o + 1] * x1i +
          (E[o + 2] * x2r - E[o + 3] * x2i) +
          dt * (P[o] * c1r - P[o + 1] * c1i + (P[o + 2] * c2r - P[o + 3] * c2i));
        w[t + 1] =
          E[o] * x1i +
          E[o + 1] * x1r +
          (E[o + 2] * x2i + E[o + 3] * x2r) +
          dt * (P[o] * c1i + P[o + 1] * c1r + (P[o + 2] * c2i + P[o + 3] * c2r));
        w[u] =
          E[o + 4] * x1r -
          E[o + 5] * x1i +
          (E[o + 6] * x2r - E[o + 7] * x2i) +
          dt * (P[o + 4] * c1r - P[o + 5] * c1i + (P[o + 6] * c2r - P[o + 7] * c2i));
        w[u + 1] =
          E[o + 4] * x1i +
          E[o + 5] * x1r +
          (E[o + 6] * x2i + E[o + 7] * x2r) +
          dt * (P[o + 4] * c1i + P[o + 5] * c1r + (P[o + 6] * c2i + P[o + 7] * c2r));
      }
    }
  }

  /** The combination into w on columns i0..i1 − 1 (the state is replaced once it is known to be finite). */
  private combine(i0: number, i1: number): void {
    const { a, b, c, d, w, qHat: q, n } = this;
    const { nkx, keptRows } = this.grid;
    const P = this.lin.halfStep;
    const E = this.lin.fullStep;
    const s = this.args[0] / 6;
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row + i0; m < row + i1; m++) {
        const t = 2 * m;
        const u = n + t;
        const o = 8 * m;
        const x1r = q[t],
          x1i = q[t + 1],
          x2r = q[u],
          x2i = q[u + 1];
        const a1r = a[t],
          a1i = a[t + 1],
          a2r = a[u],
          a2i = a[u + 1];
        const g1r = b[t] + c[t],
          g1i = b[t + 1] + c[t + 1],
          g2r = b[u] + c[u],
          g2i = b[u + 1] + c[u + 1];
        // E a + 2 E½ (b + c) + d, per layer
        const f1r =
          E[o] * a1r -
          E[o + 1] * a1i +
          (E[o + 2] * a2r - E[o + 3] * a2i) +
          2 * (P[o] * g1r - P[o + 1] * g1i + (P[o + 2] * g2r - P[o + 3] * g2i)) +
          d[t];
        const f1i =
          E[o] * a1i +
          E[o + 1] * a1r +
          (E[o + 2] * a2i + E[o + 3] * a2r) +
          2 * (P[o] * g1i + P[o + 1] * g1r + (P[o + 2] * g2i + P[o + 3] * g2r)) +
          d[t + 1];
        const f2r =
          E[o + 4] * a1r -
          E[o + 5] * a1i +
          (E[o + 6] * a2r - E[o + 7] * a2i) +
          2 * (P[o + 4] * g1r - P[o + 5] * g1i + (P[o + 6] * g2r - P[o + 7] * g2i)) +
          d[u];
        const f2i =
          E[o + 4] * a1i +
          E[o + 5] * a1r +
          (E[o + 6] * a2i + E[o + 7] * a2r) +
          2 * (P[o + 4] * g1i + P[o + 5] * g1r + (P[o + 6] * g2i + P[o + 7] * g2r)) +
          d[u + 1];
        const n1r = E[o] * x1r - E[o + 1] * x1i + (E[o + 2] * x2r - E[o + 3] * x2i) + s * f1r;
        const n1i = E[o] * x1i + E[o + 1] * x1r + (E[o + 2] * x2i + E[o + 3] * x2r) + s * f1i;
        const n2r = E[o + 4] * x1r - E[o + 5] * x1i + (E[o + 6] * x2r - E[o + 7] * x2i) + s * f2r;
        const n2i = E[o + 4] * x1i + E[o + 5] * x1r + (E[o + 6] * x2i + E[o + 7] * x2r) + s * f2i;
        w[t] = n1r;
        w[t + 1] = n1i;
        w[u] = n2r;
        w[u + 1] = n2i;
      }
    }
  }
}
