import type { AllocationMeter } from '../io/allocationMeter';
import { ddx, ddy, laplacian, type FdGrid } from './gridDerivatives';
import type { UserRole } from './userData';
import type { UserSpectralPlan } from './spectral';

/**
 * Which of u, v, ζ, ψ and the PV anomaly q = ζ − k_d²ψ a user's record gives, directly or derived:
 * u = −ψ_y, v = ψ_x from ψ; ζ = v_x − u_y from u and v, or ∇²ψ; ψ = ∇⁻²ζ (zero mean) by spectral
 * inversion, only on a doubly periodic 2^k grid, when k_d ≠ 0 needs it for q or when the file lacks
 * u and v (a vorticity-only file: its velocities come from the inverted ψ); q from the file, or
 * from ζ (and ψ). Derivatives are spectral on a doubly periodic 2^k grid when the inputs have no
 * missing values, finite differences otherwise (gridDerivatives.ts); a record whose ψ cannot be
 * inverted (missing values) has no q when k_d ≠ 0. All in the record's units; ψ in length²/time.
 */
export interface DerivationPlan {
  u: 'file' | 'psi' | null;
  v: 'file' | 'psi' | null;
  zeta: 'file' | 'uv' | 'psi' | null;
  psi: 'file' | 'inversion' | null;
  q: 'file' | 'zeta' | null;
  /** Why a quantity is not available, for the report. */
  reasons: string[];
}

export function planDerivation(
  roles: readonly UserRole[],
  kd: number,
  lengths: boolean,
  spectral: boolean,
): DerivationPlan {
  const has = (r: UserRole) => roles.includes(r);
  const reasons: string[] = [];
  let zeta: DerivationPlan['zeta'] = has('zeta') ? 'file' : null;
  if (!zeta && lengths) zeta = has('u') && has('v') ? 'uv' : has('psi') ? 'psi' : null;
  // ψ = ∇⁻²ζ when q = ζ − k_d²ψ needs it, or when the velocities must come from it (a ζ-only file).
  const velocitiesMissing = !(has('u') && has('v'));
  let psi: DerivationPlan['psi'] = has('psi') ? 'file' : null;
  if (!psi && zeta && ((kd !== 0 && !has('q')) || (velocitiesMissing && lengths))) {
    if (spectral) psi = 'inversion';
    else
      reasons.push(
        kd !== 0 && !has('q')
          ? 'ψ: k_d ≠ 0 needs ψ for q = ζ − k_d²ψ, and the file has none; inverting ζ needs a doubly periodic grid of 2^k × 2^m points'
          : 'u and v: the file has neither them nor ψ, and inverting ζ for ψ needs a doubly periodic grid of 2^k × 2^m points',
      );
  }
  const fromPsi = psi !== null && lengths ? 'psi' : null;
  const u = has('u') ? 'file' : fromPsi;
  const v = has('v') ? 'file' : fromPsi;
  const q: DerivationPlan['q'] = has('q') ? 'file' : zeta && (kd === 0 || psi) ? 'zeta' : null;
  if (!lengths && !has('q') && !has('zeta'))
    reasons.push(
      'ζ and q: derivatives need lengths, and the grid is in degrees (map it onto the tangent plane with a planet and a central latitude)',
    );
  if (!q && lengths && !zeta)
    reasons.push('q: the file has no PV, vorticity or streamfunction, nor both velocity components');
  return { u, v, zeta, psi, q, reasons };
}

/** The working fields of one record, and the derivations that fill them. */
export class FieldDeriver {
  readonly fields: Partial<Record<'u' | 'v' | 'zeta' | 'psi' | 'q', Float64Array>> = {};
  private readonly scratch: Float64Array | null;

  constructor(
    readonly plan: DerivationPlan,
    private readonly fd: FdGrid,
    private readonly spectral: UserSpectralPlan | null,
    private readonly kd: number,
    /** β(y_j − y0) is taken off a file q that includes βy; null when it does not. */
    private readonly betaOff: { beta: number; y0: number; y: (j: number) => number } | null,
    /** The buffers the record source reads the file's own fields into (one per 'file' entry of the plan). */
    fileBuffers: Partial<Record<UserRole, Float64Array>>,
    meter: AllocationMeter,
  ) {
    const n = fd.nx * fd.ny;
    for (const k of ['u', 'v', 'zeta', 'psi', 'q'] as const) {
      if (plan[k] === 'file') this.fields[k] = fileBuffers[k];
      else if (plan[k]) this.fields[k] = meter.f64(n, 'fields');
    }
    this.scratch = plan.zeta === 'uv' ? meter.f64(n, 'fields') : null;
  }

  /** Fills the derived fields after a read; returns whether q is available in this record and which route ran. */
  derive(): { q: boolean; spectral: boolean } {
    const { plan, fields: f, fd } = this;
    const sp = (...xs: Float64Array[]) => (this.spectral && xs.every(allFinite) ? this.spectral : null);
    let usedSpectral = false;
    const d = (op: 'dx' | 'dy' | 'lap', x: Float64Array, out: Float64Array) => {
      const s = sp(x);
      if (s) usedSpectral = true;
      if (op === 'dx') return s ? s.ddx(x, out) : ddx(fd, x, out);
      if (op === 'dy') return s ? s.ddy(x, out) : ddy(fd, x, out);
      return s ? s.laplacian(x, out) : laplacian(fd, x, out);
    };
    if (plan.zeta === 'uv') {
      const z = f.zeta as Float64Array;
      d('dx', f.v as Float64Array, z);
      d('dy', f.u as Float64Array, this.scratch as Float64Array);
      for (let i = 0; i < z.length; i++) z[i] -= (this.scratch as Float64Array)[i];
    } else if (plan.zeta === 'psi') d('lap', f.psi as Float64Array, f.zeta as Float64Array);
    let psiOk = plan.psi === 'file';
    if (plan.psi === 'inversion') {
      const s = sp(f.zeta as Float64Array);
      if (s) {
        s.invertLaplacian(f.zeta as Float64Array, f.psi as Float64Array);
        psiOk = usedSpectral = true;
      } else (f.psi as Float64Array).fill(NaN); // missing values: no inversion in this record
    }
    // Velocities from ψ (the file's, or the inversion's), after the inversion.
    if (plan.u === 'psi') negate(d('dy', f.psi as Float64Array, f.u as Float64Array));
    if (plan.v === 'psi') d('dx', f.psi as Float64Array, f.v as Float64Array);
    if (plan.q === 'file' && this.betaOff) {
      const q = f.q as Float64Array;
      const { beta, y0, y } = this.betaOff;
      for (let j = 0; j < fd.ny; j++) for (let i = 0; i < fd.nx; i++) q[j * fd.nx + i] -= beta * (y(j) - y0);
    }
    let qOk = plan.q === 'file';
    if (plan.q === 'zeta' && (this.kd === 0 || psiOk)) {
      const q = f.q as Float64Array;
      const z = f.zeta as Float64Array;
      const k2 = this.kd * this.kd;
      const p = f.psi;
      for (let i = 0; i < q.length; i++) q[i] = k2 && p ? z[i] - k2 * p[i] : z[i];
      qOk = true;
    }
    return { q: qOk, spectral: usedSpectral };
  }
}

export function allFinite(x: Float64Array): boolean {
  for (let i = 0; i < x.length; i++) if (!Number.isFinite(x[i])) return false;
  return true;
}

function negate(x: Float64Array): Float64Array {
  for (let i = 0; i < x.length; i++) x[i] = -x[i];
  return x;
}
