import type { CycleTerm } from '../../lib/analysis/cycleSeries';

/**
 * The energy cycle of a two-layer run as a drawing's parts (docs/two-layer.md, "The energy cycle"):
 * four reservoirs in a row, the imposed flow's available potential energy (held fixed, the source),
 * the eddies' APE, baroclinic KE and barotropic KE, with the flows between them
 *   generation G: mean-flow APE → eddy APE,  conversion C: eddy APE → baroclinic KE,
 *   barotropic transfer T: baroclinic KE → barotropic KE,  forcing injection → barotropic KE,
 * and each eddy reservoir's losses (drag, hyperviscosity, large-scale drag), positive when they
 * take energy out. Each reservoir's rate of change follows from them:
 *   dAPE/dt = G − C − hyper − largeScale,  dKE_bc/dt = C − T − drag − hyper − largeScale + residual,
 *   dKE_bt/dt = T − drag − hyper − largeScale + injection,
 * `residual` being the nonlinear remainder of the whole budget (zero to round-off). Model units:
 * energies L² T⁻², rates L² T⁻³. Pure: the view draws what this returns.
 */
export type ReservoirId = 'mean' | 'ape' | 'kebc' | 'kebt';
export type SinkKind = 'drag' | 'hyper' | 'largeScale';

export interface Reservoir {
  id: ReservoirId;
  name: string;
  symbol: string;
  /** Energy (null for the imposed flow's reservoir, which the model holds fixed). */
  energy: number | null;
  /** Share of the eddy energy (0–1), null for the imposed flow. */
  share: number | null;
  /** Rate of change from the flows and losses, null for the imposed flow. */
  rate: number | null;
  x: number;
}

export interface Flow {
  id: 'generation' | 'conversion' | 'transfer' | 'injection';
  name: string;
  value: number;
  from: ReservoirId | 'forcing';
  to: ReservoirId;
  /** Arrow thickness (px): proportional to |value| against the largest flow or loss. */
  width: number;
}

export interface Sink {
  from: ReservoirId;
  kind: SinkKind;
  name: string;
  value: number;
  width: number;
  x: number;
}

export interface CycleLayout {
  reservoirs: Reservoir[];
  flows: Flow[];
  sinks: Sink[];
  /** Largest |value| of a flow or loss: the arrows' scale. */
  scale: number;
}

/** The drawing's frame (SVG user units) and the reservoirs' boxes. */
export const FRAME = { width: 900, height: 400, boxTop: 70, boxHeight: 120, boxWidth: 150 } as const;
const BOX_X: Record<ReservoirId, number> = { mean: 20, ape: 255, kebc: 490, kebt: 725 };
export const MIN_WIDTH = 1.5;
export const MAX_WIDTH = 26;

const SINK_NAMES: Record<SinkKind, string> = { drag: 'drag', hyper: 'hyperviscosity', largeScale: 'large-scale drag' };

