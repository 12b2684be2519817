import type uPlot from 'uplot';

/** A series of a profile chart: thin grey for the latest sample, bold for the time mean. */
export function profileSeries(label: string, stroke: string, width = 1.5, dash?: number[]): uPlot.Series {
  return {
    label,
    stroke,
    width,
    dash,
    points: { show: false },
    value: (_u, v) => (v == null ? '—' : v.toPrecision(4)),
  };
}

function tickText(t: number | null): string {
  if (t == null) return '';
  if (t === 0) return '0';
  return Math.abs(t) < 1e-3 || Math.abs(t) >= 1e4 ? t.toExponential(1) : String(Number(t.toPrecision(3)));
}

/**
 * Options of a meridional profile chart: y (the data's x column) runs up the left side, north up,
 * from 0 to Ly; the profile's value runs across, its unit on the bottom axis. Read like a sounding:
 * a jet is a bulge to the right at its latitude.
 */
export function profileChartOptions(
  title: string,
  valueLabel: string,
  Ly: number,
  series: uPlot.Series[],
  plugins: uPlot.Plugin[] = [],
): Omit<uPlot.Options, 'width' | 'height'> {
  return {
    title,
    plugins,
    scales: {
      x: { time: false, ori: 1, dir: 1, range: () => [0, Ly] },
      y: { ori: 0, dir: 1 },
    },
    axes: [
      {
        scale: 'x',
        side: 3,
        label: 'y [L], north ↑',
        labelSize: 18,
        size: 44,
        values: (_u, ticks) => ticks.map(tickText),
      },
      { scale: 'y', side: 2, label: valueLabel, labelSize: 18, size: 36, values: (_u, ticks) => ticks.map(tickText) },
    ],
    series: [{ label: 'y', value: (_u, v) => (v == null ? '—' : v.toFixed(3)) }, ...series],
    legend: { live: true },
    cursor: { drag: { x: false, y: false } },
  };
}
