import type uPlot from 'uplot';
import { fitPowerLaw, inverseCascadeSpectrum, zonalSpectrum, type PowerLawFit } from '../../lib/analysis/powerLawFit';
import { rhinesWavenumber, transitionalWavenumber } from '../../lib/analysis/scales';
import type { ModelParams } from '../../lib/model/params';
import type { SpectraPayload } from '../../workers/diagnosticsApi';
import type { ChartMark } from '../components/chartMarks';

export const SPECTRA_COLOURS = {
  total: '#1b1b1b',
  zonal: '#b12938',
  residual: '#1f5f9f',
  reference: '#777',
  fit: '#c8641e',
  mark: '#444',
  band: 'rgba(31, 95, 159, 0.08)',
} as const;

/** Shell sum → density: E(k_s)/dk, the form the reference spectra are written in; zero (empty shell) as a gap. */
const density = (E: Float64Array, dk: number) => Array.from(E, (e) => (e > 0 ? e / dk : null));

export interface SpectraFigure {
  data: uPlot.AlignedData;
  marks: ChartMark[];
  fit: PowerLawFit | null;
  fitError: string | null;
}

/** The wavenumbers marked on the spectra: k_f (with its annulus), k_β from ε, k_R from the measured U_rms. */
export function spectraMarks(p: ModelParams, Urms: number): ChartMark[] {
  const marks: ChartMark[] = [];
  if (p.forcing !== 'none')
    marks.push(
      { span: [p.kf - p.dkf, p.kf + p.dkf], colour: SPECTRA_COLOURS.band },
      { value: p.kf, label: 'k_f', colour: SPECTRA_COLOURS.mark },
    );
  if (p.beta > 0 && p.eps > 0)
    marks.push({
      value: transitionalWavenumber(p.beta, p.eps),
      label: 'k_β',
      colour: SPECTRA_COLOURS.mark,
      dash: [4, 3],
    });
  if (p.beta > 0 && Urms > 0)
    marks.push({ value: rhinesWavenumber(p.beta, Urms), label: 'k_R', colour: SPECTRA_COLOURS.mark, dash: [2, 3] });
  return marks;
}

/**
 * Columns of the spectra chart: E, E_zonal, E_residual as densities, then the reference lines —
 * C_K ε^{2/3} k^{−5/3} below k_f, a k^{−3} line through the measured E at the first complete shell
 * past the annulus, C_Z β² k^{−5} below k_f — and the power law fitted over [kLo, kHi].
 */
export function spectraFigure(
  s: SpectraPayload,
  p: ModelParams,
  band: [number, number],
  Urms: number,
  fitOf: 'E' | 'EZonal' = 'E',
): SpectraFigure {
  const k = Array.from(s.k);
  const E = density(s.E, s.dk);
  const below = (x: number) => x <= p.kf;
  const inverse = k.map((x) => (p.eps > 0 && below(x) ? inverseCascadeSpectrum(x, p.eps) : null));
  const zonal = k.map((x) => (p.beta > 0 && below(x) ? zonalSpectrum(x, p.beta) : null));
  const top = s.k[Math.max(0, s.completeShells - 1)];
  const i0 = k.findIndex((x, i) => x > p.kf + p.dkf && i < s.completeShells && (E[i] ?? 0) > 0);
  const forward = k.map((x) =>
    i0 >= 0 && x >= k[i0] && x <= top ? (E[i0] as number) * Math.pow(x / k[i0], -3) : null,
  );
  let fit: PowerLawFit | null = null;
  let fitError: string | null = null;
  try {
    fit = fitPowerLaw(
      s.k,
      s[fitOf].map((e) => e / s.dk),
      band[0],
      band[1],
    );
  } catch (e) {
    fitError = e instanceof Error ? e.message.replace(/^fitPowerLaw: /, '') : String(e);
  }
  const fitted = k.map((x) => (fit && x >= band[0] && x <= band[1] ? fit.prefactor * Math.pow(x, fit.slope) : null));
  return {
    data: [
      k,
      E,
      density(s.EZonal, s.dk),
      density(s.EResidual, s.dk),
      inverse,
      forward,
      zonal,
      fitted,
    ] as uPlot.AlignedData,
    marks: spectraMarks(p, Urms),
    fit,
    fitError,
  };
}

function series(label: string, stroke: string, width: number, dash?: number[]): uPlot.Series {
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

const logTick = (t: number | null) =>
  t == null ? '' : t >= 0.01 && t < 1e4 ? String(Number(t.toPrecision(2))) : t.toExponential(0);

/**
 * Options of the log-log spectra chart (series in the order of `spectraFigure`'s columns). `compact`
 * (a small chart beside another): no legend and no k⁻³ line; the caller says in words what is what.
 */
export function spectraChartOptions(plugins: uPlot.Plugin[], compact = false): Omit<uPlot.Options, 'width' | 'height'> {
  const c = SPECTRA_COLOURS;
  const forward = series('k⁻³ through E past k_f', c.reference, 1, [2, 3]);
  return {
    title: compact ? 'Energy spectrum E(k)' : 'Energy spectrum E(k) (density: shell energy / dk)',
    legend: { show: !compact, live: true },
    plugins,
    scales: { x: { time: false, distr: 3, log: 10 }, y: { distr: 3, log: 10 } },
    axes: [
      { label: 'k [L⁻¹]', labelSize: 18, size: 36, values: (_u, ticks) => ticks.map(logTick) },
      { label: 'E(k) [L³ T⁻²]', labelSize: 18, size: 64, values: (_u, ticks) => ticks.map(logTick) },
    ],
    series: [
      { label: 'k', value: (_u, v) => (v == null ? '—' : v.toPrecision(3)) },
      series('E total', c.total, 2),
      series('E zonal (kx = 0)', c.zonal, 1.5),
      series('E residual', c.residual, 1.5),
      series('C_K ε²ᐟ³ k⁻⁵ᐟ³', c.reference, 1, [6, 4]),
      compact ? { ...forward, show: false } : forward,
      series('C_Z β² k⁻⁵', c.zonal, 1, [6, 4]),
      series('fit', c.fit, 2.5),
    ],
    cursor: { drag: { x: true, y: false, setScale: false } },
  };
}
