import type { StaircaseMark } from '../../workers/diagnosticsApi';

/**
 * The fitted staircase as a profile on the grid rows y_j = j·Ly/ny, to draw over q̄ + βy: each point
 * takes its step's level. Step i runs from edges[i] up to edges[i + 1]; the last wraps past Ly, so the
 * points below edges[0] belong to it, one period down: its level − βLy (staircase.ts keeps levels on
 * the branch y ∈ [edges[i], edges[i] + width)). Without edges there is one step, the whole period.
 */
export function staircaseProfile(
  y: ArrayLike<number>,
  fit: StaircaseMark,
  beta: number,
  Ly: number,
  out = new Float64Array(y.length),
): Float64Array {
  const { edges, levels } = fit;
  const n = edges.length;
  for (let j = 0; j < y.length; j++) {
    if (n === 0) {
      out[j] = levels[0];
      continue;
    }
    let s = -1;
    for (let i = 0; i < n; i++) if (y[j] >= edges[i] - 1e-12) s = i;
    out[j] = s >= 0 ? levels[s] : levels[n - 1] - beta * Ly;
  }
  return out;
}
