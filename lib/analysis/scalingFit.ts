import { RandomStream } from '../model/randomStream';

/**
 * Scaling laws across runs: y = A x^b fitted by least squares in log-log space (least squares of
 * ln y on ln x, weighted by the points' standard errors when they are given), with bootstrap
 * percentile confidence intervals for the
 * exponent b and the prefactor A. Each bootstrap resample draws n (x, y) pairs with replacement from
 * the n usable points (the "pairs" bootstrap, which makes no assumption about the scatter's form), so
 * replicas of one configuration spread the interval as much as their seeds disagree.
 *
 * Units: those of x and y; A is y at x = 1. Points with x or y not finite and positive are left out
 * (counted in `skipped`). Randomness comes from one seeded stream, so the same input and seed give
 * the same interval. Throws RangeError when fewer than 3 usable points or a single distinct x remain.
 */
export interface ScalingFitOptions {
  /** Bootstrap resamples (default 2000; 0 gives intervals of NaN). */
  resamples?: number;
  /** Seed of the resampling stream (default 1). */
  seed?: number;
  /** Confidence level of the intervals, in (0, 1) (default 0.95). */
  level?: number;
  /** When given, also the prefactor with the exponent held at this value (e.g. 1 for L_jet ∝ L_R). */
  fixedExponent?: number;
  /**
   * Standard errors of y and of x (same units, null or absent where unknown). Point i then weighs
   * w_i = 1/(σ_i² + σ₀²), σ_i² = (δy_i/y_i)² + (δx_i/x_i)² the variance of its logarithms and
   * σ₀ = ERROR_FLOOR the scatter a scaling law keeps beyond the sampling error (so that no run with
   * a tiny error outweighs the rest) [practice: weighted least squares with an error floor].
   */
  yError?: ArrayLike<number | null>;
  xError?: ArrayLike<number | null>;
}

/** Relative scatter about a scaling law allowed beyond each point's own sampling error. */
export const ERROR_FLOOR = 0.05;

export interface ScalingFit {
  exponent: number;
  /** Percentile interval of the exponent at `level`. */
  exponentCI: [number, number];
  prefactor: number;
  prefactorCI: [number, number];
  /** rms residual of ln y about the fitted line. */
  logResidualRms: number;
  n: number;
  skipped: number;
  level: number;
  /** Resamples drawn, and those left out because every x in them was the same. */
  resamples: number;
  degenerate: number;
  /** Prefactor with the exponent held fixed: A = exp(mean(ln y − b₀ ln x)), and its interval. */
  fixed: { exponent: number; prefactor: number; prefactorCI: [number, number] } | null;
}

