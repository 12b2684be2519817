import { TABLE_SIZE } from './divergingTable';

/**
 * Paint a column-major record (column c at data[c·ny .. (c+1)·ny), time across, y up) into `pixels`,
 * a Uint32Array view of a columns × ny ImageData, through a diverging `table`: values map linearly
 * from [−range, range] onto the table and clamp beyond. Image row r shows y index ny − 1 − r (north
 * up). A range of 0 (or not finite) paints the colour of zero.
 */
export function paintHovmoller(
  data: Float64Array,
  columns: number,
  ny: number,
  range: number,
  table: Uint32Array,
  pixels: Uint32Array,
): void {
  if (data.length < columns * ny || pixels.length !== columns * ny) {
    throw new RangeError(
      `paintHovmoller: expected ${columns * ny} values and pixels, got ${data.length} and ${pixels.length}`,
    );
  }
  const half = TABLE_SIZE / 2;
  const s = range > 0 && Number.isFinite(range) ? half / range : 0;
  for (let c = 0; c < columns; c++) {
    const src = c * ny;
    for (let j = 0; j < ny; j++) {
      let k = Math.floor(half + s * data[src + j]);
      if (k < 0) k = 0;
      else if (k > TABLE_SIZE - 1) k = TABLE_SIZE - 1;
      pixels[(ny - 1 - j) * columns + c] = table[k];
    }
  }
}

/** Largest |value| of the first n values (the Hovmöller's colour range: ū is smooth, with no outliers to wash it out). */
export function maxAbs(data: Float64Array, n = data.length): number {
  let m = 0;
  for (let i = 0; i < n; i++) m = Math.max(m, Math.abs(data[i]));
  return m;
}

/**
 * A jet track (y unwrapped across the periodic seam) as polyline pieces inside [0, Ly): the track is
 * wrapped point by point and cut where consecutive points fall on opposite sides of the seam.
 */
export function wrappedPieces(t: ArrayLike<number>, y: ArrayLike<number>, Ly: number): { t: number[]; y: number[] }[] {
  const pieces: { t: number[]; y: number[] }[] = [];
  let cur: { t: number[]; y: number[] } | null = null;
  let lastBranch = NaN;
  for (let i = 0; i < t.length; i++) {
    const branch = Math.floor(y[i] / Ly);
    if (!cur || branch !== lastBranch) {
      cur = { t: [], y: [] };
      pieces.push(cur);
    }
    cur.t.push(t[i]);
    cur.y.push(y[i] - branch * Ly);
    lastBranch = branch;
  }
  return pieces;
}
