import { NO_NEEDS, type DiagnosticNeeds } from '../../workers/diagnosticsApi';
import type { SimulationClient } from '../simulation.svelte';

/**
 * Ask the worker for the diagnostics a view needs while it is shown, following `needs` as it changes
 * (e.g. the 2D spectrum switched on), and for none once the view is gone: the worker computes only
 * what is on screen. Call from a view component's script.
 */
export function useNeeds(sim: () => SimulationClient, needs: () => Partial<DiagnosticNeeds>): void {
  $effect(() => {
    const client = sim();
    void client.setNeeds({ ...NO_NEEDS, ...needs() });
    return () => void client.setNeeds({ ...NO_NEEDS });
  });
}
