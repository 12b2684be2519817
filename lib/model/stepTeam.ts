/**
 * A step made of phases that threads share. Each phase is a pass over the state split into
 * disjoint shares (ranges of kx columns or of grid rows y, `shareBound`), one per member of the
 * team; a phase ends when every member has done its share, and the next starts only then. Every
 * value a phase writes is computed by the same operations whatever the shares, and every sum over
 * the state is taken by the calling thread alone in one fixed order, so a step gives the same bits
 * on any number of threads (docs/threads.md).
 */

/** A step whose phases a team can run. */
export interface PhasedStep {
  /** Do share `member` (0 = the calling thread) of `members` of phase `phase`. */
  runPhase(phase: number, member: number, members: number): void;
}

/** Who runs the phases of a step: the calling thread alone, or it and helper threads (threadTeam.ts). */
export interface StepTeam {
  /** Threads taking part, the calling thread included. */
  readonly members: number;
  /** Run phase `phase` on every member, the calling thread's share included; returns when all are done. */
  run(phase: number): void;
}

/** The calling thread alone. */
export class SoloTeam implements StepTeam {
  readonly members = 1;
  constructor(private readonly step: PhasedStep) {}
  run(phase: number): void {
    this.step.runPhase(phase, 0, 1);
  }
}

/** Phase 0 is the team's own: helpers leave the team (threadTeam.ts); no step uses it. */
export const LEAVE_PHASE = 0;

/**
 * Grids below this many points step on one thread unless the user insists: their phases last a few
 * microseconds, less than it takes threads to meet, and on a busy machine far less.
 */
export const SMALL_GRID_POINTS = 128 * 128;

/**
 * Below this many points a run takes one thread unless asked for more; from it up, every core.
 * Measured on the two-core development machine (2026-12-05, `npm run bench -- --threads 1,2`,
 * README "Threads"): since each thread's share lives in slabs of its own
 * (realTransform2D.ts, modeSlabs.ts), two threads step 1.39× faster than one at 128², 1.60× at 256²
 * and 1.68× at 512² (medians of five rounds, each in a fresh process). Threads stay a choice (`--threads`, the app's Threads control); the
 * bits are the same on any number.
 */
export const DEFAULT_THREADS_MIN_POINTS = SMALL_GRID_POINTS;

/** Shares of kx columns and of grid rows are cut at multiples of these (`shareBound`). */
export const COLUMN_UNIT = 4;
export const ROW_UNIT = 4;

/** Most threads a step takes (the per-member slots of the speed maxima are sized for it). */
export const MAX_THREADS = 64;

/**
 * Boundary k (0..parts) of `parts` contiguous shares of 0..n, cut at multiples of `unit` (so that
 * shares of grid rows stay even and do not split cache lines): share k is bound(k)..bound(k + 1).
 * Shares may be empty when n is small; they always tile 0..n.
 */
export function shareBound(n: number, k: number, parts: number, unit: number): number {
  if (k >= parts) return n;
  const units = Math.ceil(n / unit);
  return Math.min(n, unit * Math.floor((units * k) / parts));
}

/**
 * The slabs member `member` of `members` runs when a step is cut into `slabs` fixed slabs (one per
 * thread it was built for, realTransform2D.ts): slabs first..end − 1, into `out`. With as many
 * members as slabs, one each; with fewer (a team that lost its helpers), the calling thread takes
 * them all, so the work, and the bits, stay the same.
 */
export function slabRange(member: number, members: number, slabs: number, out: Int32Array): void {
  out[0] = Math.floor((slabs * member) / members);
  out[1] = Math.floor((slabs * (member + 1)) / members);
}
