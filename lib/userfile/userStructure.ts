import { StructureDetector, type JetDetection, type StaircaseDetection } from '../analysis/jetDetector';

/**
 * Jets and PV staircase of a user's file by the one detector (lib/analysis/jetDetector.ts), the same
 * rule as every Stria run: the time mean over the records analysed, judged against the scatter of
 * the records themselves. The records' profiles are the detector's batch means (one record, one
 * bin); a record with a missing value at a row takes the window's mean there, so it adds no scatter
 * (its row is judged on the others). Without μ the flow's memory is unknown and the records' own
 * decorrelation decides how many are independent; with μ the drag time 1/μ bounds it as in a run.
 */
export interface RecordSeries {
  /** Profiles of the records, oldest first, record r at values[r·points + j]. */
  values: Float64Array;
  count: number;
  /** Time of each record (the file's time, or the record index when the file has none). */
  times: number[];
}

export type UserJets = Omit<JetDetection, 'report'> & { method: 'direct' | 'extended' };
export type UserStaircase = StaircaseDetection & { method: 'direct' | 'extended' };

export interface ProfileSpan {
  /** Profile points, first position, spacing, periodic. */
  points: number;
  y0: number;
  dy: number;
  periodic: boolean;
}

/** The records' profiles restricted to rows [a, b), the mean filled in where a record is missing. */
export function recordRows(
  series: RecordSeries,
  ny: number,
  a: number,
  b: number,
  mean: ArrayLike<number>,
): Float64Array {
  const n = b - a;
  const out = new Float64Array(series.count * n);
  for (let r = 0; r < series.count; r++)
    for (let j = 0; j < n; j++) {
      const v = series.values[r * ny + a + j];
      out[r * n + j] = Number.isFinite(v) ? v : mean[j];
    }
  return out;
}

function meanSeries(mean: Float64Array, bins: Float64Array, times: number[]) {
  const count = times.length;
  const span = count > 1 ? ((times[count - 1] - times[0]) * count) / (count - 1) : 0;
  return { mean, bins, count, interval: count > 1 ? span / count : 1, span, samples: count };
}

function detector(geometry: ProfileSpan, beta: number, mu: number | undefined): StructureDetector {
  return new StructureDetector(geometry, { beta, memory: mu && mu > 0 ? 1 / mu : 0 });
}

const method = (g: ProfileSpan): 'direct' | 'extended' =>
  g.periodic && (g.points & (g.points - 1)) === 0 ? 'direct' : 'extended';

/** The jets of the time-mean ū (`mean`, the geometry's rows) with the records' rows `bins`. */
export function userJets(
  geometry: ProfileSpan,
  mean: Float64Array,
  bins: Float64Array,
  times: number[],
  mu?: number,
): UserJets {
  const { report: _report, ...rest } = detector(geometry, 0, mu).jets(meanSeries(mean, bins, times));
  return { ...rest, method: method(geometry) };
}

/** The staircase of the time-mean total PV (`mean`, q̄ + β(y − y0)) with the records' profiles `bins`. */
export function userStaircase(
  geometry: ProfileSpan,
  beta: number,
  mean: Float64Array,
  bins: Float64Array,
  times: number[],
  mu?: number,
): UserStaircase {
  return { ...detector(geometry, beta, mu).staircase(meanSeries(mean, bins, times)), method: method(geometry) };
}
