import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { trialPhase, type TrialTrack } from '../../../src/plan/matchedTrial';

describe('trialPhase', () => {
  const params = { ...DEFAULT_PARAMS, nx: 64, ny: 64 };
  const track: TrialTrack = { params, runLength: 10, after: 3, epoch: null };

  it('waits for the new run, follows it to its end, and notices when it is replaced', () => {
    expect(trialPhase(track, { epoch: 3, params: DEFAULT_PARAMS, time: 50, playing: true })).toEqual({
      phase: 'starting',
      epoch: null,
    });
    const seen = trialPhase(track, { epoch: 4, params, time: 0, playing: false });
    expect(seen).toEqual({ phase: 'running', epoch: 4 });
    const live = { ...track, epoch: 4 };
    expect(trialPhase(live, { epoch: 4, params, time: 10.01, playing: true }).phase).toBe('running');
    expect(trialPhase(live, { epoch: 4, params, time: 10.01, playing: false }).phase).toBe('done');
    expect(trialPhase(live, { epoch: 4, params: { ...params, beta: 1 }, time: 5, playing: true }).phase).toBe(
      'replaced',
    );
    expect(trialPhase(live, { epoch: 5, params, time: 0, playing: true }).phase).toBe('replaced');
    // A newer run with other parameters before the trial was seen: replaced too.
    expect(trialPhase(track, { epoch: 4, params: DEFAULT_PARAMS, time: 0, playing: true }).phase).toBe('replaced');
  });
});
