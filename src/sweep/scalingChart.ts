import type uPlot from 'uplot';
import type { FitReport } from '../../lib/sweep/sweepFits';
import type { TableRow } from '../../lib/sweep/sweepTable';

const C = { points: '#1f5f9f', fit: '#c8641e', fixed: '#555' } as const;

/**
 * Columns of a scaling chart, sorted by x: the runs (x, y) of the fit's columns, the fitted power law
 * A x^b, and the law with the exponent held at 1 with its prefactor's confidence interval (lines
 * A_lo·x and A_hi·x). Rows whose x or y is missing or not positive are left out, as the fit does.
 */
export function scalingData(rows: readonly TableRow[], fit: FitReport): uPlot.AlignedData {
  const pts = rows
    .filter((r) => r.status === 'done')
    .map((r) => [r[fit.x], r[fit.y]] as const)
    .filter(
      (p): p is readonly [number, number] =>
        typeof p[0] === 'number' && typeof p[1] === 'number' && p[0] > 0 && p[1] > 0,
    )
    .sort((a, b) => a[0] - b[0]);
  const x = pts.map((p) => p[0]);
  const law = (A: number | null | undefined, b: number | null) =>
    x.map((xi) => (A != null && b != null ? A * Math.pow(xi, b) : null));
  const ci = fit.prefactor_at_exponent_1_ci;
  return [
    x,
    pts.map((p) => p[1]),
    law(fit.prefactor, fit.exponent),
    law(fit.prefactor_at_exponent_1, 1),
    law(ci?.[0], 1),
    law(ci?.[1], 1),
  ] as uPlot.AlignedData;
}

const tick = (t: number | null) => (t == null ? '' : String(Number(t.toPrecision(3))));
const value = (_u: uPlot, v: number | null) => (v == null ? '—' : v.toPrecision(4));

export function scalingOptions(title: string, xLabel: string, yLabel: string): Omit<uPlot.Options, 'width' | 'height'> {
  const line = (label: string, stroke: string, width: number, dash?: number[]): uPlot.Series => ({
    label,
    stroke,
    width,
    dash,
    points: { show: false },
    value,
  });
  return {
    title,
    scales: { x: { time: false, distr: 3, log: 10 }, y: { distr: 3, log: 10 } },
    axes: [
      { label: xLabel, labelSize: 18, size: 36, values: (_u, t) => t.map(tick) },
      { label: yLabel, labelSize: 18, size: 60, values: (_u, t) => t.map(tick) },
    ],
    series: [
      { label: xLabel, value },
      {
        label: 'runs',
        stroke: C.points,
        fill: C.points,
        width: 0,
        paths: () => null,
        points: { show: true, size: 8, fill: C.points, stroke: C.points },
        value,
      },
      line('fit A x^b', C.fit, 2),
      line('exponent 1: A₁ x', C.fixed, 1),
      line('A₁ interval, low', C.fixed, 1, [4, 3]),
      line('A₁ interval, high', C.fixed, 1, [4, 3]),
    ],
    legend: { live: true },
  };
}
