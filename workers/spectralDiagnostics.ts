import type { SnapshotPlan } from '../lib/analysis/snapshot';
import { SpectraPlan, type Spectra } from '../lib/analysis/spectra';
import { SpectralFluxPlan, type SpectralFlux } from '../lib/analysis/spectralFlux';
import type { FluxPayload, SpectraPayload } from './diagnosticsApi';
import { BlockMean, RecentMean } from './recentMean';

/** Flux samples kept for the eddy-to-mean conversion series. */
export const CONVERSION_SAMPLES = 1024;

/**
 * Spectra and spectral fluxes of the samples taken while their views are shown, averaged over the
 * last `average` of them (a single snapshot's shells scatter like χ² with few degrees of freedom at
 * small k). Plans are built on first use: a run that never shows them pays nothing.
 */
export class SpectralDiagnostics {
  private spectraPlan: SpectraPlan | null = null;
  private spectra: Spectra | null = null;
  private means: { E: RecentMean; EZonal: RecentMean; EResidual: RecentMean } | null = null;
  private mean2d: BlockMean | null = null;
  private fluxPlan: SpectralFluxPlan | null = null;
  private flux: SpectralFlux | null = null;
  private fluxMeans: { PiE: RecentMean; PiZ: RecentMean } | null = null;
  private readonly convT = new Float64Array(CONVERSION_SAMPLES);
  private readonly convC = new Float64Array(CONVERSION_SAMPLES);
  private convCount = 0;

  constructor(
    private snap: SnapshotPlan,
    private average: number,
  ) {}

  /**
   * A new snapshot plan (new parameters that change the spectra, k_d): the plans and the recent means
   * start again; the eddy-to-mean conversion series goes on (it is a time series of the run).
   */
  retune(snap: SnapshotPlan): void {
    this.snap = snap;
    this.spectraPlan = this.fluxPlan = null;
    this.spectra = this.flux = null;
    this.means = this.mean2d = this.fluxMeans = null;
  }

  get spectraCount(): number {
    return this.means?.E.count ?? 0;
  }

  get fluxCount(): number {
    return this.fluxMeans?.PiE.count ?? 0;
  }

  /** Average over this many samples from now on (what was gathered is dropped). */
  setAverage(n: number): void {
    this.average = n;
    this.means = null;
    this.mean2d = null;
    this.fluxMeans = null;
  }

  addSpectra(qHat: Float64Array, t: number, with2d: boolean): void {
    const plan = (this.spectraPlan ??= SpectraPlan.forSnapshots(this.snap));
    const s = plan.compute(qHat, (this.spectra ??= plan.createOutput()));
    const n = plan.nShells;
    const m = (this.means ??= {
      E: new RecentMean(n, this.average),
      EZonal: new RecentMean(n, this.average),
      EResidual: new RecentMean(n, this.average),
    });
    m.E.add(t, s.E);
    m.EZonal.add(t, s.EZonal);
    m.EResidual.add(t, s.EResidual);
    if (with2d) (this.mean2d ??= new BlockMean(s.E2d.length, this.average)).add(s.E2d);
  }

  addFlux(qHat: Float64Array, t: number): void {
    const plan = (this.fluxPlan ??= new SpectralFluxPlan(
      this.snap,
      (this.spectraPlan ??= SpectraPlan.forSnapshots(this.snap)),
    ));
    const f = plan.compute(qHat, (this.flux ??= plan.createOutput()));
    const n = f.PiE.length;
    const m = (this.fluxMeans ??= { PiE: new RecentMean(n, this.average), PiZ: new RecentMean(n, this.average) });
    m.PiE.add(t, f.PiE);
    m.PiZ.add(t, f.PiZ);
    if (this.convCount === CONVERSION_SAMPLES) {
      // Full: keep the newer half, so the series always reaches back over the last few hundred samples.
      this.convT.copyWithin(0, CONVERSION_SAMPLES / 2);
      this.convC.copyWithin(0, CONVERSION_SAMPLES / 2);
      this.convCount = CONVERSION_SAMPLES / 2;
    }
    this.convT[this.convCount] = t;
    this.convC[this.convCount++] = f.zonalEnergyTransfer;
  }

  spectraPayload(with2d: boolean): { payload: SpectraPayload; buffers: ArrayBuffer[] } | null {
    const plan = this.spectraPlan;
    const m = this.means;
    const s = this.spectra;
    if (!plan || !m || !s || m.E.count === 0) return null;
    const E2d = with2d && this.mean2d ? this.mean2d.mean() : null;
    const payload: SpectraPayload = {
      k: s.k.slice(),
      E: m.E.mean(),
      EZonal: m.EZonal.mean(),
      EResidual: m.EResidual.mean(),
      dk: plan.dk,
      completeShells: plan.completeShells,
      count: m.E.count,
      ...m.E.span,
      count2d: E2d && this.mean2d ? this.mean2d.blockCount : 0,
      kx2d: E2d ? s.kx2d.slice() : null,
      ky2d: E2d ? s.ky2d.slice() : null,
      E2d,
    };
    const arrays = [payload.k, payload.E, payload.EZonal, payload.EResidual, payload.kx2d, payload.ky2d, payload.E2d];
    return {
      payload,
      buffers: arrays.filter((a): a is Float64Array => a !== null).map((a) => a.buffer as ArrayBuffer),
    };
  }

  fluxPayload(): { payload: FluxPayload; buffers: ArrayBuffer[] } | null {
    const m = this.fluxMeans;
    const f = this.flux;
    if (!m || !f || m.PiE.count === 0) return null;
    const payload: FluxPayload = {
      kEdge: f.kEdge.slice(),
      PiE: m.PiE.mean(),
      PiZ: m.PiZ.mean(),
      count: m.PiE.count,
      ...m.PiE.span,
      conversionT: this.convT.slice(0, this.convCount),
      conversion: this.convC.slice(0, this.convCount),
    };
    const arrays = [payload.kEdge, payload.PiE, payload.PiZ, payload.conversionT, payload.conversion];
    return { payload, buffers: arrays.map((a) => a.buffer as ArrayBuffer) };
  }
}
