/**
 * Units of Stria's NetCDF variables (CF Conventions 1.8, section 3.1: a `units` string that UDUNITS
 * understands is required for every dimensional quantity).
 *
 * Stria's model is nondimensional: every quantity is a number of model length units L and model
 * time units T. Each variable has a model dimension L^a T^b. In model units the values are pure
 * numbers, so `units` is "1", and the model dimension is kept beside it in `stria_model_units`
 * ("L2 T-1" for ψ). When the caller knows what L and T are in metres and seconds (a planet or
 * scenario from the plan), the values are converted and `units` is the SI string ("m2 s-1").
 */

/** Exponents of the model length unit L and time unit T. */
export interface ModelDimension {
  L: number;
  T: number;
}

/** Where the flow lives, for the medium-specific CF standard names (physical units only). */
export type Medium = 'atmosphere' | 'ocean';

export type UnitSystem =
  { kind: 'model' } | { kind: 'physical'; metresPerLength: number; secondsPerTime: number; medium?: Medium };

export const MODEL_UNITS: UnitSystem = Object.freeze({ kind: 'model' });

/** Checks a unit system at the boundary; names the offending field. */
export function checkUnitSystem(u: UnitSystem): void {
  if (u.kind === 'model') return;
  if (u.kind !== 'physical')
    throw new RangeError(
      `units.kind must be 'model' or 'physical', got ${JSON.stringify((u as { kind: unknown }).kind)}`,
    );
  for (const key of ['metresPerLength', 'secondsPerTime'] as const) {
    const x = u[key];
    if (!(typeof x === 'number' && Number.isFinite(x) && x > 0))
      throw new RangeError(`units.${key} must be a finite number > 0, got ${x}`);
  }
  if (u.medium !== undefined && u.medium !== 'atmosphere' && u.medium !== 'ocean') {
    throw new RangeError(`units.medium must be 'atmosphere' or 'ocean' when given, got ${JSON.stringify(u.medium)}`);
  }
}

/** The `units` attribute: "1" in model units, else the SI string, e.g. "m s-1" for L T-1. */
export function unitsString(dim: ModelDimension, system: UnitSystem): string {
  return system.kind === 'model'
    ? '1'
    : powers([
        ['m', dim.L],
        ['s', dim.T],
      ]);
}

/** The model dimension as a label, e.g. "L2 T-1" (or "1" for a pure number). */
export function modelDimensionLabel(dim: ModelDimension): string {
  return powers([
    ['L', dim.L],
    ['T', dim.T],
  ]);
}

/**
 * Factor from model values to written values: 1 in model units, else metres^a · seconds^b, formed as
 * (positive powers) / (negative powers) so that L T-1 is exactly metres / seconds.
 */
export function unitScale(dim: ModelDimension, system: UnitSystem): number {
  if (system.kind === 'model') return 1;
  const m = system.metresPerLength;
  const s = system.secondsPerTime;
  return (m ** Math.max(dim.L, 0) * s ** Math.max(dim.T, 0)) / (m ** Math.max(-dim.L, 0) * s ** Math.max(-dim.T, 0));
}

/** UDUNITS product syntax: symbols with integer exponents separated by spaces; "1" when empty. */
function powers(terms: [string, number][]): string {
  const parts = terms.filter(([, p]) => p !== 0).map(([s, p]) => (p === 1 ? s : `${s}${p}`));
  return parts.length ? parts.join(' ') : '1';
}
