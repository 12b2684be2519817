import { JetFinder, type Jet, type JetReport } from './jets';
import { MIN_COLUMNS, noiseReference, windowSamples } from './noiseReference';
import type { Peak } from './periodicPeaks';
import { EDGE_MARGIN, extendProfile } from './profileExtension';
import { normalQuantileUpper } from './quantiles';
import { boundedIndex, StaircaseFitter, staircaseIndex } from './staircase';

/**
 * The one detector of jets and PV staircase steps in Stria: every view, command and file that
 * shows a jet count, a spacing, jet positions or staircase numbers takes them from here. Rule and
 * derivation: docs/significance.md.
 *
 * The time-mean profile f̄(y) over a window has the standard error σ(y) = s(y)/√N_eff, from the
 * window's consecutive batch means (the bins of ProfileTimeMean, or a user file's records): s the
 * spread of one bin, N_eff the independent bins, from the integral time scale of the whole profile
 * (noiseReference.ts). A local maximum of ū above the domain mean is a jet when
 *
 *     prominence > c · (σ(peak) + σ(col)),   c = Φ⁻¹(1 − α/(2n)),
 *
 * the col being the point its prominence is measured from, n the points of the profile and α the
 * false-alarm probability of the whole profile (default 0.001). Why: were the true mean flat, its
 * noise would stay within ±cσ(y_j) at all n points together with probability ≥ 1 − α (the union
 * bound over two-sided normal tails), so no noise maximum could stand out by more than
 * c(σ(peak) + σ(col)). PV staircase edges, the maxima of the smoothed PV gradient that pass the
 * edge criterion of staircase.ts, pass the same test.
 *
 * The flow's memory bounds N_eff from above. A Stria run knows it: the drag time 1/μ, over which
 * linear drag erases the zonal flow (an Ornstein–Uhlenbeck zonal flow, ∂t ū = −μū + eddy forcing,
 * remembers over ~1/μ). So N_eff = min(the window's own estimate, μ·T_w), and a window shorter than
 * 1/μ is too short to judge. Why the bound is needed: inside a window only a few memory times long
 * a long-lived eddy's zonal mean stands still and its scatter looks small, and the window's own
 * estimate of N_eff is biased high (noiseReference.ts); isotropic runs showed false jets without it
 * (docs/significance.md). Without a known memory (a user's file with no μ) the window's own
 * estimate is used, and fewer than MIN_EFFECTIVE independent samples is too short to judge.
 */
export type JetVerdict = 'jets' | 'no-jets' | 'too-short';

export const JET_VERDICT_TEXT: Readonly<Record<JetVerdict, string>> = Object.freeze({
  jets: 'significant jets',
  'no-jets': 'no significant jets',
  'too-short': 'too few independent samples to tell',
});

/**
 * Default false-alarm probability of the whole profile: below the customary 0.01 to leave room for
 * the error of the estimated σ (calibrated on isotropic runs: docs/significance.md).
 */
export const FALSE_ALARM = 0.001;

/** Without a known memory, fewer independent samples in the window than this and nothing is claimed. */
export const MIN_EFFECTIVE = 2;

/**
 * A time mean and the series it is the mean of: `mean` over a window of length `span` holding
 * `samples` samples; `bins` its consecutive batch means, `count` of them (oldest first, bin b at
 * bins[b·points + j]), `interval` apart in time.
 */
export interface MeanSeries {
  mean: Float64Array;
  bins: Float64Array;
  count: number;
  interval: number;
  span: number;
  samples: number;
}

export type DetectedJet = Omit<Jet, 'index'> & {
  /** Standard error of the position, from the positions in the batch means; null when not estimable. */
  positionStderr: number | null;
  /** Prominence over the noise bound c(σ(peak) + σ(col)); > 1 for every detected jet. */
  significance: number;
};

export interface JetDetection {
  verdict: JetVerdict;
  /** Why, in a sentence: what was found, or what is missing to tell. */
  reason: string;
  /** Jets found; null when the window is too short to tell. */
  count: number | null;
  /** Jets, south to north, positions in the profile's coordinates (from y0). */
  jets: DetectedJet[];
  /** Distances between neighbouring jets (periodic: the last wraps round). */
  spacings: number[];
  meanSpacing: number | null;
  /** Population standard deviation of the spacings. */
  spacingStd: number | null;
  /** Standard error of the mean spacing (docs/significance.md); null with fewer than two jets. */
  spacingStderr: number | null;
  /** The bound factor c, the false-alarm probability, the local maxima tested and N_eff of the window. */
  threshold: number;
  falseAlarm: number;
  candidates: number;
  effectiveSamples: number | null;
  /** rms of σ(y): the typical standard error of the time mean. */
  noise: number | null;
  /** The report of the finder on the profile it searched (periodic, direct profiles: Stria's own). */
  report: JetReport | null;
}

