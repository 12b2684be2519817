import type { FieldName } from '../../lib/model/fields';
import type { LayerView } from '../../lib/model/layerFields';

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

/** A view of a two-layer state the Field view can show (lib/model/layerFields.ts). */
export interface LayerViewKind {
  name: LayerView;
  label: string;
  title: string;
}

export const LAYER_VIEW_KINDS: readonly LayerViewKind[] = [
  { name: 'upper', label: 'upper', title: 'upper layer (1)' },
  { name: 'lower', label: 'lower', title: 'lower layer (2)' },
  { name: 'barotropic', label: 'barotropic', title: 'barotropic flow h₁f₁ + h₂f₂' },
  {
    name: 'baroclinic',
    label: 'baroclinic',
    title: 'baroclinic (interface) flow f₁ − f₂; ψ₁ − ψ₂ is the interface temperature',
  },
];

export function layerViewKind(name: LayerView): LayerViewKind {
  return LAYER_VIEW_KINDS.find((k) => k.name === name) ?? LAYER_VIEW_KINDS[2];
}