export function fitScaling(x: ArrayLike<number>, y: ArrayLike<number>, options: ScalingFitOptions = {}): ScalingFit {
  if (x.length !== y.length) throw new RangeError(`fitScaling: ${x.length} x values but ${y.length} y values`);
  const resamples = options.resamples ?? 2000;
  const level = options.level ?? 0.95;
  if (!(Number.isInteger(resamples) && resamples >= 0))
    throw new RangeError(`fitScaling: resamples = ${resamples} must be a non-negative integer`);
  if (!(level > 0 && level < 1)) throw new RangeError(`fitScaling: level = ${level} must lie in (0, 1)`);
  const xs: number[] = [];
  const ys: number[] = [];
  const ws: number[] = [];
  const rel = (e: ArrayLike<number | null> | undefined, i: number, v: number) => {
    const d = e?.[i];
    return typeof d === 'number' && Number.isFinite(d) && d >= 0 ? d / v : 0;
  };
  for (let i = 0; i < x.length; i++) {
    if (x[i] > 0 && y[i] > 0 && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      xs.push(x[i]);
      ys.push(y[i]);
      const s2 = rel(options.yError, i, y[i]) ** 2 + rel(options.xError, i, x[i]) ** 2;
      ws.push(options.yError || options.xError ? 1 / (s2 + ERROR_FLOOR ** 2) : 1);
    }
  }
  const n = xs.length;
  if (n < 3) throw new RangeError(`fitScaling: ${n} usable points (x and y finite and > 0), need at least 3`);
  if (xs.every((v) => v === xs[0]))
    throw new RangeError('fitScaling: every point has the same x, so no exponent can be fitted');
  const whole = weightedLogFit(xs, ys, ws);
  const b0 = options.fixedExponent;
  const fixedPrefactor = (px: ArrayLike<number>, py: ArrayLike<number>, pw: ArrayLike<number>) => {
    let s = 0;
    let sw = 0;
    for (let i = 0; i < px.length; i++) {
      s += pw[i] * (Math.log(py[i]) - b0! * Math.log(px[i]));
      sw += pw[i];
    }
    return Math.exp(s / sw);
  };

  // Stage 2: the bootstrap, one resample at a time into reused buffers.
  const rng = new RandomStream(options.seed ?? 1);
  const bx = new Float64Array(n);
  const by = new Float64Array(n);
  const bw = new Float64Array(n);
  const slopes: number[] = [];
  const prefactors: number[] = [];
  const fixedPrefactors: number[] = [];
  let degenerate = 0;
  for (let r = 0; r < resamples; r++) {
    for (let i = 0; i < n; i++) {
      const j = Math.min(n - 1, Math.floor(rng.uniform() * n));
      bx[i] = xs[j];
      by[i] = ys[j];
      bw[i] = ws[j];
    }
    if (bx.every((v) => v === bx[0])) {
      degenerate++;
      continue;
    }
    const f = weightedLogFit(bx, by, bw);
    slopes.push(f.slope);
    prefactors.push(f.prefactor);
    if (b0 !== undefined) fixedPrefactors.push(fixedPrefactor(bx, by, bw));
  }
  return {
    exponent: whole.slope,
    exponentCI: percentileInterval(slopes, level),
    prefactor: whole.prefactor,
    prefactorCI: percentileInterval(prefactors, level),
    logResidualRms: whole.logResidualRms,
    n,
    skipped: x.length - n,
    level,
    resamples,
    degenerate,
    fixed:
      b0 === undefined
        ? null
        : {
            exponent: b0,
            prefactor: fixedPrefactor(xs, ys, ws),
            prefactorCI: percentileInterval(fixedPrefactors, level),
          },
  };
}

/** The central interval holding `level` of the values: quantiles (1 ∓ level)/2, linear interpolation. */
export function percentileInterval(values: readonly number[], level: number): [number, number] {
  if (values.length === 0) return [NaN, NaN];
  const sorted = [...values].sort((a, b) => a - b);
  return [quantile(sorted, (1 - level) / 2), quantile(sorted, (1 + level) / 2)];
}

/** Quantile p of sorted values, interpolating between order statistics at h = (n − 1)p. */
function quantile(sorted: readonly number[], p: number): number {
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * ln y = ln A + b ln x by weighted least squares (weights w): b = Σw(X − X̄)(Y − Ȳ)/Σw(X − X̄)², X̄, Ȳ
 * the weighted means; with equal weights the ordinary fit. logResidualRms is the unweighted rms of
 * the residuals of ln y.
 */
function weightedLogFit(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  w: ArrayLike<number>,
): { slope: number; prefactor: number; logResidualRms: number } {
  const n = x.length;
  let sw = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    sw += w[i];
    sx += w[i] * Math.log(x[i]);
    sy += w[i] * Math.log(y[i]);
  }
  const X = sx / sw;
  const Y = sy / sw;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    const dx = Math.log(x[i]) - X;
    sxy += w[i] * dx * (Math.log(y[i]) - Y);
    sxx += w[i] * dx * dx;
  }
  const slope = sxy / sxx;
  const a = Y - slope * X;
  let r2 = 0;
  for (let i = 0; i < n; i++) r2 += (Math.log(y[i]) - a - slope * Math.log(x[i])) ** 2;
  return { slope, prefactor: Math.exp(a), logResidualRms: Math.sqrt(r2 / n) };
}
