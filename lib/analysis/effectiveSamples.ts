/**
 * How many independent samples a time series holds: the effective sample size of its time mean.
 *
 * For a stationary series x_1 … x_N at equal intervals with autocorrelation ρ(k), the variance of
 * the mean is (σ²/N)(1 + 2Σ_{k≥1}(1 − k/N)ρ(k)) ≈ σ²/N_eff with
 *
 *     N_eff = N / (1 + 2 Σ_{k=1}^{K} ρ(k)),
 *
 * the integral time scale in units of the sample interval being T = 1 + 2Σρ(k) = 2τ/Δt, so
 * N_eff = NΔt/(2τ) [published: von Storch & Zwiers, Statistical Analysis in Climate Research, CUP
 * 1999, §6.6; Bretherton et al., J. Climate 12, 1990 (1999)]. The sum is cut at the first lag K
 * where the estimated ρ is no longer positive (the initial positive sequence; beyond it the
 * estimates are noise) [practice]. For an AR(1) series ρ(k) = r₁^k this gives N(1 − r₁)/(1 + r₁).
 *
 * A family of series sharing one time axis (a profile ū(y_j, t), j = 1 … n) is pooled: the
 * autocovariances of all points are summed before ρ is formed, so the time scale is that of the
 * family as a whole (its points decorrelate at the same rate to within the sampling error of the
 * estimate, and one pooled estimate is far steadier than n separate ones).
 */
export interface EffectiveSamples {
  /** Samples in the series. */
  samples: number;
  /** Effective sample size N_eff, in [1, samples]. */
  effective: number;
  /** Integral time scale in sample intervals, 1 + 2Σρ(k) ≥ 1. */
  integralScale: number;
  /** Lag-one autocorrelation r₁ (pooled). */
  lagOne: number;
  /** Last lag summed (K above). */
  lags: number;
}

/**
 * N_eff of the series in `values`, B samples of `width` points each, sample b at
 * values[b·width + j]. `means` (optional, `width` long) are the points' means, computed if absent.
 * Fewer than 3 samples, or a series constant to round-off, give N_eff = samples (nothing to
 * estimate from).
 */
export function effectiveSamples(values: ArrayLike<number>, samples: number, width = 1): EffectiveSamples {
  if (!(Number.isInteger(samples) && samples >= 0 && Number.isInteger(width) && width >= 1))
    throw new RangeError(`effectiveSamples: samples = ${samples}, width = ${width} must be whole numbers (width ≥ 1)`);
  if (values.length < samples * width)
    throw new RangeError(`effectiveSamples: ${values.length} values hold fewer than ${samples} samples of ${width}`);
  const B = samples;
  const plain: EffectiveSamples = { samples: B, effective: Math.max(B, 1), integralScale: 1, lagOne: 0, lags: 0 };
  if (B < 3) return plain;
  const mean = new Float64Array(width);
  for (let b = 0; b < B; b++) for (let j = 0; j < width; j++) mean[j] += values[b * width + j];
  for (let j = 0; j < width; j++) mean[j] /= B;
  const cov = (k: number) => {
    let s = 0;
    for (let b = 0; b + k < B; b++) {
      const o = b * width;
      const p = (b + k) * width;
      for (let j = 0; j < width; j++) s += (values[o + j] - mean[j]) * (values[p + j] - mean[j]);
    }
    return s / B; // the biased estimator: its autocorrelations form a positive definite sequence
  };
  const c0 = cov(0);
  // A series that does not vary beyond round-off has nothing to estimate from (its "correlation" would be that of the rounding).
  let size = 0;
  for (let j = 0; j < width; j++) size += mean[j] * mean[j];
  if (!(c0 > 1e-24 * size)) return plain;
  let sum = 0;
  let lags = 0;
  let lagOne = 0;
  for (let k = 1; k < B; k++) {
    const rho = cov(k) / c0;
    if (k === 1) lagOne = rho;
    if (!(rho > 0)) break;
    sum += rho;
    lags = k;
  }
  const integralScale = 1 + 2 * sum;
  return { samples: B, effective: Math.min(B, Math.max(1, B / integralScale)), integralScale, lagOne, lags };
}
