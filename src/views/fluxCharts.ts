import type uPlot from 'uplot';
import type { ModelParams } from '../../lib/model/params';
import type { FluxPayload } from '../../workers/diagnosticsApi';
import type { ChartMark } from '../components/chartMarks';

const COLOURS = {
  energy: '#1f5f9f',
  enstrophy: '#c8641e',
  conversion: '#b12938',
  zero: '#1b1b1b',
  mark: '#444',
  band: 'rgba(31, 95, 159, 0.08)',
} as const;

const tick = (t: number | null) =>
  t == null
    ? ''
    : t === 0
      ? '0'
      : Math.abs(t) < 1e-3 || Math.abs(t) >= 1e4
        ? t.toExponential(1)
        : String(Number(t.toPrecision(3)));
const logTick = (t: number | null) =>
  t == null ? '' : t >= 0.01 && t < 1e4 ? String(Number(t.toPrecision(2))) : t.toExponential(0);

function fluxChart(
  title: string,
  label: string,
  yLabel: string,
  stroke: string,
  plugins: uPlot.Plugin[],
): Omit<uPlot.Options, 'width' | 'height'> {
  return {
    title,
    plugins,
    scales: { x: { time: false, distr: 3, log: 10 }, y: {} },
    axes: [
      { label: 'k [L⁻¹] (shell edges)', labelSize: 18, size: 36, values: (_u, ticks) => ticks.map(logTick) },
      { label: yLabel, labelSize: 18, size: 70, values: (_u, ticks) => ticks.map(tick) },
    ],
    series: [
      { label: 'k', value: (_u, v) => (v == null ? '—' : v.toPrecision(3)) },
      { label, stroke, width: 2, points: { show: false }, value: (_u, v) => (v == null ? '—' : v.toExponential(2)) },
    ],
    legend: { live: true },
    cursor: { drag: { x: true, y: false } },
  };
}

export function fluxChartOptions(plugins: {
  energy: uPlot.Plugin[];
  enstrophy: uPlot.Plugin[];
  conversion: uPlot.Plugin[];
}) {
  return {
    energy: fluxChart(
      'Spectral energy flux Π_E(k)',
      'Π_E (> 0: toward high k)',
      'Π_E [L² T⁻³]',
      COLOURS.energy,
      plugins.energy,
    ),
    enstrophy: fluxChart(
      'Spectral enstrophy flux Π_Z(k)',
      'Π_Z (> 0: toward high k)',
      'Π_Z [T⁻³]',
      COLOURS.enstrophy,
      plugins.enstrophy,
    ),
    conversion: {
      title: 'Eddy-to-mean energy conversion C = ⟨ū · (−∂y u′v′)⟩',
      plugins: plugins.conversion,
      scales: { x: { time: false }, y: {} },
      axes: [
        { label: 't [T]', labelSize: 18, size: 36 },
        { label: 'C [L² T⁻³]', labelSize: 18, size: 70, values: (_u: uPlot, ticks: number[]) => ticks.map(tick) },
      ],
      series: [
        { label: 't', value: (_u: uPlot, v: number | null) => (v == null ? '—' : v.toFixed(2)) },
        {
          label: 'C (> 0: eddies feed the zonal flow)',
          stroke: COLOURS.conversion,
          width: 1.5,
          points: { show: false },
          value: (_u: uPlot, v: number | null) => (v == null ? '—' : v.toExponential(2)),
        },
      ],
      legend: { live: true },
      cursor: { drag: { x: true, y: false } },
    } satisfies Omit<uPlot.Options, 'width' | 'height'>,
  };
}

/** Marks of the flux charts: the zero line and the forcing annulus with k_f. */
export function fluxMarks(p: ModelParams): ChartMark[] {
  const zero: ChartMark = { scale: 'y', value: 0, colour: COLOURS.zero, width: 1 };
  if (p.forcing === 'none') return [zero];
  return [
    { span: [p.kf - p.dkf, p.kf + p.dkf], colour: COLOURS.band },
    { value: p.kf, label: 'k_f', colour: COLOURS.mark },
    zero,
  ];
}

export interface FluxFigure {
  energy: uPlot.AlignedData;
  enstrophy: uPlot.AlignedData;
  conversion: uPlot.AlignedData;
  /** Mean of C over the samples in the flux average, and the latest C. */
  meanConversion: number;
  latestConversion: number;
}

export function fluxFigure(f: FluxPayload): FluxFigure {
  const n = f.conversion.length;
  const recent = f.conversion.subarray(Math.max(0, n - f.count));
  return {
    energy: [f.kEdge, f.PiE],
    enstrophy: [f.kEdge, f.PiZ],
    conversion: [f.conversionT, f.conversion],
    meanConversion: recent.reduce((a, b) => a + b, 0) / Math.max(1, recent.length),
    latestConversion: n ? f.conversion[n - 1] : NaN,
  };
}
