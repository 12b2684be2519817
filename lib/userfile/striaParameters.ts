import type { AttributeValue } from '../io/datasetReader';

/**
 * β, k_d, ε and μ as a Stria-written file records them (docs/file-formats.md: stria_<name> in model
 * units), converted to the file's own units: for a file in physical units, with ℓ = stria_length_unit_m
 * and t = stria_time_unit_s, a quantity of dimension L^a T^b is the model value times ℓ^a t^b.
 */
const DIMS = { beta: [-1, -1], kd: [-1, 0], eps: [2, -3], mu: [0, -1] } as const;

export function striaParameters(
  attributes: Readonly<Record<string, AttributeValue>>,
): Partial<Record<keyof typeof DIMS, { value: number; source: string }>> {
  if (typeof attributes.stria_file_kind !== 'string') return {};
  const physical = attributes.stria_units === 'physical';
  const l = typeof attributes.stria_length_unit_m === 'number' ? attributes.stria_length_unit_m : 1;
  const t = typeof attributes.stria_time_unit_s === 'number' ? attributes.stria_time_unit_s : 1;
  const out: Partial<Record<keyof typeof DIMS, { value: number; source: string }>> = {};
  for (const [k, [a, b]] of Object.entries(DIMS) as [keyof typeof DIMS, readonly [number, number]][]) {
    const v = attributes[`stria_${k}`];
    if (typeof v !== 'number') continue;
    out[k] = {
      value: physical ? v * Math.pow(l, a) * Math.pow(t, b) : v,
      source: `the file's stria_${k} attribute (a Stria run)`,
    };
  }
  return out;
}
