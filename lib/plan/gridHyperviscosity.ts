import type { ModelParams } from '../model/params';
import { keptRadius } from '../model/validateParams';

/** The parameters the hyperviscous damping at the grid scale depends on. */
export type HyperviscousGrid = Pick<ModelParams, 'nu' | 'nu_order' | 'nx' | 'ny' | 'Lx' | 'Ly'>;

/** Significant figures of a rescaled ν: the damping rate at k_max is kept to 5·10⁻⁴. */
export const RESCALED_NU_DIGITS = 4;

/**
 * ν for a new grid, so that the hyperviscous damping rate at the largest kept wavenumber,
 * ν k_max^{2p}, stays what it was on the old grid (as the planner's grid damping time τ does:
 * ν = 1/(τ k_max^{2p})). A ν tuned for 128² left as it is at 256² would damp the new grid scale
 * (85/42)^{16} ≈ 8·10⁴ times faster at order 8 and waste the scales the grid adds.
 *
 *   ν_new = ν (k_max,old / k_max,new)^{2p},  k_max = min(2π⌊nx/3⌋/Lx, 2π⌊ny/3⌋/Ly) (the 2/3 rule)
 *
 * The same ν is returned, untouched, when k_max does not change; otherwise the result is rounded to
 * RESCALED_NU_DIGITS significant figures, so it reads as a number a person would type. The power is
 * taken by repeated multiplication and the rounding by toPrecision, both exact in IEEE arithmetic, so
 * every engine gives the same bits (and so the same run). Model units: ν in length^{2p}/time.
 */
export function scaledHyperviscosity(
  params: HyperviscousGrid,
  grid: Partial<Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'>>,
): number {
  const next = { ...params, ...grid };
  const ratio = keptRadius(params) / keptRadius(next);
  if (ratio === 1 || params.nu === 0) return params.nu;
  let factor = 1;
  for (let i = 0; i < 2 * params.nu_order; i++) factor *= ratio;
  return Number((params.nu * factor).toPrecision(RESCALED_NU_DIGITS));
}
