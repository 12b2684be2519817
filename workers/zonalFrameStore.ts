import { zonalMeanFrame, type StriaFrame } from '../lib/io/cfStriaWriter';
import type { ZonalMeans } from '../lib/analysis/zonalMean';

/** The profiles a zonal-mean file holds (cfStria.ts), in its names: `qbar` is the total PV q̄ + βy. */
const PROFILES = ['ubar', 'qbar', 'upvp', 'vpqp', 'eke'] as const;

/** A field of a stored frame: its name in the file and how many profiles of ny it holds (2: one per layer). */
export interface FrameField {
  name: string;
  rows: number;
}

/**
 * The fields of a frame: a one-layer zonal-mean file's, or a two-layer one's (each profile of both
 * layers, upper then lower, and the heat flux: cfStriaWriter.ts `layerZonalMeanFrame`).
 */
export function frameFields(layers: 1 | 2): readonly FrameField[] {
  return layers === 2
    ? [...PROFILES.map((name) => ({ name, rows: 2 })), { name: 'heat_flux', rows: 1 }]
    : PROFILES.map((name) => ({ name, rows: 1 }));
}

/** Profiles of ny per frame. */
export const frameRows = (layers: 1 | 2): number => frameFields(layers).reduce((a, f) => a + f.rows, 0);

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
  private readonly fields: readonly FrameField[];
  /** Profiles of ny per frame. */
  private readonly width: number;
  private readonly data: Float64Array;
  private readonly time: Float64Array;
  private readonly steps: Float64Array;
  private frames = 0;
  private stride = 1;
  private seen = 0;

  constructor(ny: number, bytes = ZONAL_STORE_BYTES, layers: 1 | 2 = 1) {
    this.ny = ny;
    this.fields = frameFields(layers);
    this.width = frameRows(layers);
    const fit = Math.floor(bytes / (8 * this.width * ny + 16));
    this.cap = Math.max(2, Math.min(1024, fit - (fit % 2)));
    this.data = new Float64Array(this.cap * this.width * ny);
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

  /** A one-layer sample: the profiles as the file holds them (its total PV and plain eddy means), from the one mapping. */
  add(time: number, steps: number, z: ZonalMeans): void {
    this.addFrame(time, steps, () => zonalMeanFrame(time, steps, z).fields);
  }

  /** A sample as a file's frame (`frame` is called only when the sample is kept). */
  addFrame(time: number, steps: number, frame: () => Readonly<Record<string, ArrayLike<number>>>): void {
    if (this.seen++ % this.stride !== 0) return;
    if (this.frames === this.cap) {
      this.thin();
      if ((this.seen - 1) % this.stride !== 0) return;
    }
    const f = this.frames++;
    const { ny } = this;
    const src = frame();
    let at = f * this.width * ny;
    for (const { name, rows } of this.fields) {
      const given = src[name];
      if (given.length !== rows * ny)
        throw new RangeError(`ZonalFrameStore: ${name} holds ${given.length} values, not ${rows} × ${ny}`);
      this.data.set(given, at);
      at += rows * ny;
    }
    this.time[f] = time;
    this.steps[f] = steps;
  }

  /** Keep frames 0, 2, 4, …; later samples are kept at twice the stride. */
  private thin(): void {
    const w = this.width * this.ny;
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
      let at = f * this.width * ny;
      for (const { name, rows } of this.fields) {
        fields[name] = this.data.subarray(at, at + rows * ny);
        at += rows * ny;
      }
      return { time: this.time[f], steps: this.steps[f], fields };
    });
  }

  clear(): void {
    this.frames = 0;
    this.stride = 1;
    this.seen = 0;
  }
}
