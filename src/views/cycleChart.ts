import type uPlot from 'uplot';
import type { LayerPayload } from '../../workers/layerPayload';
import { SERIES_COLOURS } from './budgetChartOptions';

/** Colours of the cycle's flows, shared by the drawing and the chart. */
export const CYCLE_COLOURS = {
  generation: '#b12938',
  conversion: '#8a5a14',
  transfer: '#1f5f9f',
  injection: SERIES_COLOURS.injection,
  drag: SERIES_COLOURS.drag,
  hyper: SERIES_COLOURS.hyper,
  largeScale: SERIES_COLOURS.largeScale,
} as const;

function line(label: string, stroke: string, dash?: number[]): uPlot.Series {
  return {
    label,
    stroke,
    width: 1.5,
    dash,
    points: { show: false },
    value: (_u, v) => (v == null ? '—' : v.toPrecision(4)),
  };
}

/** The cycle's flows over time: G, C, T and the total drag and hyperviscous losses. */
export const CYCLE_CHART: Omit<uPlot.Options, 'width' | 'height'> = {
  title: 'The energy cycle over time',
  scales: { x: { time: false } },
  axes: [
    { label: 't [T]', labelSize: 18, size: 36 },
    { label: 'rate [L² T⁻³]', labelSize: 18, size: 64 },
  ],
  series: [
    { label: 't', value: (_u, v) => (v == null ? '—' : v.toFixed(2)) },
    line('generation G', CYCLE_COLOURS.generation),
    line('conversion C', CYCLE_COLOURS.conversion),
    line('barotropic transfer T', CYCLE_COLOURS.transfer),
    line('drag (both modes)', CYCLE_COLOURS.drag, [6, 3]),
    line('hyperviscosity (all)', CYCLE_COLOURS.hyper, [2, 3]),
  ],
  legend: { live: true },
  cursor: { drag: { x: false, y: false } },
};

export function cycleChartData(p: LayerPayload): uPlot.AlignedData {
  const s = p.series.terms;
  const n = p.series.time.length;
  const sum = (...cols: Float64Array[]) =>
    Float64Array.from({ length: n }, (_, i) => cols.reduce((a, c) => a + c[i], 0));
  return [
    p.series.time,
    s.generation,
    s.conversion,
    s.barotropicTransfer,
    sum(s.dragBarotropic, s.dragBaroclinic),
    sum(s.hyperPotential, s.hyperBaroclinic, s.hyperBarotropic),
  ];
}