export interface StaircaseDetection {
  verdict: 'steps' | 'no-steps' | 'too-short';
  reason: string;
  /** Significant step edges, ascending, in the profile's coordinates. */
  edges: number[];
  widths: number[];
  meanWidth: number | null;
  widthStd: number | null;
  levels: number[];
  jumps: number[];
  /** Sharpness index S = 1 − ρ of the time-mean profile with these edges (docs/staircase.md); its standard error by batch means. */
  index: number | null;
  indexStderr: number | null;
  rho: number | null;
}

export interface ProfileGeometry {
  /** Points of the profile, y_j = y0 + j·dy. */
  points: number;
  y0: number;
  dy: number;
  /** Periodic in y with period points·dy. */
  periodic: boolean;
}

/**
 * The detector of one profile geometry: its plans (finder, fitter, extension length) are built once.
 * `beta` > 0 enables the staircase (total PV profiles); `falseAlarm` is α above; `memory` the flow's
 * memory (time units: 1/μ for a Stria run; 0 when unknown).
 */
export class StructureDetector {
  readonly geometry: Readonly<ProfileGeometry>;
  readonly falseAlarm: number;
  readonly beta: number;
  readonly memory: number;
  readonly finder: JetFinder;
  readonly fitter: StaircaseFitter | null;
  /** The bound factor c = Φ⁻¹(1 − α/(2n)). */
  readonly threshold: number;
  private readonly length: number;
  private readonly period: number;
  private readonly direct: boolean;

  constructor(geometry: ProfileGeometry, options: { beta?: number; falseAlarm?: number; memory?: number } = {}) {
    const { points, dy } = geometry;
    if (!(Number.isInteger(points) && points >= 3 && dy > 0))
      throw new RangeError(`StructureDetector: a profile of ${points} points at spacing ${dy} cannot be searched`);
    this.geometry = geometry;
    this.falseAlarm = options.falseAlarm ?? FALSE_ALARM;
    if (!(this.falseAlarm > 0 && this.falseAlarm < 1))
      throw new RangeError(`StructureDetector: false-alarm probability ${this.falseAlarm} must lie in (0, 1)`);
    this.threshold = normalQuantileUpper(this.falseAlarm / (2 * points));
    this.beta = options.beta ?? 0;
    this.memory = options.memory ?? 0;
    const probe = extendProfile(new Float64Array(points), dy, geometry.periodic, 'even');
    this.length = probe.values.length;
    this.period = probe.period;
    this.direct = probe.direct;
    this.finder = new JetFinder(this.length, this.period, { minSeparation: 3 * dy });
    this.fitter =
      this.beta > 0
        ? new StaircaseFitter(this.length, this.period, this.beta, { smoothing: 2 * dy, minSeparation: 3 * dy })
        : null;
  }

  /** A profile (or `count` of them) on the searched grid: extended unless direct. */
  private searched(values: Float64Array, count: number, continuation: 'even' | 'point', rise = 0): Float64Array {
    const { points, dy, periodic } = this.geometry;
    if (values.length < count * points)
      throw new RangeError(`StructureDetector: ${values.length} values hold fewer than ${count} profiles of ${points}`);
    if (this.direct) return values.slice(0, count * points);
    const out = new Float64Array(count * this.length);
    for (let c = 0; c < count; c++)
      out.set(
        extendProfile(values.subarray(c * points, (c + 1) * points), dy, periodic, continuation, rise).values,
        c * this.length,
      );
    return out;
  }

  /** Positions (searched coordinates) that the data can confirm: all for a periodic profile, away from the ends of a bounded one. */
  private inside(y: number): boolean {
    const { periodic, points, dy } = this.geometry;
    return periodic || (y >= EDGE_MARGIN * dy && y <= (points - 1 - EDGE_MARGIN) * dy);
  }

