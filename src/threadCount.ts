import { MAX_THREADS } from '../lib/model/stepTeam';

/** Threads the app's step runs on unless the user chooses: every core the browser reports. */
export function defaultThreads(): number {
  const cores = typeof navigator === 'undefined' ? 1 : navigator.hardwareConcurrency || 1;
  return Math.min(MAX_THREADS, Math.max(1, cores));
}
