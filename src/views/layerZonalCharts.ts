import type uPlot from 'uplot';
import type { LayerPayload } from '../../workers/layerPayload';
import { profileChartOptions, profileSeries } from './profileChart';

/** Colours of the layers: the upper layer warm, the lower cool; the latest sample thin and paler. */
export const LAYER_COLOURS = {
  upper: '#b12938',
  upperLatest: '#e0a0a6',
  lower: '#1f5f9f',
  lowerLatest: '#9fbcd9',
  heat: '#c8641e',
  heatLatest: '#8c8c8c',
} as const;

export type LayerChartId = 'ubar' | 'pv' | 'heat';

/**
 * The two-layer charts of the Zonal view: ū of each layer, each layer's total PV q̄_i + Q_i y
 * (Q_i the mean PV gradient of the imposed flow, docs/two-layer.md), and the eddy heat (interface)
 * flux (v′τ′)‾, τ = ψ₁ − ψ₂: positive where the eddies carry heat poleward (north) when U₁ > U₂.
 */
export function layerChartOptions(Ly: number): Record<LayerChartId, Omit<uPlot.Options, 'width' | 'height'>> {
  const c = LAYER_COLOURS;
  return {
    ubar: profileChartOptions('ū of each layer', 'ū [L T⁻¹]', Ly, [
      profileSeries('upper, latest', c.upperLatest, 1),
      profileSeries('upper, time mean', c.upper, 2),
      profileSeries('lower, latest', c.lowerLatest, 1),
      profileSeries('lower, time mean', c.lower, 2),
    ]),
    pv: profileChartOptions('Total PV q̄ᵢ + Qᵢy of each layer', 'q̄ᵢ + Qᵢy [T⁻¹]', Ly, [
      profileSeries('upper, latest', c.upperLatest, 1),
      profileSeries('upper, time mean', c.upper, 2),
      profileSeries('lower, latest', c.lowerLatest, 1),
      profileSeries('lower, time mean', c.lower, 2),
    ]),
    heat: profileChartOptions('Eddy heat (interface) flux', '(v′τ′)‾ [L³ T⁻²]', Ly, [
      profileSeries('latest sample', c.heatLatest, 1),
      profileSeries('time mean', c.heat, 2),
    ]),
  };
}

/** Columnar data of the three charts for a payload. */
export function layerChartData(p: LayerPayload): Record<LayerChartId, uPlot.AlignedData> {
  return {
    ubar: [p.y, p.ubar1, p.meanUbar1, p.ubar2, p.meanUbar2],
    pv: [p.y, p.qtot1, p.meanQtot1, p.qtot2, p.meanQtot2],
    heat: [p.y, p.heat, p.meanHeat],
  };
}

/** The domain mean of a profile on equally spaced rows. */
export function profileMean(a: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i];
  return a.length ? s / a.length : NaN;
}
