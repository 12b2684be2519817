import type { FieldName } from '../../lib/model/fields';

/** A field the Field view can show, with its symbol and unit in model units (L length, T time). */
export interface FieldKind {
  name: FieldName;
  symbol: string;
  title: string;
  unit: string;
}

export const FIELD_KINDS: readonly FieldKind[] = [
  { name: 'zeta', symbol: 'ζ', title: 'relative vorticity ∇²ψ', unit: 'T⁻¹' },
  { name: 'q', symbol: 'q', title: 'PV anomaly ∇²ψ − k_d²ψ (without βy)', unit: 'T⁻¹' },
  { name: 'psi', symbol: 'ψ', title: 'streamfunction', unit: 'L²T⁻¹' },
  { name: 'u', symbol: 'u', title: 'zonal velocity −∂ψ/∂y', unit: 'LT⁻¹' },
  { name: 'v', symbol: 'v', title: 'meridional velocity ∂ψ/∂x', unit: 'LT⁻¹' },
];

export function fieldKind(name: FieldName): FieldKind {
  return FIELD_KINDS.find((k) => k.name === name) ?? FIELD_KINDS[0];
}
