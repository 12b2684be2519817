/**
 * Power laws of spectra: a least-squares slope in log-log space with its standard error, and the
 * reference lines of beta-plane turbulence to draw against a measured spectrum (model units).
 */

/** A fitted E(k) = A k^slope over a band. */
export interface PowerLawFit {
  /** Fitted exponent and its standard error. */
  slope: number;
  slopeStdErr: number;
  /** A = E at k = 1 (units of E), and the standard error of ln A. */
  prefactor: number;
  logPrefactorStdErr: number;
  /**
   * The pivot: the geometric-mean k of the points used and the fitted E there. The error of ln E at
   * the pivot, s/√n, is uncorrelated with the slope's, so a prefactor measured against a reference
   * line is best read here (e.g. C_K = pivotE / (ε^{2/3} pivotK^{−5/3})).
   */
  pivotK: number;
  pivotE: number;
  logPivotStdErr: number;
  /** rms residual of ln E about the line, s = √(SSR/(n − 2)). */
  logResidualRms: number;
  /** Points used, and points in the band left out because E ≤ 0 or not finite. */
  n: number;
  skipped: number;
  kLo: number;
  kHi: number;
}

/**
 * Ordinary least squares of ln E on ln k over the points with kLo ≤ k ≤ kHi and finite E > 0.
 * The standard errors are those of OLS with independent residuals of equal variance in ln E, estimated
 * from the scatter about the line (n − 2 degrees of freedom); shell values of one snapshot are
 * χ²-like with few degrees of freedom at small k, so fit a time mean where that matters.
 * Throws RangeError with fewer than 3 usable points.
 */
export function fitPowerLaw(k: ArrayLike<number>, E: ArrayLike<number>, kLo: number, kHi: number): PowerLawFit {
  if (k.length !== E.length) throw new RangeError(`fitPowerLaw: ${k.length} wavenumbers but ${E.length} values`);
  // Two passes (means, then centred sums) keep the normal equations well conditioned.
  const inBand = (i: number) => k[i] >= kLo && k[i] <= kHi;
  const usable = (i: number) => inBand(i) && k[i] > 0 && E[i] > 0 && Number.isFinite(E[i]);
  let n = 0;
  let skipped = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < k.length; i++) {
    if (!usable(i)) {
      if (inBand(i)) skipped++;
      continue;
    }
    n++;
    sx += Math.log(k[i]);
    sy += Math.log(E[i]);
  }
  if (n < 3) throw new RangeError(`fitPowerLaw: ${n} usable points in [${kLo}, ${kHi}], need at least 3`);
  const xm = sx / n;
  const ym = sy / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < k.length; i++) {
    if (!usable(i)) continue;
    const dx = Math.log(k[i]) - xm;
    sxx += dx * dx;
    sxy += dx * (Math.log(E[i]) - ym);
  }
  if (!(sxx > 0)) throw new RangeError('fitPowerLaw: all points at one wavenumber');
  const slope = sxy / sxx;
  let ssr = 0;
  for (let i = 0; i < k.length; i++) {
    if (!usable(i)) continue;
    const r = Math.log(E[i]) - ym - slope * (Math.log(k[i]) - xm);
    ssr += r * r;
  }
  const s = Math.sqrt(ssr / (n - 2));
  const intercept = ym - slope * xm;
  return {
    slope,
    slopeStdErr: s / Math.sqrt(sxx),
    prefactor: Math.exp(intercept),
    logPrefactorStdErr: s * Math.sqrt(1 / n + (xm * xm) / sxx),
    pivotK: Math.exp(xm),
    pivotE: Math.exp(ym),
    logPivotStdErr: s / Math.sqrt(n),
    logResidualRms: s,
    n,
    skipped,
    kLo,
    kHi,
  };
}

/** C_K of the inverse energy cascade, ≈ 6 (range 5.5–7) [memory]. */
export const INVERSE_CASCADE_CONSTANT = 6;
/** C_Z of the zonal spectrum, ≈ 0.5 (Galperin et al. 2001; value from memory, factor-of-2 uncertain). */
export const ZONAL_SPECTRUM_CONSTANT = 0.5;

/** Inverse energy cascade E(k) = C_K ε^{2/3} k^{−5/3}; ε the energy injection rate (length²/time³). */
export function inverseCascadeSpectrum(k: number, eps: number, CK: number = INVERSE_CASCADE_CONSTANT): number {
  return CK * Math.cbrt(eps * eps) * Math.pow(k, -5 / 3);
}

/**
 * Forward enstrophy cascade E(k) = C η^{2/3} k^{−3} (Kraichnan 1967; Batchelor 1969); η the enstrophy
 * injection rate (1/time³). Only the form is Stria's check value, so the constant C is the caller's.
 */
export function enstrophyCascadeSpectrum(k: number, eta: number, C: number): number {
  return C * Math.cbrt(eta * eta) * Math.pow(k, -3);
}

/** Zonal spectrum E_Z(m) = C_Z β² m^{−5} (Galperin et al. 2001), m the meridional wavenumber. */
export function zonalSpectrum(m: number, beta: number, CZ: number = ZONAL_SPECTRUM_CONSTANT): number {
  return CZ * beta * beta * Math.pow(m, -5);
}

/**
 * Where the zonal line meets the inverse-cascade line: C_Z β² k^{−5} = C_K ε^{2/3} k^{−5/3} gives
 * k = (C_Z/C_K)^{3/10} (β³/ε)^{1/5} = (C_Z/C_K)^{3/10} k_β (docs/spectra.md).
 */
export function zonalCrossover(
  beta: number,
  eps: number,
  CZ: number = ZONAL_SPECTRUM_CONSTANT,
  CK: number = INVERSE_CASCADE_CONSTANT,
): number {
  return Math.pow(CZ / CK, 0.3) * Math.pow((beta * beta * beta) / eps, 0.2);
}

/** E = E0 (k/k0)^slope at each k into out: a line of given slope through (k0, E0). Returns out. */
export function anchoredLine(
  k: ArrayLike<number>,
  slope: number,
  k0: number,
  E0: number,
  out: Float64Array = new Float64Array(k.length),
): Float64Array {
  for (let i = 0; i < k.length; i++) out[i] = E0 * Math.pow(k[i] / k0, slope);
  return out;
}
