/**
 * Does a field connect across the edges of its grid? The edge-mismatch test for an axis whose period
 * the coordinates do not state: the rms difference across the seam (last row/column to the first)
 * against the rms difference between neighbours inside the grid. For a smooth field on a periodic
 * grid the seam is one more pair of neighbours, so the ratio is near 1; on a bounded domain the two
 * edges are unrelated and the ratio is large. Ratio ≤ SEAM_RATIO_LIMIT counts as periodic. A seam
 * difference of exactly zero means the last point repeats the first (a grid that includes both
 * ends), which is not a periodic grid of n distinct points. Missing values (NaN) are skipped. With
 * fewer than SEAM_MIN_POINTS points along the axis the ratio says nothing (a linear ramp over n
 * points gives n − 1) and the test gives no answer. The test cannot tell a bounded field that
 * happens to meet itself at the edges (e.g. one that vanishes on both walls) from a periodic one;
 * give the period or --periodic when that matters.
 */
export const SEAM_RATIO_LIMIT = 3;
export const SEAM_MIN_POINTS = 8;

export interface SeamTest {
  periodic: boolean;
  ratio: number;
  /** True when the seam difference vanishes: the last row/column duplicates the first. */
  duplicated: boolean;
}

/** The seam test along x (axis 'x': columns nx−1 → 0) or y (rows ny−1 → 0) of f (nx·ny, row-major). */
export function seamTest(f: Float64Array, nx: number, ny: number, axis: 'x' | 'y'): SeamTest | null {
  let seam = 0;
  let seamN = 0;
  let inner = 0;
  let innerN = 0;
  const along = axis === 'x' ? nx : ny;
  const across = axis === 'x' ? ny : nx;
  const at = (s: number, c: number) => (axis === 'x' ? f[c * nx + s] : f[s * nx + c]);
  if (along < SEAM_MIN_POINTS) return null;
  for (let c = 0; c < across; c++) {
    const d = at(0, c) - at(along - 1, c);
    if (Number.isFinite(d)) {
      seam += d * d;
      seamN++;
    }
    for (let s = 0; s + 1 < along; s++) {
      const e = at(s + 1, c) - at(s, c);
      if (Number.isFinite(e)) {
        inner += e * e;
        innerN++;
      }
    }
  }
  if (!seamN || !innerN || !(inner > 0)) return null;
  const ratio = Math.sqrt(seam / seamN) / Math.sqrt(inner / innerN);
  const duplicated = ratio < 1e-9;
  return { periodic: !duplicated && ratio <= SEAM_RATIO_LIMIT, ratio, duplicated };
}
