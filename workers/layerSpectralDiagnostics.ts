import { LayerSpectraPlan, type LayerSpectra } from '../lib/analysis/layerSpectra';
import type { ModelParams } from '../lib/model/params';
import { RecentMean } from './recentMean';

/**
 * Two layers: the barotropic and baroclinic spectra and fluxes of the samples taken while the Spectra
 * or Flux view is shown (lib/analysis/layerSpectra.ts), averaged over the last `average` of them as the
 * one-layer spectra are. Model units; shell sums (the views divide by dk for densities); fluxes
 * through the outer shell edges, positive toward high k. The plan is built on first use and let go
 * when no view asks (`release`).
 */
export interface LayerSpectraPayload {
  k: Float64Array;
  kEdge: Float64Array;
  dk: number;
  /** Shells below this hold only kept modes. */
  completeShells: number;
  kineticBarotropic: Float64Array;
  kineticBaroclinic: Float64Array;
  potential: Float64Array;
  /** The exchange X(k): what the baroclinic mode gives the barotropic at each shell (> 0: to the barotropic). */
  exchange: Float64Array;
  flux: Float64Array;
  fluxBarotropic: Float64Array;
  fluxBaroclinic: Float64Array;
  /** Σ X over the shells, averaged as the rest. */
  netExchange: number;
  count: number;
  tStart: number;
  tEnd: number;
}

const SERIES = [
  'kineticBarotropic',
  'kineticBaroclinic',
  'potential',
  'exchange',
  'flux',
  'fluxBarotropic',
  'fluxBaroclinic',
] as const;
type Series = (typeof SERIES)[number];

export class LayerSpectralDiagnostics {
  private plan: LayerSpectraPlan | null = null;
  private out: LayerSpectra | null = null;
  private means: Record<Series, RecentMean> | null = null;
  private net: RecentMean | null = null;
  private readonly one = new Float64Array(1);

  constructor(
    private params: ModelParams,
    private average: number,
  ) {}

  get count(): number {
    return this.net?.count ?? 0;
  }

  /** New parameters of the same run (k_d, the shear, …): the plan and the means start again. */
  retune(params: ModelParams): void {
    this.params = params;
    this.plan = this.out = null;
    this.means = this.net = null;
  }

  /**
   * Let the plan go once no view asks (it holds transforms and work arrays of both layers, about 27
   * times the two-layer state); the next view that asks builds it again and starts a new average.
   */
  release(): void {
    this.plan = this.out = null;
    this.means = this.net = null;
  }

  setAverage(n: number): void {
    this.average = n;
    this.means = this.net = null;
  }

  /** Add the two-layer state q̂₁ then q̂₂ of time t. */
  add(qHat: Float64Array, t: number): void {
    const plan = (this.plan ??= new LayerSpectraPlan(this.params));
    const s = plan.compute(qHat, (this.out ??= plan.createOutput()));
    const n = s.k.length;
    const m = (this.means ??= Object.fromEntries(SERIES.map((k) => [k, new RecentMean(n, this.average)])) as Record<
      Series,
      RecentMean
    >);
    for (const k of SERIES) m[k].add(t, s[k]);
    this.one[0] = s.netExchange;
    (this.net ??= new RecentMean(1, this.average)).add(t, this.one);
  }

  payload(): { payload: LayerSpectraPayload; buffers: ArrayBuffer[] } | null {
    const { plan, out, means, net } = this;
    if (!plan || !out || !means || !net || net.count === 0) return null;
    const payload: LayerSpectraPayload = {
      k: out.k.slice(),
      kEdge: out.kEdge.slice(),
      dk: plan.shells.dk,
      completeShells: plan.shells.completeShells,
      kineticBarotropic: means.kineticBarotropic.mean(),
      kineticBaroclinic: means.kineticBaroclinic.mean(),
      potential: means.potential.mean(),
      exchange: means.exchange.mean(),
      flux: means.flux.mean(),
      fluxBarotropic: means.fluxBarotropic.mean(),
      fluxBaroclinic: means.fluxBaroclinic.mean(),
      netExchange: net.mean()[0],
      count: net.count,
      ...net.span,
    };
    const buffers = [payload.k, payload.kEdge, ...SERIES.map((k) => payload[k])].map((a) => a.buffer as ArrayBuffer);
    return { payload, buffers };
  }
}