  /**
   * σ(y) of the series' mean on the searched grid and N_eff, or why the window cannot be judged.
   * `transform` maps each bin (on the searched grid) in place first.
   */
  private noise(
    series: MeanSeries,
    transform?: (bin: Float64Array) => void,
    continuation: 'even' | 'point' = 'even',
    rise = 0,
  ): { sigma: Float64Array; effective: number } | { tooShort: string } {
    const memory = this.memory;
    // The window's measured span lies within one bin of its nominal length (bins leave it whole).
    if (memory > 0 && series.span + series.interval < memory * (1 - 1e-9))
      return {
        tooShort: `the window (${fmt(series.span)}) is shorter than the flow's memory, the drag time ${fmt(memory)}`,
      };
    const bins = this.searched(series.bins, series.count, continuation, rise);
    const ref = noiseReference(bins, series.count, this.length, series.interval, transform);
    if (!ref) return { tooShort: `the window holds ${series.count} batch means, fewer than ${MIN_COLUMNS}` };
    const own = windowSamples(ref, series.span, series.samples);
    const effective = memory > 0 ? Math.max(1, Math.min(own, series.span / memory)) : own;
    if (memory === 0 && effective < MIN_EFFECTIVE)
      return {
        tooShort: `the window holds ${fmt(effective)} independent samples (integral time scale ${fmt(ref.integralTime)}), fewer than ${MIN_EFFECTIVE}`,
      };
    return { sigma: ref.spread.map((x) => x / Math.sqrt(effective)), effective };
  }

  /** The jets of a time-mean ū and its series. */
  jets(series: MeanSeries): JetDetection {
    const { y0, periodic, dy } = this.geometry;
    const c = this.threshold;
    const none = (verdict: JetVerdict, reason: string, extra: Partial<JetDetection> = {}): JetDetection => ({
      verdict,
      reason,
      count: verdict === 'too-short' ? null : 0,
      jets: [],
      spacings: [],
      meanSpacing: null,
      spacingStd: null,
      spacingStderr: null,
      threshold: c,
      falseAlarm: this.falseAlarm,
      candidates: 0,
      effectiveSamples: null,
      noise: null,
      report: null,
      ...extra,
    });
    const noise = this.noise(series);
    if ('tooShort' in noise) return none('too-short', `too short to tell: ${noise.tooShort}`);
    const { sigma, effective } = noise;
    const base = { effectiveSamples: effective, noise: rms(sigma) };
    const m = this.searched(series.mean, 1, 'even');
    let domainMean = 0;
    for (let j = 0; j < this.length; j++) domainMean += m[j] / this.length;
    const candidates = this.finder.candidates(m, domainMean);
    const scored = candidates.map((p) => ({ p, s: p.prominence / (c * (sigma[p.index] + sigma[p.col])) }));
    const kept = scored.filter((x) => x.s > 1 && this.inside(x.p.y));
    const report = this.finder.describe(
      m,
      kept.map((x) => x.p),
    );
    if (kept.length === 0)
      return none(
        'no-jets',
        `no maximum of ū stands out of its noise (${candidates.length} tested, ${fmt(effective)} independent samples)`,
        { ...base, candidates: candidates.length, report },
      );
    const at = (j: number) => m[((j % this.length) + this.length) % this.length];
    const jets: DetectedJet[] = report.jets.map((j, i) => {
      const { index, ...rest } = j;
      // The parabola's vertex moves by (δa − δc)/(2D), D = a − 2b + c, for errors δ of its side values [derived].
      const curvature = Math.abs(at(index - 1) - 2 * at(index) + at(index + 1));
      const positionStderr = curvature > 0 ? (dy * Math.SQRT1_2 * sigma[index]) / curvature : null;
      return {
        ...rest,
        y: y0 + j.y,
        ySouth: y0 + j.ySouth,
        yNorth: y0 + j.yNorth,
        positionStderr,
        significance: kept[i].s,
      };
    });
    const spacings = periodic ? report.spacings.slice() : jets.slice(1).map((j, i) => j.y - jets[i].y);
    const meanSpacing = spacings.length ? average(spacings) : null;
    return {
      verdict: 'jets',
      reason: `${jets.length} maxima of ū stand out of their noise (${candidates.length} tested, ${fmt(effective)} independent samples)`,
      count: jets.length,
      jets,
      spacings,
      meanSpacing,
      spacingStd: meanSpacing === null ? null : Math.sqrt(average(spacings.map((x) => (x - meanSpacing) ** 2))),
      spacingStderr: spacingError(
        spacings,
        jets.map((j) => j.positionStderr),
        periodic,
      ),
      threshold: c,
      falseAlarm: this.falseAlarm,
      candidates: candidates.length,
      ...base,
      report,
    };
  }

