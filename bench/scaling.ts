import type { StepTiming } from './stepBench';

/** Least-squares slope of y against x. */
function slope(x: number[], y: number[]): number {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  return sxy / sxx;
}

/**
 * Fitted exponents of the step cost: t ∝ N^a (a ≈ 2.2 expected between 64 and 1024 for N² log N), and
 * t ∝ (N² log₂ N)^b (b = 1 means the cost scales exactly as N² log N).
 */
export function fitScaling(ts: StepTiming[]): { exponentN: number; exponentN2logN: number } {
  const logT = ts.map((t) => Math.log(t.ms_per_step));
  return {
    exponentN: slope(
      ts.map((t) => Math.log(t.n)),
      logT,
    ),
    exponentN2logN: slope(
      ts.map((t) => Math.log(t.n * t.n * Math.log2(t.n))),
      logT,
    ),
  };
}
