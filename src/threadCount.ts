import { MAX_THREADS } from '../lib/model/stepTeam';

/**
 * Threads the app's step runs on unless the user chooses: one. The app's runs are mostly below 512²,
 * where two threads were measured slower than one (DEFAULT_THREADS_MIN_POINTS in stepTeam.ts); the
 * Threads control offers up to every core the browser reports (availableThreads).
 */
export function defaultThreads(): number {
  return 1;
}

/** Every core the browser reports, the most the Threads control offers. */
export function availableThreads(): number {
  const cores = typeof navigator === 'undefined' ? 1 : navigator.hardwareConcurrency || 1;
  return Math.min(MAX_THREADS, Math.max(1, cores));
}
