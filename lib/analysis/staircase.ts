import { findPeriodicPeaks, type Peak, type PeakOptions } from './periodicPeaks';
import { ProfileFFT } from './profileFFT';

/**
 * A PV staircase fitted to the total zonal-mean PV q̄(y) + βy (model units; definitions and
 * derivations in docs/staircase.md). Step i runs from edges[i] to edges[i + 1] (the last wraps to
 * edges[0] + Ly); without edges there is one step, the whole period from y = 0.
 */
export interface StaircaseFit {
  /** Step edges, where the PV gradient concentrates, ascending in [0, Ly). */
  edges: number[];
  /** Step widths (length), and their mean and population standard deviation. */
  widths: number[];
  meanWidth: number;
  widthStd: number;
  /** Mean total PV of each step's grid points (on the branch y ∈ [edges[i], edges[i] + width)). */
  levels: number[];
  /** Jump of the total PV at each edge, and the jump of a perfect staircase of the same steps, β(w_before + w_after)/2 (βL for equal steps). */
  jumps: number[];
  idealJumps: number[];
  /** Sharpness index S = 1 − ρ: 1 for a perfect staircase, 0 for the plain βy (docs/staircase.md). */
  index: number;
  /** ρ = rms of q_tot about the step levels / rms of βy about the same steps' means. */
  rho: number;
}

/**
 * The sharpness index of a staircase with given edges: S = 1 − ρ,
 *   ρ² = Σ_j (q_j − Q_s(j))² / Σ_j β²(y_j − Ȳ_s(j))²,
 * Q_s and Ȳ_s the means of q_tot and y over the grid points of step s (y and q_tot continued past
 * Ly as y + Ly, q + βLy). ρ is the fraction of the PV rise that happens inside the steps for PV that
 * rises linearly there; S = 0 exactly for q_tot = βy + c with any edges. Returns the step levels too.
 */
