import { NonlinearTerm } from '../model/nonlinearTerm';
import type { SnapshotPlan } from './snapshot';
import { SpectraPlan } from './spectra';

/**
 * Nonlinear transfer spectra and spectral fluxes of a Stria state, from the dealiased advection term
 * N = −Ĵ(ψ, q) of the model itself (`NonlinearTerm`: one inverse and one forward pair transform, so
 * the numbers are those of the truncated model the stepper integrates). Model units; instantaneous
 * (average snapshots for a mean flux).
 *
 * Per full-plane mode, with w the half-plane weight and K² = |k|² + k_d² (docs/spectra.md):
 *   energy transfer     T_E = w Re(q̂* N)/K²  (= −w Re(ψ̂* N)),   enstrophy transfer T_Z = w Re(q̂* N),
 * the rates at which advection changes that mode's ½|q̂|²/K² and ½|q̂|². T(k_s) sums them over the
 * shells of `SpectraPlan` (a sum per shell, not a density). The truncated Jacobian conserves E and Z,
 * so Σ_s T(k_s) = 0 to round-off.
 *
 * Flux through the outer edge of shell s, kEdge_s = (s + 3/2)·dk: Π(kEdge_s) = −Σ_{s' ≤ s} T(k_{s'})
 * = Σ_{s' > s} T(k_{s'}). Positive means toward high k (a forward cascade), negative toward low k.
 * Π vanishes below the first shell and, to round-off, above the last kept one.
 *
 * Eddy-to-mean conversion: the transfer into the kx = 0 modes, C = Σ_{kx=0} T_E. Zonal-zonal
 * interactions vanish (J(ψ̄, q̄) = 0), so all of it comes from eddies; in grid space
 * C = ⟨ū · (−∂y \overline{u′v′})⟩ (docs/spectra.md). Positive C: eddies feed the zonal flow.
 */
export interface SpectralFlux {
  /** Shell centres (as in `Spectra`) and the outer shell edges where Π is given (1/length). */
  readonly k: Float64Array;
  readonly kEdge: Float64Array;
  /** Energy and enstrophy transfer per shell (length²/time³, 1/time³), and their zonal (kx = 0) share. */
  readonly TE: Float64Array;
  readonly TZ: Float64Array;
  readonly TEZonal: Float64Array;
  readonly TZZonal: Float64Array;
  /** Energy and enstrophy flux through kEdge (positive toward high k). */
  readonly PiE: Float64Array;
  readonly PiZ: Float64Array;
  /** Eddy-to-mean conversion of energy and of enstrophy, Σ over kx = 0 modes of T_E and T_Z. */
  zonalEnergyTransfer: number;
  zonalEnstrophyTransfer: number;
  /** Σ T_E, Σ T_Z over every mode (round-off), and Σ |T| per mode, their scale. */
  netEnergyTransfer: number;
  netEnstrophyTransfer: number;
  grossEnergyTransfer: number;
  grossEnstrophyTransfer: number;
}

/** Transfer and flux plan for the snapshots of one SnapshotPlan; `compute` allocates nothing. */
export class SpectralFluxPlan {
  readonly spectra: SpectraPlan;
  private readonly snap: SnapshotPlan;
  private readonly nl: NonlinearTerm;
  private readonly N: Float64Array;

  constructor(snap: SnapshotPlan, spectra: SpectraPlan = SpectraPlan.forSnapshots(snap)) {
    if (spectra.grid.nx !== snap.grid.nx || spectra.grid.ny !== snap.grid.ny || spectra.kd !== snap.params.kd) {
      throw new RangeError('SpectralFluxPlan: the spectra plan is for another grid or k_d');
    }
    this.snap = snap;
    this.spectra = spectra;
    this.nl = new NonlinearTerm(snap.grid, snap.lin, snap.transform);
    this.N = new Float64Array(2 * snap.grid.spectralSize);
  }

  createOutput(): SpectralFlux {
    const n = this.spectra.nShells;
    const f = () => new Float64Array(n);
    const k = f();
    const kEdge = f();
    for (let s = 0; s < n; s++) {
      k[s] = (s + 1) * this.spectra.dk;
      kEdge[s] = (s + 1.5) * this.spectra.dk;
    }
    return {
      k,
      kEdge,
      TE: f(),
      TZ: f(),
      TEZonal: f(),
      TZZonal: f(),
      PiE: f(),
      PiZ: f(),
      zonalEnergyTransfer: 0,
      zonalEnstrophyTransfer: 0,
      netEnergyTransfer: 0,
      netEnstrophyTransfer: 0,
      grossEnergyTransfer: 0,
      grossEnstrophyTransfer: 0,
    };
  }

  /** Transfers and fluxes of the state q̂ (half-plane layout) into out; returns out. */
  compute(qHat: Float64Array, out: SpectralFlux = this.createOutput()): SpectralFlux {
    const N = this.N;
    this.nl.evaluate(qHat, N);
    const { shellOf, weight } = this.spectra;
    const invK2 = this.snap.lin.invK2; // 1/K² on kept modes, 0 elsewhere (where N is 0 too)
    const { nkx, Kx, keptRows } = this.snap.grid;
    const { TE, TZ, TEZonal, TZZonal, PiE, PiZ } = out;
    TE.fill(0);
    TZ.fill(0);
    TEZonal.fill(0);
    TZZonal.fill(0);
    let grossE = 0;
    let grossZ = 0;
    // Stage 1: per-mode transfers on the kept modes, binned into shells.
    for (let r = 0; r < keptRows.length; r++) {
      const row = keptRows[r] * nkx;
      for (let ix = 0; ix <= Kx; ix++) {
        const q = row + ix;
        const s = shellOf[q];
        if (s < 0) continue;
        const tz = weight[q] * (qHat[2 * q] * N[2 * q] + qHat[2 * q + 1] * N[2 * q + 1]);
        const te = tz * invK2[q];
        TE[s] += te;
        TZ[s] += tz;
        if (ix === 0) {
          TEZonal[s] += te;
          TZZonal[s] += tz;
        }
        grossE += Math.abs(te);
        grossZ += Math.abs(tz);
      }
    }
    // Stage 2: fluxes by cumulative sums from low k; zonal totals.
    let cumE = 0;
    let cumZ = 0;
    let zonalE = 0;
    let zonalZ = 0;
    for (let s = 0; s < TE.length; s++) {
      cumE += TE[s];
      cumZ += TZ[s];
      PiE[s] = -cumE;
      PiZ[s] = -cumZ;
      zonalE += TEZonal[s];
      zonalZ += TZZonal[s];
    }
    out.netEnergyTransfer = cumE;
    out.netEnstrophyTransfer = cumZ;
    out.grossEnergyTransfer = grossE;
    out.grossEnstrophyTransfer = grossZ;
    out.zonalEnergyTransfer = zonalE;
    out.zonalEnstrophyTransfer = zonalZ;
    return out;
  }
}
