import { MAX_THREADS } from '../lib/model/stepTeam';

/**
 * Threads the app's step runs on unless the user chooses: every core the browser reports (grids
 * below 128² still step on one, workers/threadChoice.ts). Two threads were measured 1.6–1.7× faster
 * than one from 128² up (DEFAULT_THREADS_MIN_POINTS in stepTeam.ts).
 */
export function defaultThreads(): number {
  return availableThreads();
}

/** Every core the browser reports, the most the Threads control offers. */
export function availableThreads(): number {
  const cores = typeof navigator === 'undefined' ? 1 : navigator.hardwareConcurrency || 1;
  return Math.min(MAX_THREADS, Math.max(1, cores));
}
