import type { ModelParams } from '../../lib/model/params';

/** True when two complete parameter records are the same run setup. */
export function sameParams(a: ModelParams, b: ModelParams): boolean {
  return (
    (Object.keys(a) as (keyof ModelParams)[]).every((k) => a[k] === b[k]) &&
    Object.keys(b).length === Object.keys(a).length
  );
}

/**
 * How the matched run started here stands, from the latest snapshot: 'starting' until a snapshot of
 * a newer run with its parameters arrives, then 'running', 'done' once it has reached its length and
 * paused, or 'replaced' when the worker's run is no longer it (another run, changed parameters).
 */
export type TrialPhase = 'starting' | 'running' | 'done' | 'replaced';

export interface TrialTrack {
  params: ModelParams;
  runLength: number;
  /** The run epoch before the trial started, and the trial's own once seen. */
  after: number;
  epoch: number | null;
}

export function trialPhase(
  t: TrialTrack,
  snap: { epoch: number; params: ModelParams; time: number; playing: boolean },
): { phase: TrialPhase; epoch: number | null } {
  if (t.epoch === null) {
    if (snap.epoch > t.after && sameParams(snap.params, t.params)) return { phase: 'running', epoch: snap.epoch };
    return { phase: snap.epoch > t.after ? 'replaced' : 'starting', epoch: null };
  }
  if (snap.epoch !== t.epoch || !sameParams(snap.params, t.params)) return { phase: 'replaced', epoch: t.epoch };
  return { phase: snap.time >= t.runLength && !snap.playing ? 'done' : 'running', epoch: t.epoch };
}
