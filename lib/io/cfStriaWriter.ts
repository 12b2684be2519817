import type { GridFields } from '../analysis/snapshot';
import type { LayerZonalMeans } from '../analysis/layerZonalMean';
import type { ZonalMeans } from '../analysis/zonalMean';
import type { StriaRunInfo } from './cfGlobalAttributes';
import {
  fieldSize,
  SNAPSHOT_FILE,
  striaFileSchema,
  ZONAL_MEAN_FILE,
  type StriaFileKindSpec,
  type StriaFileOptions,
} from './cfStria';
import { MODEL_UNITS, unitScale } from './cfUnits';
import { NUMRECS_OFFSET } from './netcdf3Types';
import { Netcdf3RecordWriter } from './netcdf3Writer';

/**
 * One time record of a Stria file: the model time and step count, and one array per field of the
 * file kind, by its name in the file, in model units. Snapshot fields (q, zeta, psi, u, v) have nx·ny
 * values in Stria's grid order j·nx + i; zonal-mean profiles (ubar, qbar, upvp, vpqp, eke) have ny.
 * `snapshotFrame` and `zonalMeanFrame` build frames from the analysis results.
 */
export interface StriaFrame {
  time: number;
  steps: number;
  fields: Readonly<Record<string, ArrayLike<number>>>;
}

/** A snapshot frame from the gridded fields of lib/analysis/snapshot.ts (q is the PV anomaly). */
export function snapshotFrame(time: number, steps: number, f: GridFields): StriaFrame {
  return { time, steps, fields: { q: f.q, zeta: f.zeta, psi: f.psi, u: f.u, v: f.v } };
}

/** A two-layer snapshot frame: each field the upper layer's values, then the lower's (layer, y, x). */
export function layerSnapshotFrame(time: number, steps: number, upper: GridFields, lower: GridFields): StriaFrame {
  const both = (a: Float64Array, b: Float64Array) => {
    const out = new Float64Array(a.length + b.length);
    out.set(a);
    out.set(b, a.length);
    return out;
  };
  return {
    time,
    steps,
    fields: {
      q: both(upper.q, lower.q),
      zeta: both(upper.zeta, lower.zeta),
      psi: both(upper.psi, lower.psi),
      u: both(upper.u, lower.u),
      v: both(upper.v, lower.v),
    },
  };
}

/**
 * A two-layer zonal-mean frame from lib/analysis/layerZonalMean.ts: each layer's profiles (upper,
 * then lower; total PV [q_i] + Q_i y, plain eddy means as in one layer) and the heat flux [v'τ'],
 * plain as well.
 */
export function layerZonalMeanFrame(time: number, steps: number, z: LayerZonalMeans): StriaFrame {
  const both = (a: Float64Array, b: Float64Array) => {
    const out = new Float64Array(a.length + b.length);
    out.set(a);
    out.set(b, a.length);
    return out;
  };
  return {
    time,
    steps,
    fields: {
      ubar: both(z.upper.ubar, z.lower.ubar),
      qbar: both(z.upper.qtot, z.lower.qtot),
      upvp: both(z.upper.upvpPlain, z.lower.upvpPlain),
      vpqp: both(z.upper.vpqpPlain, z.lower.vpqpPlain),
      eke: both(z.upper.ekePlain, z.lower.ekePlain),
      heat_flux: z.heatFluxPlain,
    },
  };
}

/**
 * A zonal-mean frame from lib/analysis/zonalMean.ts. The file's `qbar` is the total PV [q] + βy,
 * which ZonalMeans calls `qtot` (its own `qbar` is the anomaly, without βy), and its eddy products
 * are the plain zonal means (`upvpPlain`, …), not the band-limited profiles a run's views show: a
 * file's [u'v'] is the mean along x of u'v' of its snapshot fields, as its long_name says.
 */
export function zonalMeanFrame(time: number, steps: number, z: ZonalMeans): StriaFrame {
  return {
    time,
    steps,
    fields: { ubar: z.ubar, qbar: z.qtot, upvp: z.upvpPlain, vpqp: z.vpqpPlain, eke: z.ekePlain },
  };
}

/**
 * Writes a Stria snapshot or zonal-mean file record by record: `head()` first, then each
 * `appendFrame` result at the end of the file, then `numrecsField()` at NUMRECS_OFFSET, so the file
 * is valid after every frame. Converts to physical units when the run gives them (one scratch array
 * per field, allocated once), and refuses times that do not increase (CF 5: coordinate variables are
 * strictly monotonic) and arrays under names the file kind does not hold, so that a record of another
 * layout (say, ZonalMeans passed as it is, with its anomaly `qbar`) is not written by mistake.
 */
