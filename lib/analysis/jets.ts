import { findPeriodicPeaks, type Peak, type PeakOptions } from './periodicPeaks';
import { ProfileFFT } from './profileFFT';

/**
 * One eastward jet of a zonal-mean profile ū(y) (model units: y in length, speeds in length/time).
 * Its flanks run from the jet to the lowest ū between it and the next jet on each side (for a single
 * jet, the profile's minimum on both sides).
 */
export interface Jet {
  /** Position of the maximum, sub-grid (parabola through three points), in [0, Ly). */
  y: number;
  /** Grid index of the maximum. */
  index: number;
  /** Peak ū (the parabola's value). */
  speed: number;
  /** The lowest ū on the south and on the north flank. */
  minSouth: number;
  minNorth: number;
  /**
   * Full width: yNorth − ySouth, where ū falls to halfway between the peak and that flank's minimum,
   * (speed + minSouth)/2 going south and (speed + minNorth)/2 going north (linear interpolation
   * between grid points). ySouth < y < yNorth, unwrapped (may lie outside [0, Ly)).
   */
  width: number;
  ySouth: number;
  yNorth: number;
  /**
   * Shear contrast: the largest ∂yū on the south flank minus the smallest on the north flank, from
   * first differences between neighbouring points. At a cusp-shaped jet this is the jump in shear
   * across it (βL for the ideal staircase); at a smooth jet the contrast of its two flanks.
   */
  shearJump: number;
  prominence: number;
}

export interface JetReport {
  jets: Jet[];
  count: number;
  /** Distances from each jet to the next one north (periodic): the last wraps round. */
  spacings: number[];
  /** Mean of the spacings (= Ly/count) and their population standard deviation; null without jets. */
  meanSpacing: number | null;
  spacingStd: number | null;
  /** The meridional index m ≥ 1 with the largest amplitude of ū, 0 for a flat profile; its wavenumber 2πm/Ly and amplitude. */
  dominantIndex: number;
  dominantWavenumber: number;
  dominantAmplitude: number;
}

/**
 * Jet criterion: the peaks of ū under `findPeriodicPeaks` (prominence ≥ relativeProminence = 0.2 of
 * the range of ū, separation ≥ 3 grid spacings), eastward meaning above `floor`, by default the
 * domain mean of ū (0 for Stria states, whose mean flow is not a model mode).
 */
export type JetOptions = PeakOptions;

/** Finds jets in periodic profiles of one grid; the plan (profile transform, scratch) is built once. */
export class JetFinder {
  readonly ny: number;
  readonly Ly: number;
  readonly options: Readonly<JetOptions>;
  private readonly profile: ProfileFFT;
  private readonly amp: Float64Array;

  constructor(ny: number, Ly: number, options: JetOptions = {}) {
    this.ny = ny;
    this.Ly = Ly;
    this.options = options;
    this.profile = new ProfileFFT(ny, Ly);
    this.amp = new Float64Array(ny / 2 + 1);
  }

  /** Jets of the (time-mean, or instantaneous) profile ubar, periodic in y; `overrides` tighten the criterion for this call. */
  find(ubar: Float64Array, overrides: PeakOptions = {}): JetReport {
    const { ny, Ly } = this;
    if (ubar.length !== ny) throw new RangeError(`JetFinder: profile has ${ubar.length} points, expected ${ny}`);
    let mean = 0;
    for (let j = 0; j < ny; j++) mean += ubar[j] / ny;
    return this.describe(ubar, findPeriodicPeaks(ubar, Ly, { floor: mean, ...this.options, ...overrides }));
  }

  /**
   * Every local maximum of `ubar` above `floor` that keeps the minimum separation, with its
   * prominence and col: the candidates the significance rule of jetDetector.ts tests.
   */
  candidates(ubar: Float64Array, floor: number): Peak[] {
    return findPeriodicPeaks(ubar, this.Ly, {
      relativeProminence: 0,
      absoluteProminence: 0,
      floor,
      minSeparation: this.options.minSeparation,
    });
  }

