/**
 * Making any meridional profile fit the periodic, power-of-two plans of jets.ts and staircase.ts
 * (their spectral smoothing and amplitudes need both). A profile of n points y_j = j·dy is
 * - on a bounded domain, continued past its north end by reflection into a profile of period
 *   2(n−1)·dy: evenly (f(Y + s) = f(Y − s)) for a velocity, so maxima stay maxima; through the end
 *   point (q(Y + s) = 2q(Y) − q(Y − s)) for a total PV, so steps stay steps going up;
 * - then, unless n is already a power of two on a periodic domain, sampled by linear interpolation at
 *   M points, the smallest power of two ≥ 8 times as many: between samples the interpolant keeps
 *   each interval's slope, so first differences (shear) and level crossings (jet widths) are those
 *   of the samples, and the positions found carry at most the resampling's 1/8 of a grid spacing.
 * What lies beyond the original profile is discarded afterwards (jets and edges in the continued
 * part, and those within `EDGE_MARGIN` spacings of a bounded end, which the data cannot confirm).
 */
export const EDGE_MARGIN = 1.5;
const OVERSAMPLE = 8;
const MAX_POINTS = 1 << 16;

export interface ExtendedProfile {
  values: Float64Array;
  /** Period of the extended profile (length units). */
  period: number;
  /** True when `values` are the profile itself (periodic, power-of-two length): results are exact. */
  direct: boolean;
}

export type Continuation = 'even' | 'point';

/**
 * The extended profile of f. `periodicRise` is what f gains over one period of a periodic profile
 * (β·Ly for a total PV, 0 for a velocity), so that the interpolation across the wrap joins up.
 */
export function extendProfile(
  f: ArrayLike<number>,
  dy: number,
  periodic: boolean,
  continuation: Continuation,
  periodicRise = 0,
): ExtendedProfile {
  const n = f.length;
  if (periodic && isPow2(n)) return { values: Float64Array.from(f), period: n * dy, direct: true };
  let g: Float64Array;
  if (periodic) g = Float64Array.from(f);
  else {
    g = new Float64Array(2 * (n - 1));
    for (let k = 0; k < n; k++) g[k] = f[k];
    for (let m = 1; m <= n - 2; m++)
      g[n - 1 + m] = continuation === 'even' ? f[n - 1 - m] : 2 * f[n - 1] - f[n - 1 - m];
  }
  const period = g.length * dy;
  let M = 64;
  while (M < OVERSAMPLE * g.length && M < MAX_POINTS) M *= 2;
  const out = new Float64Array(M);
  const L = g.length;
  // Across the wrap the profile continues from its first value plus the rise over one period: β·Ly
  // for a periodic total PV, 2(q(Y) − q(0)) for the point reflection of a bounded one.
  const rise = periodic ? periodicRise : continuation === 'even' ? 0 : 2 * (f[n - 1] - f[0]);
  for (let m = 0; m < M; m++) {
    const s = (m * L) / M;
    const k = Math.floor(s);
    const t = s - k;
    const next = k + 1 < L ? g[k + 1] : g[0] + rise;
    out[m] = (1 - t) * g[k] + t * next;
  }
  return { values: out, period, direct: false };
}

export function isPow2(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}
