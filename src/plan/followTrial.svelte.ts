import type { SimulationClient } from '../simulation.svelte';
import { trialPhase } from './matchedTrial';
import { planSession } from './planSession.svelte';

/**
 * Follow the matched run tried here through the snapshots, and fetch its measured summary once it
 * has reached its length. Called from a component's setup (it registers an effect there), by the
 * one-layer and the baroclinic matched-run sections alike.
 */
export function followTrial(client: () => SimulationClient): void {
  const s = planSession;
  let measuring = false;
  $effect(() => {
    const sim = client();
    const t = s.trial;
    const snap = sim.snapshot;
    if (!t || !snap || t.phase === 'done' || t.phase === 'replaced') return;
    const { phase, epoch } = trialPhase(t, snap);
    if (phase === 'done') {
      if (measuring) return;
      measuring = true;
      void sim.summary().then((measured) => {
        measuring = false;
        s.trial = { ...t, epoch, phase: 'done', measured };
      });
    } else if (phase !== t.phase || epoch !== t.epoch) s.trial = { ...t, phase, epoch };
  });
}

/** The sampling of a matched run, as the command line's --matched: at most every 10 steps, 200 or more over the run; the second half averaged. */
export function trialSampling(dt: number, runLength: number): { sampleEvery: number; meanSpan: number } {
  return { sampleEvery: Math.max(dt, Math.min(10 * dt, runLength / 200)), meanSpan: runLength / 2 };
}