export class StriaFileWriter {
  static readonly NUMRECS_OFFSET = NUMRECS_OFFSET;
  readonly spec: StriaFileKindSpec;
  private readonly writer: Netcdf3RecordWriter;
  private readonly timeScale: number;
  private readonly fieldScale: number[];
  private readonly scratch: (Float64Array | null)[];
  private readonly values: Record<string, ArrayLike<number>> = {};
  private readonly timeBox = new Float64Array(1);
  private readonly stepBox = new Int32Array(1);
  private lastTime = -Infinity;

  constructor(spec: StriaFileKindSpec, run: StriaRunInfo, options: StriaFileOptions = {}) {
    this.spec = spec;
    this.writer = new Netcdf3RecordWriter(striaFileSchema(spec, run, options));
    const units = run.units ?? MODEL_UNITS;
    this.timeScale = unitScale({ L: 0, T: 1 }, units);
    this.fieldScale = spec.fields.map((f) => unitScale(f.dim, units));
    this.scratch = spec.fields.map((f, k) =>
      this.fieldScale[k] === 1 ? null : new Float64Array(fieldSize(spec, f, run.params)),
    );
  }

  /** Header and coordinates: the first bytes of the file. */
  head(): Uint8Array {
    return this.writer.head();
  }

  /** The bytes of the next record, in a buffer reused by the next call. */
  appendFrame(frame: StriaFrame): Uint8Array {
    const r = this.writer.numrecs;
    if (!(typeof frame.time === 'number' && Number.isFinite(frame.time)))
      throw new RangeError(`frame ${r}: time must be a finite number, got ${frame.time}`);
    if (!(frame.time > this.lastTime))
      throw new RangeError(
        `frame ${r}: time ${frame.time} does not increase (previous ${this.lastTime}); CF coordinates must be strictly monotonic`,
      );
    if (!(Number.isInteger(frame.steps) && frame.steps >= 0))
      throw new RangeError(`frame ${r}: steps must be a non-negative integer, got ${frame.steps}`);
    for (const [name, value] of Object.entries(frame.fields)) {
      if (typeof value === 'object' && value !== null && !this.spec.fields.some((f) => f.name === name)) {
        throw new RangeError(
          `frame ${r}: "${name}" is not a field of a ${this.spec.kind} file (it holds ${this.spec.fields.map((x) => x.name).join(', ')})${this.spec.kind === 'zonal_means' ? '; build frames from ZonalMeans with zonalMeanFrame' : ''}`,
        );
      }
    }
    this.timeBox[0] = frame.time * this.timeScale;
    this.stepBox[0] = frame.steps;
    this.values.time = this.timeBox;
    this.values.step = this.stepBox;
    this.spec.fields.forEach((f, k) => {
      const given = frame.fields[f.name];
      if (given === undefined)
        throw new RangeError(
          `frame ${r}: field "${f.name}" is missing (a ${this.spec.kind} file holds ${this.spec.fields.map((x) => x.name).join(', ')})`,
        );
      const tmp = this.scratch[k];
      if (tmp === null || given.length !== tmp.length) {
        this.values[f.name] = given; // the record writer reports a wrong length by name
      } else {
        const s = this.fieldScale[k];
        for (let i = 0; i < tmp.length; i++) tmp[i] = given[i] * s;
        this.values[f.name] = tmp;
      }
    });
    const bytes = this.writer.appendRecord(this.values);
    this.lastTime = frame.time;
    return bytes;
  }

  get numrecs(): number {
    return this.writer.numrecs;
  }

  numrecsField(): Uint8Array {
    return this.writer.numrecsField();
  }

  recordOffset(r: number): number {
    return this.writer.recordOffset(r);
  }

  /** Bytes per record. */
  get recordSize(): number {
    return this.writer.layout.recsize;
  }
}

/** A whole Stria file in memory: sized up front, header, coordinates and every frame written in place. */
export function encodeStriaFile(
  spec: StriaFileKindSpec,
  run: StriaRunInfo,
  frames: readonly StriaFrame[],
  options: StriaFileOptions = {},
): Uint8Array {
  const w = new StriaFileWriter(spec, run, options);
  const head = w.head();
  const out = new Uint8Array(head.length + frames.length * w.recordSize);
  out.set(head);
  frames.forEach((f, r) => out.set(w.appendFrame(f), w.recordOffset(r)));
  out.set(w.numrecsField(), NUMRECS_OFFSET);
  return out;
}

export const encodeSnapshotFile = (
  run: StriaRunInfo,
  frames: readonly StriaFrame[],
  options?: StriaFileOptions,
): Uint8Array => encodeStriaFile(SNAPSHOT_FILE, run, frames, options);
export const encodeZonalMeanFile = (
  run: StriaRunInfo,
  frames: readonly StriaFrame[],
  options?: StriaFileOptions,
): Uint8Array => encodeStriaFile(ZONAL_MEAN_FILE, run, frames, options);