export function staircaseIndex(
  qtot: ArrayLike<number>,
  beta: number,
  Ly: number,
  edges: readonly number[],
): { index: number; rho: number; levels: number[] } {
  const n = qtot.length;
  const dy = Ly / n;
  if (!(beta > 0)) throw new RangeError(`staircaseIndex: beta = ${beta} must be > 0`);
  // Steps as runs of grid indices [first, end), end possibly beyond n (wrapped points).
  const starts = edges.length ? edges.map((e) => Math.ceil(e / dy - 1e-9)) : [0];
  let num = 0;
  let den = 0;
  const levels: number[] = [];
  for (let s = 0; s < starts.length; s++) {
    const first = starts[s];
    const end = s + 1 < starts.length ? starts[s + 1] : starts[0] + n;
    const count = end - first;
    const pointQ = (p: number) => (p < n ? qtot[p] : qtot[p - n] + beta * Ly);
    let qm = 0;
    let ym = 0;
    for (let p = first; p < end; p++) {
      qm += pointQ(p);
      ym += p * dy;
    }
    qm /= Math.max(count, 1);
    ym /= Math.max(count, 1);
    for (let p = first; p < end; p++) {
      num += (pointQ(p) - qm) ** 2;
      den += (beta * (p * dy - ym)) ** 2;
    }
    levels.push(qm);
  }
  if (!(den > 0)) throw new RangeError('staircaseIndex: the steps hold too few grid points to compare with βy');
  const rho = Math.sqrt(num / den);
  return { index: 1 - rho, rho, levels };
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

export interface StaircaseOptions {
  /** Gaussian smoothing σ of the PV gradient before edges are sought (length); default 2 grid spacings. */
  smoothing?: number;
  /** Edge prominence: at least this fraction of the smoothed gradient's range (default 0.2)… */
  relativeProminence?: number;
  /** …and at least this multiple of β (default 0.25). */
  betaProminence?: number;
  /** Least distance between edges (length); default 3 grid spacings. */
  minSeparation?: number;
}

/**
 * Fits PV staircases to total-PV profiles of one grid. Edge criterion: maxima of the smoothed gradient
 * g = β + ∂y(q_tot − βy) (spectral, Gaussian σ) that exceed β, stand out by the prominence above and
 * keep the minimum separation (`findPeriodicPeaks`). The plan and the gradient buffer (`gradient`,
 * the g of the last fit, for display) are built once.
 */
export class StaircaseFitter {
  readonly ny: number;
  readonly Ly: number;
  readonly beta: number;
  readonly gradient: Float64Array;
  private readonly options: Readonly<StaircaseOptions>;
  private readonly profile: ProfileFFT;

  constructor(ny: number, Ly: number, beta: number, options: StaircaseOptions = {}) {
    if (!(beta > 0 && Number.isFinite(beta)))
      throw new RangeError(`StaircaseFitter: beta = ${beta} must be a positive finite number`);
    this.ny = ny;
    this.Ly = Ly;
    this.beta = beta;
    this.options = options;
    this.profile = new ProfileFFT(ny, Ly);
    this.gradient = new Float64Array(ny);
  }

  /** The staircase of qtot (q̄ + βy_j, y_j = j·Ly/ny, as `ZonalMeans.qtot`). */
  fit(qtot: Float64Array): StaircaseFit {
    this.smoothedGradient(qtot, this.gradient);
    return this.fitWithEdges(
      qtot,
      this.edgePeaks(this.gradient).map((p) => p.y),
    );
  }

  /**
   * Stage 1: the smoothed PV gradient g = β + ∂y(q_tot − βy) of qtot into `out` (spectral, Gaussian
   * σ = the smoothing option); `out` may be qtot itself.
   */
  smoothedGradient(qtot: Float64Array, out: Float64Array): Float64Array {
    const { ny, Ly, beta, options: o } = this;
    if (qtot.length !== ny || out.length !== ny)
      throw new RangeError(`StaircaseFitter: profile has ${qtot.length} points, expected ${ny}`);
    const dy = Ly / ny;
    for (let j = 0; j < ny; j++) out[j] = qtot[j] - beta * j * dy;
    this.profile.smooth(out, out, o.smoothing ?? 2 * dy);
    this.profile.derivative(out, out);
    for (let j = 0; j < ny; j++) out[j] += beta;
    return out;
  }

  /** Stage 2: the maxima of a smoothed gradient that pass the edge criterion (prominence, > β, separation). */
  edgePeaks(g: Float64Array, overrides: PeakOptions = {}): Peak[] {
    const { ny, Ly, beta, options: o } = this;
    const dy = Ly / ny;
    return findPeriodicPeaks(g, Ly, {
      relativeProminence: o.relativeProminence ?? 0.2,
      absoluteProminence: (o.betaProminence ?? 0.25) * beta,
      floor: beta,
      minSeparation: o.minSeparation ?? 3 * dy,
      ...overrides,
    });
  }

  /** Stage 3: steps, levels, jumps and index of qtot for given edges (ascending in [0, Ly)). */
  fitWithEdges(qtot: ArrayLike<number>, edges: number[]): StaircaseFit {
    const { Ly, beta } = this;
    const n = edges.length;
    const widths = n ? edges.map((e, i) => (i + 1 < n ? edges[i + 1] : edges[0] + Ly) - e) : [Ly];
    const { index, rho, levels } = staircaseIndex(qtot, beta, Ly, edges);
    const jumps = edges.map((_, i) => (i === 0 ? levels[0] + beta * Ly - levels[n - 1] : levels[i] - levels[i - 1]));
    const idealJumps = edges.map((_, i) => (beta * (widths[(i - 1 + n) % n] + widths[i])) / 2);
    const meanWidth = widths.reduce((a, b) => a + b, 0) / widths.length;
    const widthStd = Math.sqrt(widths.reduce((a, w) => a + (w - meanWidth) ** 2, 0) / widths.length);
    return { edges, widths, meanWidth, widthStd, levels, jumps, idealJumps, index, rho };
  }
}
