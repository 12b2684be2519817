import type { HovmollerRecord } from './hovmoller';
import { StructureDetector } from './jetDetector';
import { successiveSpread } from './noiseReference';
import { periodicDistance } from './periodicPeaks';

/** One jet followed through a Hovmöller record (model units: t time, y length, speed length/time). */
export interface JetTrack {
  id: number;
  /** Column times at which the jet was found. */
  t: number[];
  /** Positions, unwrapped across the periodic seam (y mod Ly is the position in [0, Ly)). */
  y: number[];
  /** Peak ū at each time. */
  speed: number[];
  /** Drift dy/dt: least-squares slope of y against t (length/time); null for a single point. */
  drift: number | null;
  /** 'record': present in the first (last) column; 'emerged'/'faded': appeared (vanished) alone. */
  start: 'record' | 'emerged' | 'split';
  end: 'record' | 'faded' | 'merger';
}

/** A merger (a track ends into a neighbour) or a split (a track starts off one), at the first column showing it. */
export interface JetEvent {
  kind: 'merger' | 'split';
  t: number;
  /** Position of the single jet at the event: the merged jet, or the parent before it split. */
  y: number;
  /** merger: [ending track, surviving track]; split: [parent track, new track]. */
  tracks: [number, number];
}

export interface JetTrackingOptions {
  /** The detector of the record's grid (built if absent: jetDetector.ts, default false-alarm probability). */
  detector?: StructureDetector;
  /** Largest move of a jet between successive columns (length); default a third of the mean jet spacing of the two columns. */
  maxJump?: number;
  /** Largest distance from a vanishing (appearing) jet to the jet it merged into (split from); default maxJump. */
  eventRadius?: number;
}

export interface JetTracking {
  tracks: JetTrack[];
  mergers: JetEvent[];
  splits: JetEvent[];
}

/**
 * Follows the jets of each column of a Hovmöller record from column to column. The jets of a column
 * are those of the one detector (jetDetector.ts) for a single profile: maxima standing out of the
 * record's own eddy noise (the scatter between successive columns, noiseReference.ts); a record of
 * fewer than three columns has no noise estimate and no jets. Pairs of jets of successive columns
 * closer than maxJump (periodic distance) are matched one-to-one, nearest first. A jet left unmatched whose nearest successor lies within eventRadius and
 * continues another track has merged into it; a new jet whose nearest predecessor lies within
 * eventRadius and continues into another jet has split off it. Columns must be sampled densely
 * enough that jets move less than maxJump between them.
 */
export function trackJets(record: HovmollerRecord, options: JetTrackingOptions = {}): JetTracking {
  const { ny, Ly, columns, t, data } = record;
  const detector = options.detector ?? new StructureDetector({ points: ny, y0: 0, dy: Ly / ny, periodic: true });
  const spread = successiveSpread(data, columns, ny);
  const tracks: JetTrack[] = [];
  const mergers: JetEvent[] = [];
  const splits: JetEvent[] = [];
  // Open tracks of the previous column, by jet: track id and position in [0, Ly).
  let prev: { id: number; y: number }[] = [];
  for (let c = 0; c < columns; c++) {
    const jets = spread
      ? detector.jetsOfSample(data.subarray(c * ny, (c + 1) * ny), spread).map((p) => ({ y: p.y, speed: p.value }))
      : [];
    const next: { id: number; y: number }[] = new Array(jets.length);
    if (c === 0) {
      jets.forEach((j, i) => (next[i] = { id: open(tracks, t[c], j.y, j.speed, 'record'), y: j.y }));
      prev = next;
      continue;
    }
    const maxJump = options.maxJump ?? Ly / (3 * Math.max(prev.length, jets.length, 1));
    const radius = options.eventRadius ?? maxJump;
    // Stage 1: one-to-one matching, nearest pairs first.
    const pairs: [number, number, number][] = [];
    prev.forEach((a, ia) =>
      jets.forEach((b, ib) => {
        const d = periodicDistance(a.y, b.y, Ly);
        if (d <= maxJump) pairs.push([d, ia, ib]);
      }),
    );
    pairs.sort((p, q) => p[0] - q[0]);
    const matchA = new Int32Array(prev.length).fill(-1);
    const matchB = new Int32Array(jets.length).fill(-1);
    for (const [, ia, ib] of pairs) {
      if (matchA[ia] >= 0 || matchB[ib] >= 0) continue;
      matchA[ia] = ib;
      matchB[ib] = ia;
      extend(tracks[prev[ia].id], t[c], jets[ib].y, jets[ib].speed, Ly);
      next[ib] = { id: prev[ia].id, y: jets[ib].y };
    }
    // Stage 2: vanished jets, merged into a continuing neighbour or faded.
    prev.forEach((a, ia) => {
      if (matchA[ia] >= 0) return;
      const ib = nearest(a.y, jets, Ly);
      const track = tracks[a.id];
      if (ib >= 0 && matchB[ib] >= 0 && periodicDistance(a.y, jets[ib].y, Ly) <= radius) {
        track.end = 'merger';
        mergers.push({ kind: 'merger', t: t[c], y: jets[ib].y, tracks: [a.id, prev[matchB[ib]].id] });
      } else track.end = 'faded';
    });
    // Stage 3: new jets, split off a continuing neighbour or emerged.
    jets.forEach((b, ib) => {
      if (matchB[ib] >= 0) return;
      const ia = nearest(b.y, prev, Ly);
      const split = ia >= 0 && matchA[ia] >= 0 && periodicDistance(b.y, prev[ia].y, Ly) <= radius;
      const id = open(tracks, t[c], b.y, b.speed, split ? 'split' : 'emerged');
      if (split) splits.push({ kind: 'split', t: t[c], y: prev[ia].y, tracks: [prev[ia].id, id] });
      next[ib] = { id, y: b.y };
    });
    prev = next;
  }
  for (const tr of tracks) tr.drift = slope(tr.t, tr.y);
  return { tracks, mergers, splits };
}

function open(tracks: JetTrack[], t: number, y: number, speed: number, start: JetTrack['start']): number {
  const id = tracks.length;
  tracks.push({ id, t: [t], y: [y], speed: [speed], drift: null, start, end: 'record' });
  return id;
}

/** Append a position, continued from the last one by the nearest periodic image. */
function extend(track: JetTrack, t: number, y: number, speed: number, Ly: number): void {
  const last = track.y[track.y.length - 1];
  const d = y - last;
  track.t.push(t);
  track.y.push(last + d - Ly * Math.round(d / Ly));
  track.speed.push(speed);
}

function nearest(y: number, list: readonly { y: number }[], Ly: number): number {
  let best = -1;
  let dBest = Infinity;
  list.forEach((b, i) => {
    const d = periodicDistance(y, b.y, Ly);
    if (d < dBest) {
      dBest = d;
      best = i;
    }
  });
  return best;
}

/** Least-squares slope of y against t; null for fewer than two distinct times. */
function slope(t: number[], y: number[]): number | null {
  const n = t.length;
  if (n < 2) return null;
  const tm = t.reduce((a, b) => a + b, 0) / n;
  const ym = y.reduce((a, b) => a + b, 0) / n;
  let sty = 0;
  let stt = 0;
  for (let i = 0; i < n; i++) {
    sty += (t[i] - tm) * (y[i] - ym);
    stt += (t[i] - tm) ** 2;
  }
  return stt > 0 ? sty / stt : null;
}