  /**
   * The jet report of `ubar` for a chosen set of its peaks (sorted by position, as findPeriodicPeaks
   * returns them): the significance rule of jetDetector.ts chooses them, this describes them.
   */
  describe(ubar: Float64Array, peaks: readonly Peak[]): JetReport {
    const { ny, Ly } = this;
    if (ubar.length !== ny) throw new RangeError(`JetFinder: profile has ${ubar.length} points, expected ${ny}`);
    const dy = Ly / ny;
    const at = (j: number) => ubar[((j % ny) + ny) % ny];
    const n = peaks.length;

    const jets: Jet[] = peaks.map((p, i) => {
      // Flanks: grid offsets from the peak to the neighbouring peaks (the whole period for one jet),
      // and the offset of each flank's minimum.
      const south = n === 1 ? ny : (p.index - peaks[(i - 1 + n) % n].index + ny) % ny || ny;
      const north = n === 1 ? ny : (peaks[(i + 1) % n].index - p.index + ny) % ny || ny;
      const [minS, sMinS] = flankMinimum(at, p.index, -1, south);
      const [minN, sMinN] = flankMinimum(at, p.index, 1, north);
      // Shear contrast: first differences over each flank, from the peak to the flank's minimum.
      let shearS = -Infinity;
      for (let s = 0; s < sMinS; s++) shearS = Math.max(shearS, (at(p.index - s) - at(p.index - s - 1)) / dy);
      let shearN = Infinity;
      for (let s = 0; s < sMinN; s++) shearN = Math.min(shearN, (at(p.index + s + 1) - at(p.index + s)) / dy);
      // Half-level crossings, placed on the same branch of the period as the refined position p.y.
      const base = p.y - unwrap(p.y - p.index * dy, Ly);
      const ySouth = base + crossing(at, p.index, -1, 0.5 * (p.value + minS), sMinS) * dy;
      const yNorth = base + crossing(at, p.index, 1, 0.5 * (p.value + minN), sMinN) * dy;
      return {
        y: p.y,
        index: p.index,
        speed: p.value,
        minSouth: minS,
        minNorth: minN,
        width: yNorth - ySouth,
        ySouth,
        yNorth,
        shearJump: shearS - shearN,
        prominence: p.prominence,
      };
    });

    const spacings = jets.map((j, i) => (i + 1 < n ? jets[i + 1].y - j.y : jets[0].y + Ly - j.y));
    const meanSpacing = n ? spacings.reduce((a, b) => a + b, 0) / n : null;
    const spacingStd =
      meanSpacing === null ? null : Math.sqrt(spacings.reduce((a, s) => a + (s - meanSpacing) ** 2, 0) / n);

    // Dominant meridional wavenumber: the largest amplitude among m ≥ 1.
    this.profile.amplitudes(ubar, this.amp);
    let m = 1;
    for (let k = 2; k < this.amp.length; k++) if (this.amp[k] > this.amp[m]) m = k;
    let big = 0;
    for (let j = 0; j < ny; j++) big = Math.max(big, Math.abs(ubar[j]));
    if (!(this.amp[m] > (this.options.flatTolerance ?? 1e-12) * big)) m = 0; // flat: no dominant wavenumber
    return {
      jets,
      count: n,
      spacings,
      meanSpacing,
      spacingStd,
      dominantIndex: m,
      dominantWavenumber: (2 * Math.PI * m) / Ly,
      dominantAmplitude: m ? this.amp[m] : 0,
    };
  }

  /**
   * Eddy forcing of a jet's core: the mean of −∂y(u′v′) over [ySouth, yNorth], i.e.
   * (u′v′(ySouth) − u′v′(yNorth))/width, the momentum the eddies carry into the core through its two
   * half-level edges per unit width (length/time²). u′v′ is evaluated by trigonometric interpolation,
   * so this is exactly the core mean of `ZonalMeans.convUpvp`; being an average over the core it is
   * not swamped by the grid-scale noise of a pointwise value.
   */
  coreConvergence(jet: Pick<Jet, 'ySouth' | 'yNorth' | 'width'>, upvp: Float64Array): number {
    if (upvp.length !== this.ny)
      throw new RangeError(`JetFinder: profile has ${upvp.length} points, expected ${this.ny}`);
    const [south, north] = this.profile.evaluate(upvp, [jet.ySouth, jet.yNorth]);
    return (south - north) / jet.width;
  }
}

/** The lowest value within `span` − 1 steps of j0 in direction dir, and its step count (first occurrence). */
function flankMinimum(at: (j: number) => number, j0: number, dir: 1 | -1, span: number): [number, number] {
  let low = Infinity;
  let where = 1;
  for (let s = 1; s < Math.max(span, 2); s++) {
    const v = at(j0 + dir * s);
    if (v < low) {
      low = v;
      where = s;
    }
  }
  return [low, where];
}

/**
 * Grid offset (signed, fractional) from index j0 walking in direction dir where f first falls to
 * `level`, interpolated linearly between the last point above it and the first at or below it.
 */
function crossing(at: (j: number) => number, j0: number, dir: 1 | -1, level: number, limit: number): number {
  for (let s = 1; s <= limit; s++) {
    const lo = at(j0 + dir * s);
    if (lo <= level) {
      const hi = at(j0 + dir * (s - 1));
      return dir * (s - 1 + (hi - level) / (hi - lo));
    }
  }
  return dir * limit;
}

/** x mapped into (−L/2, L/2]. */
function unwrap(x: number, L: number): number {
  return x - L * Math.round(x / L);
}
