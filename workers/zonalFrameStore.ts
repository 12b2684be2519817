import { zonalMeanFrame, type StriaFrame } from '../lib/io/cfStriaWriter';
import type { ZonalMeans } from '../lib/analysis/zonalMean';

/** The profiles a zonal-mean file holds (cfStria.ts), in its names: `qbar` is the total PV q̄ + βy. */
const PROFILES = ['ubar', 'qbar', 'upvp', 'vpqp', 'eke'] as const;
const WIDTH = PROFILES.length;

/** Bytes the store may hold before it thins (and so the largest zonal-mean export). */
export const ZONAL_STORE_BYTES = 16 * 1024 * 1024;

/**
 * Every zonal-mean sample of a run, kept for export as a zonal-mean time series, in bounded memory:
 * at most `cap` frames (even), where cap = min(1024, bytes / frame size). When full, every other frame
 * is dropped, and from then on only every second sample is kept (then every fourth, …), so the frames
 * stay equally spaced in time; the file says how many samples apart its records are.
 */
export class ZonalFrameStore {
  readonly ny: number;
  readonly cap: number;
  private readonly data: Float64Array;
  private readonly time: Float64Array;
  private readonly steps: Float64Array;
  private frames = 0;
  private stride = 1;
  private seen = 0;

  constructor(ny: number, bytes = ZONAL_STORE_BYTES) {
    this.ny = ny;
    const fit = Math.floor(bytes / (8 * WIDTH * ny + 16));
    this.cap = Math.max(2, Math.min(1024, fit - (fit % 2)));
    this.data = new Float64Array(this.cap * WIDTH * ny);
    this.time = new Float64Array(this.cap);
    this.steps = new Float64Array(this.cap);
  }

  get length(): number {
    return this.frames;
  }

  /** Samples between kept frames (a power of two). */
  get samplesPerFrame(): number {
    return this.stride;
  }

  add(time: number, steps: number, z: ZonalMeans): void {
    if (this.seen++ % this.stride !== 0) return;
    if (this.frames === this.cap) {
      this.thin();
      if ((this.seen - 1) % this.stride !== 0) return;
    }
    const f = this.frames++;
    const { ny } = this;
    // The profiles as the file holds them (its total PV and plain eddy means), from the one mapping.
    const src = zonalMeanFrame(time, steps, z).fields;
    PROFILES.forEach((name, k) => this.data.set(src[name], (f * WIDTH + k) * ny));
    this.time[f] = time;
    this.steps[f] = steps;
  }

  /** Keep frames 0, 2, 4, …; later samples are kept at twice the stride. */
  private thin(): void {
    const w = WIDTH * this.ny;
    const half = this.frames / 2;
    for (let f = 1; f < half; f++) {
      this.data.copyWithin(f * w, 2 * f * w, (2 * f + 1) * w);
      this.time[f] = this.time[2 * f];
      this.steps[f] = this.steps[2 * f];
    }
    this.frames = half;
    this.stride *= 2;
  }

  /** The frames as StriaFrames (views into the store: valid until the next `add`). */
  frameList(): StriaFrame[] {
    const { ny } = this;
    return Array.from({ length: this.frames }, (_, f) => {
      const fields: Record<string, Float64Array> = {};
      PROFILES.forEach(
        (name, k) => (fields[name] = this.data.subarray((f * WIDTH + k) * ny, (f * WIDTH + k + 1) * ny)),
      );
      return { time: this.time[f], steps: this.steps[f], fields };
    });
  }

  clear(): void {
    this.frames = 0;
    this.stride = 1;
    this.seen = 0;
  }
}

export { PROFILES as ZONAL_PROFILES };
