/** Why a save was made: the page shows it, and a test can wait for it. */
export type SaveReason = 'timer' | 'paused' | 'hidden';

/**
 * The autosaver's rule at each tick (autosaver.svelte.ts): a run that has just stopped playing is
 * saved at once (its state will not change now); a playing one every `everyMs` of wall time.
 */
export function saveDue(
  wasPlaying: boolean,
  playing: boolean,
  sinceLastMs: number,
  everyMs: number,
): SaveReason | null {
  if (wasPlaying && !playing) return 'paused';
  if (playing && sinceLastMs >= everyMs) return 'timer';
  return null;
}
