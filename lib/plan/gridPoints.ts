/** Smallest and largest grid sizes a plan may name (powers of two). */
export const PLAN_SIZE_MIN = 32;
export const PLAN_SIZE_MAX = 65_536;

/**
 * Points across a length L for a largest acceptable spacing d: the smallest power of two n ≥ 32
 * with L/n ≤ d (the spacing given is an upper bound; the plan reports the spacing it gets).
 */
export function pointsForSpacing(L: number, d: number): number {
  const need = L / d;
  let n = PLAN_SIZE_MIN;
  // Allow for the round-off of L/d when d divides L exactly.
  while (n < need * (1 - 1e-12)) n *= 2;
  return n;
}
