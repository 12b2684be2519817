import type uPlot from 'uplot';
import type { LayerSpectraPayload } from '../../workers/layerSpectralDiagnostics';

/** Which part of a two-layer run's spectra a view shows. */
export type LayerMode = 'barotropic' | 'baroclinic';
/** …and of its fluxes: the modes' own, or the exchange between them. */
export type LayerFluxMode = LayerMode | 'exchange';

const COLOURS = { barotropic: '#1b1b1b', baroclinic: '#b12938', potential: '#1f5f9f', total: '#777' } as const;

const logTick = (t: number | null) =>
  t == null ? '' : t >= 0.01 && t < 1e4 ? String(Number(t.toPrecision(2))) : t.toExponential(0);
const tick = (t: number | null) =>
  t == null
    ? ''
    : t === 0
      ? '0'
      : Math.abs(t) < 1e-3 || Math.abs(t) >= 1e4
        ? t.toExponential(1)
        : String(Number(t.toPrecision(3)));

function line(label: string, stroke: string, width: number, dash?: number[]): uPlot.Series {
  return {
    label,
    stroke,
    width,
    dash,
    points: { show: false },
    spanGaps: false,
    value: (_u, v) => (v == null ? '—' : v.toExponential(2)),
  };
}

/** Shell sum → density over dk; an empty shell (zero) as a gap on the log axis. */
const density = (a: Float64Array, dk: number) => Array.from(a, (e) => (e > 0 ? e / dk : null));

/** The spectra chart: barotropic kinetic energy, or the baroclinic kinetic and available potential energy. */
export function layerSpectraChart(mode: LayerMode): Omit<uPlot.Options, 'width' | 'height'> {
  return {
    title:
      mode === 'barotropic'
        ? 'Barotropic kinetic energy spectrum'
        : 'Baroclinic kinetic and available potential energy',
    legend: { live: true },
    scales: { x: { time: false, distr: 3, log: 10 }, y: { distr: 3, log: 10 } },
    axes: [
      { label: 'k [L⁻¹]', labelSize: 18, size: 36, values: (_u, ticks) => ticks.map(logTick) },
      { label: 'energy density [L³ T⁻²]', labelSize: 18, size: 64, values: (_u, ticks) => ticks.map(logTick) },
    ],
    series: [
      { label: 'k', value: (_u, v) => (v == null ? '—' : v.toPrecision(3)) },
      ...(mode === 'barotropic'
        ? [line('KE barotropic', COLOURS.barotropic, 2)]
        : [line('KE baroclinic', COLOURS.baroclinic, 2), line('APE', COLOURS.potential, 1.5, [6, 4])]),
    ],
  };
}

export function layerSpectraData(s: LayerSpectraPayload, mode: LayerMode): uPlot.AlignedData {
  const k = Array.from(s.k);
  return (
    mode === 'barotropic'
      ? [k, density(s.kineticBarotropic, s.dk)]
      : [k, density(s.kineticBaroclinic, s.dk), density(s.potential, s.dk)]
  ) as uPlot.AlignedData;
}

/** The flux chart: Π_bt or Π_bc beside the total Π, or the exchange X(k) per shell. */
export function layerFluxChart(mode: LayerFluxMode): Omit<uPlot.Options, 'width' | 'height'> {
  const exchange = mode === 'exchange';
  return {
    title: exchange
      ? 'Exchange between the modes X(k): baroclinic → barotropic per shell'
      : `Spectral energy flux of the ${mode} mode`,
    legend: { live: true },
    scales: { x: { time: false, distr: 3, log: 10 }, y: {} },
    axes: [
      {
        label: exchange ? 'k [L⁻¹] (shells)' : 'k [L⁻¹] (shell edges)',
        labelSize: 18,
        size: 36,
        values: (_u, ticks) => ticks.map(logTick),
      },
      {
        label: exchange ? 'X [L² T⁻³]' : 'Π [L² T⁻³]',
        labelSize: 18,
        size: 70,
        values: (_u, ticks) => ticks.map(tick),
      },
    ],
    series: [
      { label: 'k', value: (_u, v) => (v == null ? '—' : v.toPrecision(3)) },
      ...(exchange
        ? [line('X (> 0: to the barotropic mode)', COLOURS.potential, 2)]
        : [line(`Π ${mode} (> 0: toward high k)`, COLOURS[mode], 2), line('Π all energy', COLOURS.total, 1, [6, 4])]),
    ],
  };
}

export function layerFluxData(s: LayerSpectraPayload, mode: LayerFluxMode): uPlot.AlignedData {
  if (mode === 'exchange') return [s.k, s.exchange];
  return [s.kEdge, mode === 'barotropic' ? s.fluxBarotropic : s.fluxBaroclinic, s.flux];
}
