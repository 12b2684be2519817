import { effectiveSamples } from './effectiveSamples';

/**
 * The sampling noise of a time mean, from the series it is the mean of (its consecutive batch
 * means): how much one sample scatters (spread, per point) and how long the series remembers (its
 * integral time scale, pooled over the points: effectiveSamples.ts).
 *
 * A time mean over a window of length T_w of a series with integral time scale T has the standard
 * error σ/√N_eff, N_eff = T_w/T [published: von Storch & Zwiers 1999, §6.6; Bretherton et al.,
 * J. Climate 12, 1990 (1999)]. T is estimated from the window itself, which is fair only when the
 * window is several times longer than T: the sample autocorrelations of a mean-removed series sum
 * to −½ whatever the truth, so a window shorter than the flow's slowest memory always looks as if it
 * held many independent samples. The jet detector therefore judges no window shorter than that
 * memory (jetDetector.ts; docs/significance.md). Units: the series', times in its time units.
 */
export interface NoiseReference {
  /** Standard deviation of one sample (bin) about the series' mean, per point. */
  spread: Float64Array;
  /** Integral time scale T = Δt·(1 + 2Σρ(k)) of the series (pooled over its points). */
  integralTime: number;
  /** Samples used, their interval Δt and the series' length (columns·Δt). */
  columns: number;
  interval: number;
  span: number;
}

/** Fewer samples than this and nothing can be estimated from a series. */
export const MIN_COLUMNS = 8;

/**
 * The noise of `count` samples of `width` values (sample c at values[c·width + j]) taken at equal
 * intervals `interval`; null with fewer than MIN_COLUMNS samples. `transform`, if given, maps each
 * sample in place first (a smoothed gradient, say), on a copy.
 */
export function noiseReference(
  values: Float64Array,
  count: number,
  width: number,
  interval: number,
  transform?: (column: Float64Array) => void,
): NoiseReference | null {
  if (count < MIN_COLUMNS || !(interval > 0)) return null;
  const data = transform ? values.slice(0, count * width) : values;
  if (transform) for (let c = 0; c < count; c++) transform(data.subarray(c * width, (c + 1) * width));
  const mean = new Float64Array(width);
  for (let c = 0; c < count; c++) for (let j = 0; j < width; j++) mean[j] += data[c * width + j] / count;
  const spread = new Float64Array(width);
  for (let c = 0; c < count; c++)
    for (let j = 0; j < width; j++) {
      const d = data[c * width + j] - mean[j];
      spread[j] += d * d;
    }
  for (let j = 0; j < width; j++) spread[j] = Math.sqrt(spread[j] / (count - 1));
  const eff = effectiveSamples(data, count, width);
  return { spread, integralTime: interval * eff.integralScale, columns: count, interval, span: count * interval };
}

/**
 * The independent samples in a window of length `span` holding `samples` samples, for a series of
 * integral time scale T: N_eff = span/T, at least 1 and at most the samples themselves.
 */
export function windowSamples(ref: NoiseReference, span: number, samples: number): number {
  return Math.max(1, Math.min(samples, span / ref.integralTime));
}

/**
 * The standard error of the time mean of a scalar series (values at equal `interval`, covering
 * `span`), with its N_eff; null when the series is too short (MIN_COLUMNS). `memory` (time units),
 * when the series' slowest memory is known, bounds N_eff by span/memory as in jetDetector.ts.
 */
export function scalarStandardError(
  series: ArrayLike<number>,
  interval: number,
  span: number,
  memory = 0,
): { stderr: number; effective: number } | null {
  const ref = noiseReference(Float64Array.from(series), series.length, 1, interval);
  if (!ref) return null;
  const samples = Math.max(1, Math.round(span / interval));
  const own = windowSamples(ref, span, samples);
  const effective = memory > 0 ? Math.max(1, Math.min(own, span / memory)) : own;
  return { stderr: ref.spread[0] / Math.sqrt(effective), effective };
}

/**
 * The scatter of one sample of a slowly drifting series, per point, from successive differences:
 * s_j² = Σ_c (x_{c+1,j} − x_{c,j})² / (2(count − 1)), the mean square successive difference, which
 * equals 2σ² for uncorrelated noise and is blind to a drift slow compared with the interval
 * [published: von Neumann, Ann. Math. Statist. 12, 367 (1941)]. What a single profile (a Hovmöller
 * column, the latest ū) must stand out of: its own eddy noise, not the wandering of the jets.
 * Null with fewer than three samples.
 */
export function successiveSpread(values: Float64Array, count: number, width: number): Float64Array | null {
  if (count < 3) return null;
  const out = new Float64Array(width);
  for (let c = 0; c + 1 < count; c++)
    for (let j = 0; j < width; j++) {
      const d = values[(c + 1) * width + j] - values[c * width + j];
      out[j] += d * d;
    }
  for (let j = 0; j < width; j++) out[j] = Math.sqrt(out[j] / (2 * (count - 1)));
  return out;
}
