import { RandomStream } from '../model/randomStream';
import { fitPowerLaw } from './powerLawFit';

/**
 * Scaling laws across runs: y = A x^b fitted by least squares in log-log space (ordinary least
 * squares of ln y on ln x, `fitPowerLaw`), with bootstrap percentile confidence intervals for the
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
}

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
  for (let i = 0; i < x.length; i++) {
    if (x[i] > 0 && y[i] > 0 && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      xs.push(x[i]);
      ys.push(y[i]);
    }
  }
  const n = xs.length;
  if (n < 3) throw new RangeError(`fitScaling: ${n} usable points (x and y finite and > 0), need at least 3`);
  if (xs.every((v) => v === xs[0]))
    throw new RangeError('fitScaling: every point has the same x, so no exponent can be fitted');
  const whole = fitPowerLaw(xs, ys, 0, Infinity);
  const b0 = options.fixedExponent;
  const fixedPrefactor = (px: ArrayLike<number>, py: ArrayLike<number>) => {
    let s = 0;
    for (let i = 0; i < px.length; i++) s += Math.log(py[i]) - b0! * Math.log(px[i]);
    return Math.exp(s / px.length);
  };

  // Stage 2: the bootstrap, one resample at a time into reused buffers.
  const rng = new RandomStream(options.seed ?? 1);
  const bx = new Float64Array(n);
  const by = new Float64Array(n);
  const slopes: number[] = [];
  const prefactors: number[] = [];
  const fixedPrefactors: number[] = [];
  let degenerate = 0;
  for (let r = 0; r < resamples; r++) {
    for (let i = 0; i < n; i++) {
      const j = Math.min(n - 1, Math.floor(rng.uniform() * n));
      bx[i] = xs[j];
      by[i] = ys[j];
    }
    if (bx.every((v) => v === bx[0])) {
      degenerate++;
      continue;
    }
    const f = fitPowerLaw(bx, by, 0, Infinity);
    slopes.push(f.slope);
    prefactors.push(f.prefactor);
    if (b0 !== undefined) fixedPrefactors.push(fixedPrefactor(bx, by));
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
        : { exponent: b0, prefactor: fixedPrefactor(xs, ys), prefactorCI: percentileInterval(fixedPrefactors, level) },
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
