import type { MeanSeries } from '../../lib/analysis/jetDetector';
import { seededSigned } from './random';

/**
 * A time mean and its batch means for the detector's tests: `bins` profiles at unit time interval,
 * each the steady profile `f` plus noise that is red in time (AR(1), lag-one correlation `r`) and
 * smooth in y (a Gaussian filter of `corr` points), of standard deviation `noise` per bin.
 * Without noise every bin is the profile itself.
 */
export function noisySeries(
  f: ArrayLike<number>,
  bins: number,
  opts: { noise?: number; r?: number; corr?: number; seed?: number } = {},
): MeanSeries {
  const n = f.length;
  const { noise = 0, r = 0, corr = 2, seed = 1 } = opts;
  const uniform = seededSigned(seed);
  // Box–Muller from two seeded uniforms in (0, 1].
  const gauss = () => Math.sqrt(-2 * Math.log((1 - uniform()) / 2)) * Math.cos(Math.PI * uniform());
  const state = new Float64Array(n);
  const white = new Float64Array(n);
  const values = new Float64Array(bins * n);
  const weights = Array.from({ length: 6 * corr + 1 }, (_, k) => Math.exp(-((k - 3 * corr) ** 2) / (2 * corr * corr)));
  const norm = Math.sqrt(weights.reduce((a, w) => a + w * w, 0));
  for (let b = 0; b < bins; b++) {
    for (let j = 0; j < n; j++) white[j] = gauss();
    for (let j = 0; j < n; j++) {
      let s = 0;
      weights.forEach((w, k) => (s += w * white[(j + k - 3 * corr + n) % n]));
      const smooth = s / norm;
      state[j] = b === 0 ? smooth : r * state[j] + Math.sqrt(1 - r * r) * smooth;
      values[b * n + j] = f[j] + noise * state[j];
    }
  }
  const mean = new Float64Array(n);
  for (let b = 0; b < bins; b++) for (let j = 0; j < n; j++) mean[j] += values[b * n + j] / bins;
  return { mean, bins: values, count: bins, interval: 1, span: bins, samples: bins };
}
