import { TABLE_SIZE } from './divergingTable';

/** Colour range in units of the field's root-mean-square value. */
export const RANGE_IN_RMS = 2.5;

/**
 * The symmetric colour range of a signed field: 2.5 × its root-mean-square value (0 at rest).
 * Not max |value|: a few extreme vortices would wash the rest out, and the maximum jumps from frame
 * to frame. For a near-Gaussian turbulent field about 1% of points lie beyond and saturate.
 */
export function symmetricRange(field: Float64Array): number {
  // Four partial sums: the additions no longer wait on each other, which halves the time at 512².
  const n = field.length;
  const m = n - (n % 4);
  let s0 = 0,
    s1 = 0,
    s2 = 0,
    s3 = 0;
  for (let i = 0; i < m; i += 4) {
    const a = field[i],
      b = field[i + 1],
      c = field[i + 2],
      d = field[i + 3];
    s0 += a * a;
    s1 += b * b;
    s2 += c * c;
    s3 += d * d;
  }
  for (let i = m; i < n; i++) s0 += field[i] * field[i];
  return n ? RANGE_IN_RMS * Math.sqrt((s0 + s1 + s2 + s3) / n) : 0;
}

/**
 * Paint a grid field (row-major, y slow: field[jy·nx + ix]) into `pixels`, a Uint32Array view of an
 * nx × ny ImageData, through `table`. Values map linearly from [−range, range] onto the table and
 * clamp beyond it. Image rows run top to bottom, so row r shows jy = ny − 1 − r: north is up.
 * A range of 0 (or not finite) paints every point with the colour of zero.
 */
export function paintField(
  field: Float64Array,
  nx: number,
  ny: number,
  range: number,
  table: Uint32Array,
  pixels: Uint32Array,
): void {
  if (field.length !== nx * ny || pixels.length !== nx * ny) {
    throw new RangeError(`paintField: expected ${nx * ny} values and pixels, got ${field.length} and ${pixels.length}`);
  }
  const half = TABLE_SIZE / 2;
  const s = range > 0 && Number.isFinite(range) ? half / range : 0;
  for (let jy = 0; jy < ny; jy++) {
    const src = jy * nx;
    const dst = (ny - 1 - jy) * nx;
    for (let ix = 0; ix < nx; ix++) {
      // Math.min/max compile to branch-free instructions; compare-and-branch clamps cost more here.
      pixels[dst + ix] = table[Math.min(TABLE_SIZE - 1, Math.max(0, Math.floor(half + s * field[src + ix])))];
    }
  }
}
