/**
 * Robust maxima of a periodic profile f_j = f(y_j), y_j = j·Ly/n: the criterion shared by the jet
 * finder (maxima of ū) and the staircase fit (maxima of the PV gradient).
 *
 * A peak is a local maximum (a plateau of equal values counts once, at its centre) that passes all of:
 *  1. prominence ≥ max(relativeProminence · (max f − min f), absoluteProminence), where the
 *     prominence is the height of the peak above the higher of the two lowest points met walking
 *     south and north from it until a strictly higher value (or all the way round the period);
 *  2. value > floor;
 *  3. minimum separation: of two peaks closer than minSeparation (periodic distance) only the higher
 *     is kept.
 * Noise wiggles have prominences of the order of the noise, far below a fraction of the range of a
 * profile with real maxima, so criterion 1 discards them; 3 guards against twin spikes on one crest.
 * A profile whose range is at most flatTolerance · max|f| (round-off) has no peaks.
 */
export interface PeakOptions {
  /** Fraction of the profile's range a peak must stand out by; default 0.2. */
  relativeProminence?: number;
  /** Least prominence in the profile's units; default 0. */
  absoluteProminence?: number;
  /** A peak's value must exceed this; default −∞. */
  floor?: number;
  /** Least distance between peaks (length units); default 3·Ly/n (three grid spacings). */
  minSeparation?: number;
  /** Relative range below which the profile is flat; default 1e-12. */
  flatTolerance?: number;
}

export interface Peak {
  /** Grid index of the maximum (first point of a plateau). */
  index: number;
  /** Position refined by a parabola through the maximum and its neighbours, in [0, Ly). */
  y: number;
  /** The parabola's peak value (the grid value for a plateau). */
  value: number;
  prominence: number;
  /** Grid index of the key col: the lowest point on the side whose low point is the higher (prominence = f[index] − f[col]). */
  col: number;
}

/** Periodic distance between positions a and b on a period L. */
export function periodicDistance(a: number, b: number, L: number): number {
  const d = Math.abs(a - b) % L;
  return Math.min(d, L - d);
}

/** The peaks of a periodic profile under the criterion above, sorted by position y. */
export function findPeriodicPeaks(f: ArrayLike<number>, Ly: number, options: PeakOptions = {}): Peak[] {
  const n = f.length;
  const dy = Ly / n;
  const at = (j: number) => f[((j % n) + n) % n];
  let max = -Infinity;
  let min = Infinity;
  let big = 0;
  for (let j = 0; j < n; j++) {
    max = Math.max(max, f[j]);
    min = Math.min(min, f[j]);
    big = Math.max(big, Math.abs(f[j]));
  }
  const range = max - min;
  if (!(range > (options.flatTolerance ?? 1e-12) * big)) return [];
  const threshold = Math.max((options.relativeProminence ?? 0.2) * range, options.absoluteProminence ?? 0);
  const floor = options.floor ?? -Infinity;
  const minSep = options.minSeparation ?? 3 * dy;

  // Stage 1: local maxima with their prominence.
  const found: Peak[] = [];
  for (let j = 0; j < n; j++) {
    const v = f[j];
    if (!(v > at(j - 1))) continue;
    let k = j; // plateau end
    while (k - j < n && at(k + 1) === v) k++;
    if (!(at(k + 1) < v)) continue;
    let lowS = v;
    let colS = j;
    for (let s = 1; s <= n; s++) {
      const w = at(j - s);
      if (w > v) break;
      if (w < lowS) [lowS, colS] = [w, j - s];
    }
    let lowN = v;
    let colN = k;
    for (let s = 1; s <= n; s++) {
      const w = at(k + s);
      if (w > v) break;
      if (w < lowN) [lowN, colN] = [w, k + s];
    }
    const prominence = v - Math.max(lowS, lowN);
    const col = (((lowS >= lowN ? colS : colN) % n) + n) % n;
    if (prominence < threshold || !(v > floor)) continue;
    let pos = 0.5 * (j + k);
    let value = v;
    if (k === j) {
      // Parabola through (−1, a), (0, b), (1, c): vertex at δ = ½(a − c)/(a − 2b + c), |δ| ≤ ½.
      const a = at(j - 1);
      const c = at(j + 1);
      const den = a - 2 * v + c;
      const delta = den < 0 ? (0.5 * (a - c)) / den : 0;
      pos = j + delta;
      value = v - 0.25 * (a - c) * delta;
    }
    found.push({ index: j, y: (((pos * dy) % Ly) + Ly) % Ly, value, prominence, col });
  }

  // Stage 2: minimum separation, the higher peak first.
  found.sort((p, q) => q.value - p.value);
  const kept: Peak[] = [];
  for (const p of found) if (kept.every((q) => periodicDistance(p.y, q.y, Ly) >= minSep)) kept.push(p);
  return kept.sort((p, q) => p.y - q.y);
}
