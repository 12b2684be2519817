import { EDGE_MARGIN, extendProfile } from './profileExtension';
import { StaircaseFitter, staircaseIndex } from './staircase';

/**
 * The PV staircase of a time-mean total PV q̄ + βy of any length, on a periodic or a bounded domain:
 * edges by the criterion of staircase.ts (StaircaseFitter, smoothing 2 and separation 3 grid
 * spacings of the profile itself), directly for a periodic profile of 2^k points, else on the
 * extension of profileExtension.ts; the sharpness index S = 1 − ρ always from the profile's own
 * samples (docs/staircase.md). On a bounded domain the two end steps are cut by the domain: they
 * enter the index but not the widths.
 */
export interface ProfileStaircase {
  edges: number[];
  widths: number[];
  meanWidth: number | null;
  widthStd: number | null;
  /** Level differences across the edges (the last step's mean minus the previous one's). */
  jumps: number[];
  index: number;
  rho: number;
  method: 'direct' | 'extended';
}

/** qtot_j at y_j = y0 + j·dy (any additive constant); β > 0 in the profile's units. */
export function profileStaircase(
  qtot: ArrayLike<number>,
  y0: number,
  dy: number,
  periodic: boolean,
  beta: number,
): ProfileStaircase {
  const n = qtot.length;
  const ext = extendProfile(qtot, dy, periodic, 'point', beta * n * dy);
  const fitter = new StaircaseFitter(ext.values.length, ext.period, beta, { smoothing: 2 * dy, minSeparation: 3 * dy });
  const fit = fitter.fit(ext.values);
  const Y = (n - 1) * dy;
  const edges = periodic ? fit.edges : fit.edges.filter((e) => e >= EDGE_MARGIN * dy && e <= Y - EDGE_MARGIN * dy);
  const { index, rho, levels } = periodic
    ? staircaseIndex(qtot, beta, n * dy, edges)
    : boundedIndex(qtot, beta, dy, edges);
  let widths: number[];
  let jumps: number[];
  if (periodic) {
    widths = fit.widths.slice();
    jumps = edges.map((_, i) =>
      i === 0 ? levels[0] + beta * n * dy - levels[levels.length - 1] : levels[i] - levels[i - 1],
    );
  } else {
    widths = edges.slice(1).map((e, i) => e - edges[i]);
    jumps = edges.map((_, i) => levels[i + 1] - levels[i]);
  }
  const meanWidth = widths.length ? widths.reduce((a, b) => a + b, 0) / widths.length : null;
  const widthStd =
    meanWidth === null ? null : Math.sqrt(widths.reduce((a, w) => a + (w - meanWidth) ** 2, 0) / widths.length);
  return {
    edges: edges.map((e) => y0 + e),
    widths,
    meanWidth,
    widthStd,
    jumps,
    index,
    rho,
    method: ext.direct ? 'direct' : 'extended',
  };
}

/**
 * S = 1 − ρ with ρ² = Σ(q_j − Q_s)²/Σβ²(y_j − Ȳ_s)² over the steps [0, e_0), [e_0, e_1), …, [e_last, Y]
 * of a bounded profile (the definition of docs/staircase.md without the wrap).
 */
export function boundedIndex(
  q: ArrayLike<number>,
  beta: number,
  dy: number,
  edges: readonly number[],
): { index: number; rho: number; levels: number[] } {
  const n = q.length;
  const bounds = [0, ...edges.map((e) => Math.min(n, Math.max(0, Math.ceil(e / dy - 1e-9)))), n];
  let num = 0;
  let den = 0;
  const levels: number[] = [];
  for (let s = 0; s + 1 < bounds.length; s++) {
    const [a, b] = [bounds[s], bounds[s + 1]];
    if (b <= a) {
      levels.push(NaN);
      continue;
    }
    let qm = 0;
    let ym = 0;
    for (let j = a; j < b; j++) {
      qm += q[j];
      ym += j * dy;
    }
    qm /= b - a;
    ym /= b - a;
    for (let j = a; j < b; j++) {
      num += (q[j] - qm) ** 2;
      den += (beta * (j * dy - ym)) ** 2;
    }
    levels.push(qm);
  }
  if (!(den > 0)) throw new RangeError('staircase index: the steps hold too few points to compare with βy');
  const rho = Math.sqrt(num / den);
  return { index: 1 - rho, rho, levels };
}
