import type { AllocationMeter } from '../io/allocationMeter';

/**
 * Zonal means and eddy fluxes of one record of a user's fields with missing values (NaN), each
 * profile over the ny rows. Masking rule: a row's mean of a field is over that row's valid points
 * only; an eddy product (u′v′, v′q′, EKE) is over the points where both factors are valid, with the
 * primes taken from the row means; a row with fewer than `minCount` such points is invalid (NaN) for
 * that profile. Missing values are never averaged in.
 *
 * Profiles: ū, v̄, q̄ (the PV anomaly, without βy), u′v′, v′q′, EKE = ½(u′² + v′²), with
 * the units of the fields. Also the sums for the domain-mean square speed ⟨u² + v²⟩ over points where
 * u and v are both valid (⟨u²⟩ when v is absent).
 */
export interface RecordProfiles {
  ubar: Float64Array;
  vbar: Float64Array;
  qbar: Float64Array;
  upvp: Float64Array;
  vpqp: Float64Array;
  eke: Float64Array;
  /** Σ(u² + v²) and the number of points in it. */
  speed2Sum: number;
  speed2Count: number;
}

export class MaskedZonalMean {
  readonly out: RecordProfiles;

  constructor(
    readonly nx: number,
    readonly ny: number,
    readonly minCount: number,
    meter: AllocationMeter,
  ) {
    const p = () => meter.f64(ny, 'profiles');
    this.out = { ubar: p(), vbar: p(), qbar: p(), upvp: p(), vpqp: p(), eke: p(), speed2Sum: 0, speed2Count: 0 };
  }

  /** Profiles of one record; absent fields leave their profiles NaN. Returns `out` (reused). */
  compute(u: Float64Array | null, v: Float64Array | null, q: Float64Array | null): RecordProfiles {
    const { nx, ny, minCount, out } = this;
    out.speed2Sum = 0;
    out.speed2Count = 0;
    for (let j = 0; j < ny; j++) {
      const r = j * nx;
      const ub = u ? rowMean(u, r, nx, minCount) : NaN;
      const vb = v ? rowMean(v, r, nx, minCount) : NaN;
      const qb = q ? rowMean(q, r, nx, minCount) : NaN;
      out.ubar[j] = ub;
      out.vbar[j] = vb;
      out.qbar[j] = qb;
      let uv = 0;
      let nuv = 0;
      let vq = 0;
      let nvq = 0;
      let ke = 0;
      for (let i = 0; i < nx; i++) {
        const a = u ? u[r + i] : NaN;
        const b = v ? v[r + i] : NaN;
        if (u && Number.isFinite(a) && (!v || Number.isFinite(b))) {
          out.speed2Sum += a * a + (v ? b * b : 0);
          out.speed2Count++;
        }
        if (Number.isFinite(a - ub) && Number.isFinite(b - vb)) {
          const up = a - ub;
          const vp = b - vb;
          uv += up * vp;
          ke += up * up + vp * vp;
          nuv++;
        }
        const c = q ? q[r + i] : NaN;
        if (Number.isFinite(b - vb) && Number.isFinite(c - qb)) {
          vq += (b - vb) * (c - qb);
          nvq++;
        }
      }
      out.upvp[j] = nuv >= minCount ? uv / nuv : NaN;
      out.eke[j] = nuv >= minCount ? (0.5 * ke) / nuv : NaN;
      out.vpqp[j] = nvq >= minCount ? vq / nvq : NaN;
    }
    return out;
  }
}

/** Mean of the finite values of f[r .. r + n), NaN when fewer than minCount. */
function rowMean(f: Float64Array, r: number, n: number, minCount: number): number {
  let s = 0;
  let c = 0;
  for (let i = 0; i < n; i++) {
    const x = f[r + i];
    if (Number.isFinite(x)) {
      s += x;
      c++;
    }
  }
  return c >= minCount ? s / c : NaN;
}

/**
 * Time means of profiles over the records of a window: per row, the mean over the records in which
 * that row was valid; a row valid in fewer than `minRecords` records is NaN in the mean.
 */
export class ProfileAccumulator {
  private readonly sum: Float64Array;
  private readonly count: Int32Array;

  constructor(
    readonly n: number,
    meter: AllocationMeter,
  ) {
    this.sum = meter.f64(n, 'accumulators');
    this.count = meter.i32(n, 'accumulators');
  }

  add(p: ArrayLike<number>): void {
    for (let j = 0; j < this.n; j++) {
      const x = p[j];
      if (Number.isFinite(x)) {
        this.sum[j] += x;
        this.count[j]++;
      }
    }
  }

  /** Records in which at least one row was valid: the largest row count. */
  get records(): number {
    let m = 0;
    for (let j = 0; j < this.n; j++) m = Math.max(m, this.count[j]);
    return m;
  }

  mean(minRecords: number): Float64Array {
    const out = new Float64Array(this.n);
    for (let j = 0; j < this.n; j++)
      out[j] = this.count[j] >= Math.max(1, minRecords) ? this.sum[j] / this.count[j] : NaN;
    return out;
  }
}
