import type { ModelParams } from '../../lib/model/params';
import { scaledHyperviscosity } from '../../lib/plan/gridHyperviscosity';

/**
 * A change of the grid in the app, with the hyperviscosity following it: when nx or ny changes and
 * the user has not set ν by hand in this run, ν is rescaled (scaledHyperviscosity) so that its
 * damping rate at the largest kept wavenumber stays what it was; a ν set by hand is kept as it is.
 * Returns the changes to send and a sentence for the note beside ν (null when ν is not concerned).
 */
export function withGridHyperviscosity(
  params: ModelParams,
  changes: Partial<ModelParams>,
  nuByHand: boolean,
): { changes: Partial<ModelParams>; note: string | null } {
  const grid =
    (changes.nx !== undefined && changes.nx !== params.nx) || (changes.ny !== undefined && changes.ny !== params.ny);
  if (!grid || 'nu' in changes || params.nu === 0) return { changes, note: null };
  const size = `${changes.nx ?? params.nx} × ${changes.ny ?? params.ny}`;
  if (nuByHand)
    return {
      changes,
      note: `ν kept at ${params.nu} on the ${size} grid, as you set it by hand: its damping at the new grid scale differs from before (set ν again to change it).`,
    };
  const nu = scaledHyperviscosity(params, changes);
  if (nu === params.nu) return { changes, note: null };
  return {
    changes: { ...changes, nu },
    note: `ν follows the grid: ${params.nu} → ${nu} on ${size}, so its damping rate at the largest kept wavenumber stays what it was.`,
  };
}
