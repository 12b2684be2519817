/**
 * When has the model clock reached a time? The stepper keeps time by adding the step, t ← t + dt, so
 * after n fixed steps t differs from n·dt by the rounding of n additions: 500 steps of 0.01 give
 * t = 4.99999999999994, not 5, and a plain `t >= 5` would take a 501st step. A target counts as
 * reached when the clock is within CLOCK_TOLERANCE steps of it. The rounding of n additions is at most
 * n²·dt·2⁻⁵⁴ (each addition rounds by half an ulp of t ≤ n·dt), below a thousandth of a step for
 * n < 4·10⁶ steps, and in practice far less; an honest target between two step ends is still passed,
 * not rounded down, unless it lies within that thousandth of a step of the earlier one.
 *
 * The clock itself is left as it is: time is not part of the state the model computes with, so the
 * bits of the state after n steps do not depend on this rule, and checkpoints keep their meaning.
 */

/** The fraction of a step within which a target time counts as reached. */
export const CLOCK_TOLERANCE = 1e-3;

/** True when the clock at `time`, stepping by `dt`, has reached `target` (to CLOCK_TOLERANCE of a step). */
export function reachedTime(time: number, target: number, dt: number): boolean {
  return time >= target - CLOCK_TOLERANCE * dt;
}