  /** The PV staircase of a time-mean total PV q̄ + β(y − y0) and its series. */
  staircase(series: MeanSeries): StaircaseDetection {
    const fitter = this.fitter;
    if (!fitter) throw new RangeError('StructureDetector: the staircase needs β > 0');
    const { points, y0, dy, periodic } = this.geometry;
    const beta = this.beta;
    const Ly = points * dy;
    const empty = (reason: string): StaircaseDetection => ({
      verdict: 'too-short',
      reason,
      edges: [],
      widths: [],
      meanWidth: null,
      widthStd: null,
      levels: [],
      jumps: [],
      index: null,
      indexStderr: null,
      rho: null,
    });
    const noise = this.noise(series, (bin) => fitter.smoothedGradient(bin, bin), 'point', beta * Ly);
    if ('tooShort' in noise) return empty(`too short to tell: ${noise.tooShort}`);
    const { sigma, effective } = noise;
    const g = fitter.smoothedGradient(this.searched(series.mean, 1, 'point', beta * Ly), new Float64Array(this.length));
    const c = this.threshold;
    const edges = fitter
      .edgePeaks(g)
      .filter((p: Peak) => p.prominence > c * (sigma[p.index] + sigma[p.col]) && this.inside(p.y))
      .map((p) => p.y);
    const indexOf = (profile: ArrayLike<number>) =>
      periodic ? staircaseIndex(profile, beta, Ly, edges) : boundedIndex(profile, beta, dy, edges);
    const whole = indexOf(series.mean);
    // The index of every bin with these edges: its spread and memory give the error of the window's index.
    const perBin = new Float64Array(series.count);
    for (let k = 0; k < series.count; k++)
      perBin[k] = indexOf(series.bins.subarray(k * points, (k + 1) * points)).index;
    const indexRef = noiseReference(perBin, series.count, 1, series.interval);
    const indexStderr = indexRef
      ? indexRef.spread[0] / Math.sqrt(Math.min(effective, windowSamples(indexRef, series.span, series.samples)))
      : null;
    const n = edges.length;
    const widths = periodic
      ? n
        ? edges.map((e, i) => (i + 1 < n ? edges[i + 1] : edges[0] + Ly) - e)
        : []
      : edges.slice(1).map((e, i) => e - edges[i]);
    const jumps = periodic
      ? edges.map((_, i) =>
          i === 0 ? whole.levels[0] + beta * Ly - whole.levels[n - 1] : whole.levels[i] - whole.levels[i - 1],
        )
      : edges.map((_, i) => whole.levels[i + 1] - whole.levels[i]);
    const meanWidth = widths.length ? average(widths) : null;
    return {
      verdict: n ? 'steps' : 'no-steps',
      reason: n
        ? `${n} edges of the PV gradient stand out of their noise`
        : 'no maximum of the PV gradient stands out of its noise',
      edges: edges.map((e) => y0 + e),
      widths,
      meanWidth,
      widthStd: meanWidth === null ? null : Math.sqrt(average(widths.map((w) => (w - meanWidth) ** 2))),
      levels: whole.levels,
      jumps,
      index: whole.index,
      indexStderr,
      rho: whole.rho,
    };
  }

  /**
   * The jets of single profiles (Hovmöller columns, the latest ū) on a direct grid: a peak must
   * stand out by c(s(peak) + s(col)), s(y) the spread of one sample about the mean (`spread`).
   */
  jetsOfSample(profile: Float64Array, spread: Float64Array): Peak[] {
    if (!this.direct)
      throw new RangeError('StructureDetector: single profiles are searched on direct (periodic, 2^k) grids only');
    const c = this.threshold;
    let domainMean = 0;
    for (let j = 0; j < this.length; j++) domainMean += profile[j] / this.length;
    return this.finder
      .candidates(profile, domainMean)
      .filter((p) => p.prominence > c * (spread[p.index] + spread[p.col]));
  }
}

/** A number for a sentence: three significant figures. */
function fmt(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(3))) : String(x);
}

const average = (a: readonly number[]) => a.reduce((s, x) => s + x, 0) / a.length;
const rms = (a: Float64Array) => Math.sqrt(a.reduce((s, x) => s + x * x, 0) / a.length);

/**
 * Standard error of the mean spacing: the larger of the scatter of the spacings between jets (each
 * spacing one sample of the jet scale: sd/√m) and the error of the positions carried into the
 * spacings, ((1/m²)Σ σ²(y_i) + σ²(y_{i+1}))^½. Null without a spacing or a position error.
 */
function spacingError(spacings: number[], positionStderr: (number | null)[], periodic: boolean): number | null {
  const m = spacings.length;
  if (m < 1) return null;
  let between = 0;
  if (m >= 2) {
    const avg = average(spacings);
    between = Math.sqrt(spacings.reduce((a, x) => a + (x - avg) ** 2, 0) / (m - 1) / m);
  }
  let pos = 0;
  for (let i = 0; i < m; i++) {
    const a = positionStderr[i];
    const b = positionStderr[periodic ? (i + 1) % positionStderr.length : i + 1];
    if (a === null || b === null) return m >= 2 ? between : null;
    pos += a * a + b * b;
  }
  return Math.max(between, Math.sqrt(pos) / m);
}