export function cycleLayout(t: Readonly<Record<CycleTerm, number>>): CycleLayout {
  const losses: Record<Exclude<ReservoirId, 'mean'>, Record<SinkKind, number>> = {
    ape: { drag: 0, hyper: t.hyperPotential, largeScale: t.largeScalePotential },
    kebc: { drag: t.dragBaroclinic, hyper: t.hyperBaroclinic, largeScale: t.largeScaleBaroclinic },
    kebt: { drag: t.dragBarotropic, hyper: t.hyperBarotropic, largeScale: t.largeScaleBarotropic },
  };
  const total = (r: keyof typeof losses) => losses[r].drag + losses[r].hyper + losses[r].largeScale;
  const rates = {
    ape: t.generation - t.conversion - total('ape'),
    kebc: t.conversion - t.barotropicTransfer - total('kebc') + t.transfer,
    kebt: t.barotropicTransfer - total('kebt') + t.injection,
  };
  const eddy = t.potential + t.kineticBaroclinic + t.kineticBarotropic;
  const share = (e: number) => (eddy > 0 ? e / eddy : 0);
  const reservoirs: Reservoir[] = [
    {
      id: 'mean',
      name: 'imposed shear',
      symbol: 'mean-flow APE',
      energy: null,
      share: null,
      rate: null,
      x: BOX_X.mean,
    },
    {
      id: 'ape',
      name: 'eddy APE',
      symbol: 'APE',
      energy: t.potential,
      share: share(t.potential),
      rate: rates.ape,
      x: BOX_X.ape,
    },
    {
      id: 'kebc',
      name: 'baroclinic KE',
      symbol: 'KE_bc',
      energy: t.kineticBaroclinic,
      share: share(t.kineticBaroclinic),
      rate: rates.kebc,
      x: BOX_X.kebc,
    },
    {
      id: 'kebt',
      name: 'barotropic KE',
      symbol: 'KE_bt',
      energy: t.kineticBarotropic,
      share: share(t.kineticBarotropic),
      rate: rates.kebt,
      x: BOX_X.kebt,
    },
  ];
  const rawFlows: Omit<Flow, 'width'>[] = [
    { id: 'generation', name: 'generation G', value: t.generation, from: 'mean', to: 'ape' },
    { id: 'conversion', name: 'conversion C', value: t.conversion, from: 'ape', to: 'kebc' },
    { id: 'transfer', name: 'barotropic transfer T', value: t.barotropicTransfer, from: 'kebc', to: 'kebt' },
  ];
  if (t.injection !== 0)
    rawFlows.push({ id: 'injection', name: 'forcing', value: t.injection, from: 'forcing', to: 'kebt' });
  const rawSinks: Omit<Sink, 'width' | 'x'>[] = [];
  for (const r of ['ape', 'kebc', 'kebt'] as const)
    for (const kind of ['drag', 'hyper', 'largeScale'] as const)
      if (losses[r][kind] !== 0 || (kind !== 'largeScale' && !(r === 'ape' && kind === 'drag')))
        rawSinks.push({ from: r, kind, name: SINK_NAMES[kind], value: losses[r][kind] });
  const finite = (x: number) => (Number.isFinite(x) ? Math.abs(x) : 0);
  const scale = Math.max(...rawFlows.map((f) => finite(f.value)), ...rawSinks.map((s) => finite(s.value)), 0);
  const width = (v: number) => (scale > 0 ? MIN_WIDTH + ((MAX_WIDTH - MIN_WIDTH) * finite(v)) / scale : MIN_WIDTH);
  const flows = rawFlows.map((f) => ({ ...f, width: width(f.value) }));
  const sinks: Sink[] = [];
  for (const r of ['ape', 'kebc', 'kebt'] as const) {
    const own = rawSinks.filter((s) => s.from === r);
    own.forEach((s, i) =>
      sinks.push({
        ...s,
        width: width(s.value),
        x: BOX_X[r] + ((i + 1) * FRAME.boxWidth) / (own.length + 1),
      }),
    );
  }
  return { reservoirs, flows, sinks, scale };
}

/** A number as the drawing prints it: three significant figures, exponents for the very small or large. */
export function cycleNumber(x: number | null): string {
  if (x === null || !Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a < 1e-3 || a >= 1e4 ? x.toExponential(2) : x.toPrecision(3);
}

/**
 * The outline of an arrow from (x0, y0) to (x1, y1) as SVG polygon points: a band of thickness w
 * and a head a little wider, its tip at (x1, y1).
 */
export function arrowPolygon(x0: number, y0: number, x1: number, y1: number, w: number): string {
  const len = Math.hypot(x1 - x0, y1 - y0);
  if (!(len > 0)) return '';
  const ux = (x1 - x0) / len;
  const uy = (y1 - y0) / len;
  // The normal, and the head: as long as it is wide, never longer than half the arrow.
  const nx = -uy;
  const ny = ux;
  const head = Math.min(w / 2 + 6, len / 2);
  const half = w / 2;
  const wing = half + 5;
  const bx = x1 - ux * head;
  const by = y1 - uy * head;
  const pts: [number, number][] = [
    [x0 + nx * half, y0 + ny * half],
    [bx + nx * half, by + ny * half],
    [bx + nx * wing, by + ny * wing],
    [x1, y1],
    [bx - nx * wing, by - ny * wing],
    [bx - nx * half, by - ny * half],
    [x0 - nx * half, y0 - ny * half],
  ];
  return pts.map(([x, y]) => `${x.toFixed(1)},${y.toFixed(1)}`).join(' ');
}
