import type { AllocationMeter } from '../io/allocationMeter';
import { allFinite } from './derivedFields';
import type { UserSpectralPlan } from './spectral';

/**
 * Time means of spectra and spectral fluxes over records, for a doubly periodic 2^k grid. Rule: a
 * record enters only when the field holds no missing value (a masked point has no Fourier
 * representation; filling it would invent data). With q: energy and enstrophy spectra of q
 * (spectra.ts) and the spectral flux (spectralFlux.ts); with u and v only: the kinetic-energy spectrum.
 */
export interface SpectraMean {
  kind: 'pv' | 'kinetic';
  /** Shell centres and outer edges (1/length). */
  k: number[];
  kEdge: number[];
  E: number[];
  EZonal: number[] | null;
  EResidual: number[] | null;
  Z: number[] | null;
  /** Energy and enstrophy fluxes through kEdge (positive toward high k); null without q. */
  PiE: number[] | null;
  PiZ: number[] | null;
  /** Mean eddy-to-zonal energy transfer and the kept fraction of energy under the 2/3 rule. */
  zonalEnergyTransfer: number | null;
  keptEnergyFraction: number | null;
  records: number;
  /** Records left out because a field had missing values. */
  refused: number;
}

export class SpectraAccumulator {
  private readonly out;
  private readonly sums: Record<'E' | 'EZonal' | 'EResidual' | 'Z' | 'PiE' | 'PiZ', Float64Array>;
  private readonly ke: Float64Array;
  private readonly keScratch: Float64Array;
  private pvRecords = 0;
  private keRecords = 0;
  private refused = 0;
  private zonal = 0;
  private kept = 0;

  constructor(
    private readonly plan: UserSpectralPlan,
    meter: AllocationMeter,
  ) {
    this.out = plan.spectra.createOutput();
    meter.external(this.out.E2d.byteLength + 6 * this.out.E.byteLength + this.out.k.byteLength, 'spectra');
    const s = () => meter.f64(plan.spectra.nShells, 'spectra');
    this.sums = { E: s(), EZonal: s(), EResidual: s(), Z: s(), PiE: s(), PiZ: s() };
    this.ke = s();
    this.keScratch = s();
  }

  add(q: Float64Array | null, u: Float64Array | null, v: Float64Array | null): void {
    if (q) {
      if (!allFinite(q)) return void this.refused++;
      const sp = this.plan.pvSpectra(q, this.out);
      for (const k of ['E', 'EZonal', 'EResidual', 'Z'] as const)
        for (let s = 0; s < sp.E.length; s++) this.sums[k][s] += sp[k][s];
      const { flux, keptEnergyFraction } = this.plan.pvFlux(q);
      for (let s = 0; s < flux.PiE.length; s++) {
        this.sums.PiE[s] += flux.PiE[s];
        this.sums.PiZ[s] += flux.PiZ[s];
      }
      this.zonal += flux.zonalEnergyTransfer;
      this.kept += keptEnergyFraction;
      this.pvRecords++;
    } else if (u && v) {
      if (!allFinite(u) || !allFinite(v)) return void this.refused++;
      this.plan.kineticSpectrum(u, v, this.keScratch, this.out.E as Float64Array);
      for (let s = 0; s < this.ke.length; s++) this.ke[s] += this.keScratch[s];
      this.keRecords++;
    }
  }

  result(): SpectraMean | null {
    const dk = this.plan.spectra.dk;
    const k = Array.from({ length: this.plan.spectra.nShells }, (_, s) => (s + 1) * dk);
    const kEdge = k.map((x) => x + dk / 2);
    const mean = (a: Float64Array, n: number) => Array.from(a, (x) => x / n);
    if (this.pvRecords) {
      const n = this.pvRecords;
      return {
        kind: 'pv',
        k,
        kEdge,
        E: mean(this.sums.E, n),
        EZonal: mean(this.sums.EZonal, n),
        EResidual: mean(this.sums.EResidual, n),
        Z: mean(this.sums.Z, n),
        PiE: mean(this.sums.PiE, n),
        PiZ: mean(this.sums.PiZ, n),
        zonalEnergyTransfer: this.zonal / n,
        keptEnergyFraction: this.kept / n,
        records: n,
        refused: this.refused,
      };
    }
    if (this.keRecords) {
      return {
        kind: 'kinetic',
        k,
        kEdge,
        E: mean(this.ke, this.keRecords),
        EZonal: null,
        EResidual: null,
        Z: null,
        PiE: null,
        PiZ: null,
        zonalEnergyTransfer: null,
        keptEnergyFraction: null,
        records: this.keRecords,
        refused: this.refused,
      };
    }
    return this.refused
      ? {
          kind: 'pv',
          k,
          kEdge,
          E: [],
          EZonal: null,
          EResidual: null,
          Z: null,
          PiE: null,
          PiZ: null,
          zonalEnergyTransfer: null,
          keptEnergyFraction: null,
          records: 0,
          refused: this.refused,
        }
      : null;
  }
}
