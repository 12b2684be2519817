import type uPlot from 'uplot';

/** Series colours of Stria's charts: distinct in hue and lightness, none relying on red against green. */
export const SERIES_COLOURS = {
  ink: '#1b1b1b',
  injection: '#1f5f9f',
  drag: '#c8641e',
  hyper: '#2a8a6a',
  largeScale: '#7a4fa0',
} as const;

const timeAxis: uPlot.Axis = { label: 't [T]', labelSize: 18, size: 36 };

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

/** A y tick label; log axes hand over null for the ticks they leave unlabelled. */
function axisValue(t: number | null): string {
  if (t == null) return '';
  if (t === 0) return '0';
  return Math.abs(t) < 1e-3 || Math.abs(t) >= 1e4 ? t.toExponential(0) : String(Number(t.toPrecision(3)));
}

function valueAxis(label: string, distr?: uPlot.Scale.Distr): { axis: uPlot.Axis; scale: uPlot.Scale } {
  return {
    axis: { label, labelSize: 18, size: 70, values: (_u, ticks) => ticks.map(axisValue) },
    scale: distr === 3 ? { distr: 3, log: 10 } : {},
  };
}

/** Options of a chart of time series sharing one y axis. */
function chart(
  title: string,
  yLabel: string,
  series: uPlot.Series[],
  distr?: uPlot.Scale.Distr,
): Omit<uPlot.Options, 'width' | 'height'> {
  const y = valueAxis(yLabel, distr);
  return {
    title,
    scales: { x: { time: false }, y: y.scale },
    axes: [timeAxis, y.axis],
    series: [{ label: 't', value: (_u, v) => (v == null ? '—' : v.toFixed(2)) }, ...series],
    legend: { live: true },
    cursor: { drag: { x: true, y: false } },
  };
}

/** The rate terms of a budget, as losses (positive) beside the injection and the tendency. */
function rateSeries(symbol: string): uPlot.Series[] {
  return [
    line('injection', SERIES_COLOURS.injection),
    line('drag loss', SERIES_COLOURS.drag),
    line('hyperviscous loss', SERIES_COLOURS.hyper),
    line('large-scale-drag loss', SERIES_COLOURS.largeScale),
    line(`tendency d${symbol}/dt`, SERIES_COLOURS.ink, [4, 3]),
  ];
}

export const BUDGET_CHART_OPTIONS = {
  energy: chart('Energy', 'E, KE [L²T⁻²]', [
    line('energy E', SERIES_COLOURS.ink),
    line('kinetic KE', SERIES_COLOURS.injection, [4, 3]),
  ]),
  energyRates: chart('Energy budget', 'rate [L²T⁻³]', rateSeries('E')),
  enstrophyRates: chart('Enstrophy budget', 'rate [T⁻³]', rateSeries('Z')),
  residual: chart(
    'Residual (nonlinear transfer) over the largest term',
    '|residual| / largest term',
    [line('energy', SERIES_COLOURS.injection), line('enstrophy', SERIES_COLOURS.drag)],
    3,
  ),
};
