import { emptyReport, emptyTwoLayerTerms, type StepReport } from './budget';
import type { Forcing } from './forcing';
import type { Grid } from './grid';
import type { ModelParams } from './params';
import type { RandomStream } from './randomStream';
import { adaptiveStep, BlowUpError, CFL_LIMIT, MIN_STEP_FRACTION } from './stepper';
import { twoLayerStartBudget } from './twoLayerBudget';
import type { TwoLayerLinearOperator } from './twoLayerLinear';
import type { TwoLayerNonlinearTerm } from './twoLayerNonlinear';

/** The two layers of a buffer. */
type Layers = readonly [Float64Array, Float64Array];

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
 * allocates nothing. `report` is overwritten by every step.
 */
export class TwoLayerStepper {
  readonly grid: Grid;
  /** The state: q̂₁ at [0, n), q̂₂ at [n, 2n), n = 2·spectralSize. */
  readonly qHat: Float64Array;
  time = 0;
  steps = 0;
  dt: number;
  readonly report: StepReport = emptyReport();
  private readonly dtMax: number;
  private readonly cfl: number;
  private readonly lin: TwoLayerLinearOperator;
  private readonly nl: TwoLayerNonlinearTerm;
  private readonly forcing: Forcing;
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
    this.qHat = new Float64Array(2 * n);
    this.q1 = this.qHat.subarray(0, n);
    this.q2 = this.qHat.subarray(n);
    // Stage buffers: only kept modes are ever written, so the rest stay zero (evaluateKept relies on it).
    this.a = new Float64Array(2 * n);
    this.b = new Float64Array(2 * n);
    this.c = new Float64Array(2 * n);
    this.d = new Float64Array(2 * n);
    this.w = new Float64Array(2 * n);
    const split = (x: Float64Array): Layers => [x.subarray(0, n), x.subarray(n)];
    this.aL = split(this.a);
    this.bL = split(this.b);
    this.cL = split(this.c);
    this.dL = split(this.d);
    this.wL = split(this.w);
    const { h1, h2 } = lin.coefficients;
    this.kickLayers = { h1, h2, ib: lin.invK2Barotropic, ic: lin.invK2Baroclinic };
    this.report.energy.generation = 0;
    this.report.enstrophy.generation = 0;
    this.report.layers = emptyTwoLayerTerms();
  }

  /** N(x) of both layers (x and out: layer 1 then layer 2), F_steady added to each. */
  private tendency(x: Layers, out: Float64Array, outL: Layers): void {
    const n = this.n;
    this.nl.evaluateKept(x[0], x[1], outL[0], outL[1]);
    if (this.forcing.kind === 'steady') {
      const f = this.forcing.steady;
      for (let i = 0; i < n; i++) {
        out[i] += f[i];
        out[n + i] += f[i];
      }
    }
  }

  /** Advance one step. Throws BlowUpError (state unchanged) on a non-finite result or CFL > CFL_LIMIT. */
  step(): StepReport {
    const { a, b, c, d, w, qHat: q, n } = this;
    const { nkx, Kx, keptRows, dx, dy } = this.grid;
    const lin = this.lin;
    const nl = this.nl;
    const r = this.report;
    nl.evaluateKept(this.q1, this.q2, this.aL[0], this.aL[1]);
    const { U1, U2 } = lin.coefficients;
    const speed = Math.max(
      (nl.maxU1 + Math.abs(U1)) / dx + nl.maxV1 / dy,
      (nl.maxU2 + Math.abs(U2)) / dx + nl.maxV2 / dy,
    );
    // Budgets at the start of the step (with nl.psi of this state; adds the steady forcing to a).
    twoLayerStartBudget(this.grid, lin, this.forcing, q, nl.psi1, nl.psi2, a, r);
    const dt = adaptiveStep(this.dtMax, this.cfl, this.dt, speed);
    r.dt = dt;
    r.cfl = dt * speed;
    r.maxU = Math.max(nl.maxU1, nl.maxU2);
    r.maxV = Math.max(nl.maxV1, nl.maxV2);
    r.time = this.time;
    r.steps = this.steps;
    if (!Number.isFinite(speed)) throw new BlowUpError('non-finite velocity', r);
    if (!(dt >= this.dtMax * MIN_STEP_FRACTION) || this.time + dt === this.time)
      throw new BlowUpError('time step collapsed: too small to advance the clock', r);
    if (!(r.cfl <= CFL_LIMIT)) throw new BlowUpError(`CFL number above ${CFL_LIMIT}`, r);
    this.dt = dt;
    lin.setStep(dt);
    const P = lin.halfStep;
    const E = lin.fullStep;
    const h = 0.5 * dt;
    // Stage 2: w = E½(q + ½dt a)
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row; m <= row + Kx; m++) {
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
    this.tendency(this.wL, b, this.bL);
    // Stage 3: w = E½ q + ½dt b
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row; m <= row + Kx; m++) {
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
    this.tendency(this.wL, c, this.cL);
    // Stage 4: w = E q + dt E½ c
    for (let k = 0; k < keptRows.length; k++) {
      const row = keptRows[k] * nkx;
      for (let m = row; m <= row + Kx; m++) {
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
    this.tendency(this.wL, d, this.dL);
    // Combination into w (the state is only replaced once the result is known to be finite).
    const s = dt / 6;
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
    r.time = this.time;
    r.steps = this.steps;
    r.energy.realizedInjection = this.kick[0] / dt;
    r.enstrophy.realizedInjection = this.kick[1] / dt;
    r.energy.realizedTendency = (eNew + this.kick[0] - r.energy.value) / dt;
    r.enstrophy.realizedTendency = (zNew + this.kick[1] - r.enstrophy.value) / dt;
    return r;
  }
}
